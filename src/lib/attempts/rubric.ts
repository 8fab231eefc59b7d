// The mentor's rubric: what a critique scores, in our own words, shared by the review form and the verdict page.

export interface RubricItem {
	id: string;
	label: string;
	hint: string;
}

export const RUBRIC: readonly RubricItem[] = [
	{ id: 'ambient', label: 'Ambient dimmed as planned', hint: 'The background sits where the assignment asked, sky still holding colour.' },
	{ id: 'light', label: 'Shape and direction of the flash', hint: 'The light comes from off the camera axis and shows form and texture.' },
	{ id: 'balance', label: 'Subject against background', hint: 'The athlete stands out of the darker world without looking pasted on.' },
	{ id: 'colour', label: 'Colour of the light', hint: 'White balance and gel agree: warm-neutral skin, a cooler background.' },
	{ id: 'moment', label: 'Moment and sharpness', hint: 'Peak action, frozen where it matters.' }
];

/** Scores run 1–4; the words say what each means. */
export const RUBRIC_SCORES: readonly { value: number; label: string }[] = [
	{ value: 1, label: 'Not yet' },
	{ value: 2, label: 'Getting there' },
	{ value: 3, label: 'Solid' },
	{ value: 4, label: 'Strong' }
];

export function scoreLabel(value: number): string {
	return RUBRIC_SCORES.find((s) => s.value === value)?.label ?? String(value);
}

/** Keeps only known items with whole scores 1–4 (unscored items are left out). */
export function cleanRubric(input: Record<string, unknown>): Record<string, number> {
	const out: Record<string, number> = {};
	for (const item of RUBRIC) {
		const raw = input[item.id];
		const value = typeof raw === 'number' ? raw : typeof raw === 'string' && raw.trim() !== '' ? Number(raw) : NaN;
		if (Number.isInteger(value) && value >= 1 && value <= 4) out[item.id] = value;
	}
	return out;
}
