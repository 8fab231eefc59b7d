// The words of rubric scores, shared by the review form and the verdict page (the items come with the page data).

export interface RubricItem {
	id: string;
	label: string;
	hint: string;
}

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
