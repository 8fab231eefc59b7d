import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import * as engine from './index';

const here = fileURLToPath(new URL('.', import.meta.url));

describe('exposure engine entry point', () => {
	it('exports every function the issue names', () => {
		const functions = [
			'ev100', 'stopsBetween', 'parseShutter', 'formatShutter', 'formatAperture', 'nearestMarked', 'equivalentExposures',
			'daylightEv', 'meteredEv', 'guideNumber', 'flashAperture', 'flashStops', 'hssCost', 'mix', 'mired', 'kelvin',
			'applyGel', 'xyFromCct', 'cctFromXy', 'apparentCct', 'renderedSwatch', 'srgbEncode', 'srgbDecode',
			'relativeLuminance', 'motionBlurPx', 'freezeShutter', 'angleAtSubject', 'distance', 'lightPattern', 'keyFillRatio'
		];
		for (const name of functions) expect(typeof (engine as Record<string, unknown>)[name], name).toBe('function');
		expect(Array.isArray(engine.powerSteps)).toBe(true);
		expect(Array.isArray(engine.daylightConditions)).toBe(true);
		expect(Object.keys(engine.gels)).toContain('full-cto');
		expect(new engine.ExposureInputError('x')).toBeInstanceOf(RangeError);
	});

	it('stays pure and isomorphic: relative imports only, plus culori', () => {
		const sources = readdirSync(here).filter((f) => f.endsWith('.ts') && !f.endsWith('.spec.ts'));
		expect(sources.length).toBeGreaterThan(8);
		for (const file of sources) {
			const text = readFileSync(`${here}/${file}`, 'utf8');
			const specifiers = [...text.matchAll(/from\s+'([^']+)'/g)].map((m) => m[1]);
			for (const s of specifiers) {
				expect(s.startsWith('./') || s === 'culori/fn', `${file} imports ${s}`).toBe(true);
				expect(s.endsWith('.js'), `${file} imports ${s}`).toBe(false);
			}
			expect(text, file).not.toMatch(/\b(document|window|process)\./);
		}
	});
});
