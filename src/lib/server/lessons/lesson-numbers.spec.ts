// The worked examples and quiz answers of the newer lessons, recomputed with the engine from their stated inputs.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { burstBudget, ev100, hssCost, mix, nearestMarked, recycleTime } from '../../exposure/index';

const LESSONS = 'content/daylight-flash-for-action/lessons';
const source = (file: string) => readFileSync(`${LESSONS}/${file}`, 'utf8');

/** A quiz's answer as the lesson file states it. */
function quizAnswer(text: string, id: string): string {
	const tag = new RegExp(`<Quiz id="${id}"[^>]*?answer="([^"]*)"`).exec(text);
	if (!tag) throw new Error(`no quiz ${id}`);
	return tag[1];
}
const choice = (text: string, id: string) => {
	const tag = new RegExp(`<Quiz id="${id}"[^>]*?choices="([^"]*)"[^>]*?answer="(\\d+)"`).exec(text);
	if (!tag) throw new Error(`no choice quiz ${id}`);
	return tag[1].split('|')[Number(tag[2]) - 1];
};

describe('Keeping up with the action', () => {
	const text = source('18-keeping-up-with-the-action.svx');

	it('recycle and lit frames of the worked example (common practice, no published source: recycle scales with power)', () => {
		expect(recycleTime({ fullPowerRecycle: 2, power: 1 / 8 })).toBe(0.25);
		expect(text).toContain('**0.25 s**');
		const plain = burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(plain.everyNth).toBe(3);
		expect(plain.litFrames).toBe(4);
		expect(text).toContain('**four lit frames**');
		// lesson 11's HSS cost at 1/1000 s against 1/250 s sync (common practice, no published source)
		const cost = hssCost({ shutter: 1 / 1000, syncSpeed: 1 / 250 });
		expect(cost).toBe(3);
		const fast = burstBudget({ power: 1 / 8, hssStops: cost, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(fast.powerPerFrame).toBe(1);
		expect(fast.litFrames).toBe(1);
	});

	it('quiz answers', () => {
		expect(Number(quizAnswer(text, 'burst-1'))).toBe(recycleTime({ fullPowerRecycle: 2, power: 1 / 4 }));
		expect(Number(quizAnswer(text, 'burst-2'))).toBe(burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 10, frames: 10 }).litFrames);
		expect(choice(text, 'burst-3')).toMatch(/^It costs power/);
	});
});

describe('The sun as your second light', () => {
	const text = source('19-the-sun-as-your-second-light.svx');
	// The meter readings of the example are invented: edge EV 15, face in shade EV 12, background EV 14
	const scene = { rim: 15, shade: 12, background: 14 };

	it('settings EV of f/11 and f/8 at 1/250 s (APEX, ASA PH2.5-1960, on the marked ⅓-stop values)', () => {
		const t = nearestMarked(1 / 250, 'shutter').value;
		expect(t).toBe(2 ** -8);
		expect(ev100({ aperture: nearestMarked(11, 'aperture').value, shutter: t, iso: 100 })).toBeCloseTo(15, 10);
		expect(ev100({ aperture: nearestMarked(8, 'aperture').value, shutter: t, iso: 100 })).toBeCloseTo(14, 10);
		expect(text).toContain('log2(128 × 256) = **EV 15**');
	});

	it('each light in stops, and the flash that completes a correct face (light adds linearly: Petschnigg et al., SIGGRAPH 2004)', () => {
		for (const settings of [15, 14]) {
			const shade = scene.shade - settings;
			const flash = Math.log2(1 - 2 ** shade);
			expect(mix({ ambientStops: shade, flashStops: flash })).toBeCloseTo(0, 12);
			const share = 2 ** flash / (2 ** flash + 2 ** shade);
			const ratio = 1 / 2 ** shade;
			if (settings === 15) {
				expect([scene.rim - settings, shade, scene.background - settings]).toEqual([0, -3, -1]);
				expect(flash).toBeCloseTo(-0.19, 2);
				expect(text).toContain('about **−0.2 stop**');
				expect(Math.round(share * 100)).toBe(88);
				expect(text).toContain('about **88 %**');
				expect(ratio).toBe(8);
			} else {
				expect([scene.rim - settings, shade, scene.background - settings]).toEqual([1, -2, 0]);
				expect(flash).toBeCloseTo(-0.415, 3);
				expect(text).toContain('log2(1 − 1/4)');
				expect(text).toMatch(/about\s+−0\.4 stop/);
				expect(share).toBe(0.75);
				expect(ratio).toBe(4);
			}
		}
	});

	it('quiz answers', () => {
		expect(Number(quizAnswer(text, 'sun-1'))).toBeCloseTo(Math.log2(1 - 2 ** -2), 1);
		expect(choice(text, 'sun-2')).toBe(`${2 ** (0 - -2)}:1`);
		expect(choice(text, 'sun-3')).toBe('It gets a stop brighter');
	});
});
