// `npm run grade` reads HEIC and raw (DNG) frames too, and its JSON keeps the shape it has for JPEGs.
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeDng } from '$lib/server/analysis/test-dng';
import { makeHeic } from '$lib/server/analysis/test-heic';
import { makeFrame, REFERENCE_EXIF, type TestFrameSpec } from '$lib/server/analysis/test-frames';

const run = promisify(execFile);
// tsx's CLI run by this Node, as `npm run grade` does, without npx's start-up
const TSX = join(process.cwd(), 'node_modules/tsx/dist/cli.mjs');
let folder: string;

// reference at 1/500 s, lit at 1/2000 s: 2 stops under (APEX, ASA PH2.5-1960), flash holding the subject at mid-grey
const REF: TestFrameSpec = { width: 400, height: 300, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } };
const LIT: TestFrameSpec = { ...REF, background: { stops: -1.5 }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: 0x19 } };
const SPEC = { frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 2, tolerance: 0.34 }, { kind: 'subject-lift', minStops: 1 }] };

async function gradeCli(ext: string): Promise<{ code: number; stdout: string; stderr: string }> {
	const args = [TSX, 'scripts/grade.ts', '--spec', join(folder, 'spec.json'), '--frame', `reference=${join(folder, `ref.${ext}`)}`, '--frame', `lit=${join(folder, `lit.${ext}`)}`, '--json'];
	try {
		const { stdout, stderr } = await run(process.execPath, args, { cwd: process.cwd() });
		return { code: 0, stdout, stderr };
	} catch (error) {
		const e = error as { code: number; stdout: string; stderr: string };
		return { code: e.code, stdout: e.stdout, stderr: e.stderr };
	}
}

/** The keys of an object, nested, with array items read from their first element. */
function shape(value: unknown): unknown {
	if (Array.isArray(value)) return value.length ? [shape(value[0])] : [];
	if (value && typeof value === 'object') return Object.fromEntries(Object.keys(value).sort().map((k) => [k, shape((value as Record<string, unknown>)[k])]));
	return typeof value;
}

beforeAll(async () => {
	folder = await mkdtemp(join(tmpdir(), 'stopwise-grade-cli-'));
	await writeFile(join(folder, 'spec.json'), JSON.stringify(SPEC));
	await writeFile(join(folder, 'ref.jpg'), await makeFrame(REF));
	await writeFile(join(folder, 'lit.jpg'), await makeFrame(LIT));
	await writeFile(join(folder, 'ref.heic'), await makeHeic(REF));
	await writeFile(join(folder, 'lit.heic'), await makeHeic(LIT));
	await writeFile(join(folder, 'ref.dng'), makeDng(REF));
	await writeFile(join(folder, 'lit.dng'), makeDng(LIT));
	await writeFile(join(folder, 'cut.dng'), makeDng({ ...LIT, truncate: true }));
});

afterAll(async () => {
	await rm(folder, { recursive: true, force: true });
});

describe('npm run grade on HEIC and DNG frames', () => {
	it('grades both pairs with the JSON shape of a JPEG pair', { timeout: 60_000 }, async () => {
		const jpeg = await gradeCli('jpg');
		expect(jpeg.code, jpeg.stderr).toBe(0);
		const reference = JSON.parse(jpeg.stdout);
		for (const ext of ['heic', 'dng']) {
			const out = await gradeCli(ext);
			expect(out.code, out.stderr).toBe(0);
			const result = JSON.parse(out.stdout);
			expect(result.verdict, ext).toBe('pass');
			// both criteria measured at the 2 stops the scenes were made with
			for (const c of result.criteria) expect(Math.abs(c.measured - 2), `${ext} ${c.kind}`).toBeLessThan(0.1);
			const { notes: _refNotes, ...refShape } = shape(reference.frames.lit) as Record<string, unknown>;
			const { notes, ...litShape } = shape(result.frames.lit) as Record<string, unknown>;
			expect(litShape, ext).toEqual(refShape);
			expect(Array.isArray(notes)).toBe(true);
			expect(Object.keys(result).sort()).toEqual(Object.keys(reference).sort());
		}
	});

	it('names the format of a damaged raw file and exits 1', { timeout: 30_000 }, async () => {
		const args = [TSX, 'scripts/grade.ts', '--spec', join(folder, 'spec.json'), '--frame', `reference=${join(folder, 'ref.dng')}`, '--frame', `lit=${join(folder, 'cut.dng')}`];
		const error = await run(process.execPath, args).then(() => null, (e: { code: number; stderr: string }) => e);
		expect(error?.code).toBe(1);
		expect(error?.stderr).toMatch(/raw \(DNG\) file looks damaged or incomplete/);
	});
});
