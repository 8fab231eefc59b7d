// The visitor page cache: whole answers to visitors' GETs of allow-listed public pages (rules.ts), kept in memory
// within a byte bound (lru-cache), each tagged with the content epoch it was made under (epoch.ts). A request reads
// the epoch first; an answer kept under that same epoch is sent as it was, anything else renders as usual.
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { LRUCache } from 'lru-cache';
import { readContentEpoch } from './epoch';
import { isKeepable, isVisitorPageRequest } from './rules';

type KeptPage = { epoch: bigint; status: number; headers: [string, string][]; body: Uint8Array<ArrayBuffer> };

/** A larger answer is sent but not kept: one page never crowds out the rest. */
const MAX_PAGE_BYTES = 1024 * 1024;

export type VisitorPageCache = {
	handle: Handle;
	/** How many answers are kept and their bytes (for the tests and the bench). */
	stats: () => { pages: number; bytes: number };
};

export type VisitorPageCacheOptions = {
	maxBytes: number;
	/** Where the epoch comes from (PostgreSQL unless a test says otherwise). */
	readEpoch?: () => Promise<bigint>;
};

/** A cache bounded at `maxBytes` (0: off, every request renders). */
export function createVisitorPageCache({ maxBytes, readEpoch = readContentEpoch }: VisitorPageCacheOptions): VisitorPageCache {
	if (maxBytes <= 0) return { handle: ({ event, resolve }) => resolve(event), stats: () => ({ pages: 0, bytes: 0 }) };
	const kept = new LRUCache<string, KeptPage>({
		maxSize: maxBytes,
		maxEntrySize: Math.min(MAX_PAGE_BYTES, maxBytes),
		sizeCalculation: sizeOf
	});
	// the newest epoch seen: answers kept under an older one can never be sent again, so they are let go at once
	let newest = -1n;
	let epochUnreadable = false;

	const handle: Handle = async ({ event, resolve }) => {
		if (!isVisitorPageRequest(event)) return resolve(event);
		let epoch: bigint;
		try {
			epoch = await readEpoch();
			epochUnreadable = false;
		} catch (e) {
			// without the epoch nothing kept can be trusted: render as if there were no cache
			if (!epochUnreadable) console.error('[visitor cache] could not read the content epoch', e instanceof Error ? e.message : e);
			epochUnreadable = true;
			return resolve(event);
		}
		if (epoch > newest) {
			newest = epoch;
			kept.clear();
		}
		const key = keyOf(event);
		const hit = kept.get(key);
		if (hit && hit.epoch === epoch) return new Response(hit.body, { status: hit.status, headers: hit.headers });
		const response = await resolve(event);
		if (!isKeepable(response)) return response;
		const body = new Uint8Array(await response.arrayBuffer());
		// an answer made while a newer epoch was seen elsewhere is already out of date for everyone after
		if (epoch === newest) kept.set(key, { epoch, status: response.status, headers: [...response.headers], body });
		return new Response(body, { status: response.status, headers: response.headers });
	};

	return { handle, stats: () => ({ pages: kept.size, bytes: kept.calculatedSize }) };
}

/** The whole address as requested, query included (a page may read it, as the course page reads `?locked=`). */
function keyOf(event: RequestEvent): string {
	return event.request.url;
}

/** Bytes an answer holds: its body, headers and key, plus a little for the record itself. */
function sizeOf(page: KeptPage, key: string): number {
	const headerBytes = page.headers.reduce((sum, [name, value]) => sum + name.length + value.length, 0);
	return page.body.byteLength + headerBytes + key.length + 64;
}
