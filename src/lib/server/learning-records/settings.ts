// Where learning records go: the Learning Record Store from STOPWISE_LRS_* and the origin our activity IRIs are built on.
import XAPI from '@xapi/xapi';

export interface LrsSettings {
	/** the LRS's xAPI endpoint, ending in a slash (statements are at `<endpoint>statements`) */
	endpoint: string;
	/** the HTTP Basic Authorization header value */
	auth: string;
	/** the endpoint as admins may see it: no credentials */
	shown: string;
}

/** Why STOPWISE_LRS_ENDPOINT cannot be used (not an http(s) URL), or null when it is unset or fine. */
export function lrsProblem(env: NodeJS.ProcessEnv = process.env): string | null {
	const raw = env.STOPWISE_LRS_ENDPOINT?.trim();
	if (!raw) return null;
	let url: URL;
	try {
		url = new URL(raw);
	} catch {
		return 'STOPWISE_LRS_ENDPOINT is not a URL; statements wait until it is fixed.';
	}
	return url.protocol === 'http:' || url.protocol === 'https:' ? null : 'STOPWISE_LRS_ENDPOINT must start with http:// or https://; statements wait until it is fixed.';
}

/**
 * The LRS, or null when STOPWISE_LRS_ENDPOINT is unset (or unusable: see lrsProblem): statements then wait in the
 * outbox until one is configured. Credentials come from STOPWISE_LRS_USER/_PASSWORD, else from the URL itself.
 */
export function lrsSettings(env: NodeJS.ProcessEnv = process.env): LrsSettings | null {
	const raw = env.STOPWISE_LRS_ENDPOINT?.trim();
	if (!raw || lrsProblem(env)) return null;
	const url = new URL(raw);
	const user = env.STOPWISE_LRS_USER ?? decodeURIComponent(url.username);
	const password = env.STOPWISE_LRS_PASSWORD ?? decodeURIComponent(url.password);
	url.username = '';
	url.password = '';
	url.search = '';
	url.hash = '';
	const endpoint = url.toString().replace(/\/?$/, '/');
	return { endpoint, auth: XAPI.toBasicAuth(user, password), shown: endpoint };
}

/**
 * The origin our IRIs start with (activities, our verbs, extensions): STOPWISE_XAPI_ORIGIN, else the app's ORIGIN.
 * Statements keep the IRIs they were written with, so a school sets it once and keeps it.
 */
export function recordsOrigin(env: NodeJS.ProcessEnv = process.env): string {
	return (env.STOPWISE_XAPI_ORIGIN || env.ORIGIN || 'http://localhost:3000').replace(/\/+$/, '');
}
