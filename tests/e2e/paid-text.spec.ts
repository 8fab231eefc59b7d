import { expect, test } from '@playwright/test';
import { readFile, readdir } from 'node:fs/promises';
import { join } from 'node:path';

const lessonsDir = join(process.cwd(), 'content', 'daylight-flash-for-action', 'lessons');

async function clientFiles(dir: string): Promise<string[]> {
	const entries = await readdir(dir, { withFileTypes: true });
	const nested = await Promise.all(
		entries.map((e) => (e.isDirectory() ? clientFiles(join(dir, e.name)) : Promise.resolve([join(dir, e.name)])))
	);
	return nested.flat();
}

test('no members-only lesson text is shipped in the public client bundle', async () => {
	const bundle = (await Promise.all((await clientFiles(join(process.cwd(), 'build', 'client'))).filter((f) => /\.(js|css|html|json)$/.test(f)).map((f) => readFile(f, 'utf8')))).join('\n');
	let checked = 0;
	for (const file of await readdir(lessonsDir)) {
		const text = await readFile(join(lessonsDir, file), 'utf8');
		if (/^preview:\s*true/m.test(text)) continue;
		// a plain prose line of the lesson, long enough to be unique to it
		const line = text.split('\n').find((l) => /^[A-Z][^<>{}*_`|]{60,}$/.test(l));
		if (!line) continue;
		expect(bundle.includes(line.slice(0, 60)), `${file}: "${line.slice(0, 60)}"`).toBe(false);
		checked++;
	}
	expect(checked).toBeGreaterThanOrEqual(5);
});
