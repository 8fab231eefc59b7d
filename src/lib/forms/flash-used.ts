// What the learner used, on the upload form (all optional): guide number, power fraction, flash-to-subject distance (zod, both sides).
import { z } from 'zod';

export const FLASH_USED_LIMITS = {
	// ISO 100, metres: from a small speedlight to a large studio head. common practice, no published source
	gn: { min: 5, max: 200 },
	// 1/256 of full power is the lowest step flashes offer
	power: { min: 1 / 256, max: 1 },
	distance: { min: 0.3, max: 100 }
} as const;

/** '' or spaces: not stated. A comma is read as a decimal point, as many keyboards type it. */
const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const decimal = (v: unknown) => (typeof v === 'string' ? Number(v.trim().replace(',', '.')) : v);

/** '1/4', '0.25' or '25 %' → 0.25; anything else is left for the schema to refuse. */
export function readPower(v: unknown): unknown {
	if (typeof v !== 'string') return v;
	const t = v.trim().replace(',', '.');
	const fraction = /^1\s*\/\s*(\d+(?:\.\d+)?)$/.exec(t);
	if (fraction) return 1 / Number(fraction[1]);
	const percent = /^(\d+(?:\.\d+)?)\s*%$/.exec(t);
	if (percent) return Number(percent[1]) / 100;
	return Number(t);
}

const inRange = (what: string, { min, max }: { min: number; max: number }, unit: string, shown = `${min} to ${max}${unit}`) =>
	z.number({ error: `The ${what} must be a number, or left empty.` }).refine(Number.isFinite, `The ${what} must be a number, or left empty.`).min(min, `The ${what} must be ${shown}, or left empty.`).max(max, `The ${what} must be ${shown}, or left empty.`);

export const flashUsedSchema = z.object({
	gn: z.preprocess((v) => decimal(blank(v)), inRange('guide number', FLASH_USED_LIMITS.gn, ' (metres at ISO 100)').optional()),
	power: z.preprocess((v) => readPower(blank(v)), inRange('flash power', FLASH_USED_LIMITS.power, '', 'a fraction of full power from 1/256 to 1 (such as 1/4)').optional()),
	distance: z.preprocess((v) => decimal(blank(v)), inRange('flash-to-subject distance', FLASH_USED_LIMITS.distance, ' m').optional())
});
export type FlashUsedForm = z.infer<typeof flashUsedSchema>;
