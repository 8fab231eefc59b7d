// How much memory the visitor page cache may hold: STOPWISE_VISITOR_CACHE_MB (default 32; 0 turns the cache off).

type Env = Record<string, string | undefined>;

export const DEFAULT_VISITOR_CACHE_MB = 32;

/** The cache's bound in bytes; a wrong value throws an error naming the variable, so a node never starts half-configured. */
export function visitorCacheBytes(env: Env): number {
	const raw = env.STOPWISE_VISITOR_CACHE_MB?.trim() || String(DEFAULT_VISITOR_CACHE_MB);
	const mb = Number(raw);
	if (!/^\d+(\.\d+)?$/.test(raw) || !Number.isFinite(mb)) {
		throw new Error(`STOPWISE_VISITOR_CACHE_MB must be a number of megabytes (0 turns the cache off), not ${JSON.stringify(raw)}`);
	}
	return Math.floor(mb * 1024 * 1024);
}
