// Upload limits from the environment: the largest frame accepted (STOPWISE_MAX_UPLOAD_MB, default 40 MB).

const MB = 1024 * 1024;
export const DEFAULT_MAX_UPLOAD_MB = 40;

/** Bytes per file; a missing or unusable setting keeps the default. */
export function maxUploadBytes(env: NodeJS.ProcessEnv = process.env): number {
	const mb = Number(env.STOPWISE_MAX_UPLOAD_MB);
	return (Number.isFinite(mb) && mb > 0 ? mb : DEFAULT_MAX_UPLOAD_MB) * MB;
}

/** The most one upload request may carry for `frames` files: each at the limit, plus room for the form fields. */
export function maxRequestBytes(frames: number, env: NodeJS.ProcessEnv = process.env): number {
	return frames * maxUploadBytes(env) + MB;
}
