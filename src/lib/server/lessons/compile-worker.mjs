// Compiles stretches of lesson prose with mdsvex, in a worker thread of the compile pool (compile-pool.ts):
// the Markdown reader can be slow on hostile text, and it must never hold up the requests of everyone else.
import { compile } from 'mdsvex';

/** @param {string[]} chunks  @returns {Promise<({ ok: true, code: string, frontmatter: boolean } | { ok: false, message: string })[]>} */
export default async function compileChunks(chunks) {
	const results = [];
	for (const source of chunks) {
		try {
			const out = await compile(source, { smartypants: false, highlight: false });
			const fm = out?.data?.fm;
			results.push({ ok: true, code: out?.code ?? '', frontmatter: Boolean(fm && Object.keys(fm).length > 0) });
		} catch (e) {
			results.push({ ok: false, message: e instanceof Error ? e.message.split('\n')[0] : String(e) });
		}
	}
	return results;
}
