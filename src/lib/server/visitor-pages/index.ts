// The app's one visitor page cache, bounded by STOPWISE_VISITOR_CACHE_MB; hooks.server.ts runs its handle.
import { createVisitorPageCache } from './cache';
import { visitorCacheBytes } from './settings';

export const visitorPageCache = createVisitorPageCache({ maxBytes: visitorCacheBytes(process.env) });
