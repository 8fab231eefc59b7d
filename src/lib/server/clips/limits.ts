// The limits on an uploaded clip: bytes (checked when the upload starts), then duration and picture size (ffprobe).

export interface ClipLimits {
	bytes: number;
	seconds: number;
	/** the longer side of the picture, in pixels */
	longSide: number;
}

const positive = (value: string | undefined, fallback: number) => {
	const n = Number(value);
	return Number.isFinite(n) && n > 0 ? n : fallback;
};

/** STOPWISE_CLIP_MAX_MB (default 500), STOPWISE_CLIP_MAX_SECONDS (600), STOPWISE_CLIP_MAX_PIXELS (3840: a 4K UHD picture's long side). */
export function clipLimits(env: NodeJS.ProcessEnv = process.env): ClipLimits {
	return {
		bytes: Math.round(positive(env.STOPWISE_CLIP_MAX_MB, 500) * 2 ** 20),
		seconds: positive(env.STOPWISE_CLIP_MAX_SECONDS, 600),
		longSide: positive(env.STOPWISE_CLIP_MAX_PIXELS, 3840)
	};
}
