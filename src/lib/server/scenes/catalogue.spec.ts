import { readFile, stat } from 'node:fs/promises';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import catalogue from '../../illustrations/catalogue.json';
import { buildCatalogue } from './catalogue';

const staticFile = (path: string) => new URL(`../../../../static${path}`, import.meta.url);

describe('illustration catalogue', () => {
	it('is what the figures and diagrams declare (run npm run illustrations after changing them)', () => {
		expect(catalogue).toEqual(buildCatalogue());
	});

	it('has every file in static/, at its stated size and small enough for a phone', async () => {
		const entries = Object.entries(buildCatalogue());
		expect(entries.length).toBeGreaterThan(0);
		for (const [name, entry] of entries) {
			const file = staticFile(entry.file);
			expect((await stat(file)).size, name).toBeLessThanOrEqual(60 * 1024);
			const meta = await sharp(await readFile(file)).metadata();
			expect([meta.width, meta.height], name).toEqual([entry.width, entry.height]);
			expect(meta.format, name).toBe(entry.kind === 'rendered' ? 'webp' : 'svg');
		}
	});

	it('says how every picture was made, with a label for every panel', () => {
		for (const [name, entry] of Object.entries(buildCatalogue())) {
			expect(['rendered', 'drawn'], name).toContain(entry.kind);
			if (entry.kind === 'rendered') expect(entry.labels.every((l) => l.trim().length > 0), name).toBe(true);
		}
	});
});
