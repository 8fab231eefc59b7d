// The render cost estimate: hostile runs are refused before compiling, every course file is well inside the limit.
import { readFile, readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MAX_RENDER_COST, renderCost, renderCostProblem } from './render-cost';

describe('renderCost', () => {
	it('weighs the characters that open inline markup above plain text', () => {
		expect(renderCost('a'.repeat(1000))).toBe(1000);
		expect(renderCost('['.repeat(1000))).toBeGreaterThan(renderCost('a'.repeat(1000)) * 10);
	});

	it('counts underscores per paragraph, so snake_case spread over paragraphs stays cheap', () => {
		const together = 'a_b '.repeat(1000);
		const apart = Array.from({ length: 100 }, () => 'a_b '.repeat(10)).join('\n\n');
		expect(renderCost(together)).toBeGreaterThan(MAX_RENDER_COST);
		expect(renderCost(apart)).toBeLessThan(MAX_RENDER_COST / 10);
	});

	it('refuses about 100 000 "[" with a sentence saying what to change', () => {
		const problem = renderCostProblem('['.repeat(100_000));
		expect(problem).toMatch(/too heavy to render \(about \d+ times over the limit\)/);
		expect(problem).toMatch(/\[ \* _ or </);
	});

	it('leaves every course file well inside the limit', async () => {
		const dir = join(process.cwd(), 'content', 'daylight-flash-for-action', 'lessons');
		const files = (await readdir(dir)).filter((f) => f.endsWith('.svx'));
		expect(files.length).toBeGreaterThan(0);
		for (const file of files) {
			const text = await readFile(join(dir, file), 'utf8');
			expect(renderCost(text), file).toBeLessThan(MAX_RENDER_COST / 5);
			expect(renderCostProblem(text), file).toBeNull();
		}
	});
});
