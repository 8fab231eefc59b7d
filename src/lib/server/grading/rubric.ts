// The mentor's rubric: the items a critique can score, in our own words, and which of them an Assignment asks for.
// Pure data and functions: the spec schema validates item ids with it; pages receive the resolved items.

export const RUBRIC_ITEMS = [
	{ id: 'ambient', label: 'Ambient dimmed as planned', hint: 'The background sits where the assignment asked, sky still holding colour.' },
	{ id: 'light', label: 'Shape and direction of the flash', hint: 'The light comes from off the camera axis and shows form and texture.' },
	{ id: 'balance', label: 'Subject against background', hint: 'The athlete stands out of the darker world without looking pasted on.' },
	{ id: 'colour', label: 'Colour of the light', hint: 'White balance and gel agree: warm-neutral skin, a cooler background.' },
	{ id: 'moment', label: 'Moment and sharpness', hint: 'Peak action, frozen where it matters.' },
	{ id: 'settings', label: 'Camera settings', hint: 'Shutter, aperture and ISO chosen for the job and kept within what was asked.' },
	{ id: 'framing', label: 'Lens and framing', hint: 'The focal length and the camera position make the athlete the story.' },
	{ id: 'bracket', label: 'Even bracket steps', hint: 'Each frame moves by the step asked, one setting at a time.' }
] as const;

export type RubricId = (typeof RUBRIC_ITEMS)[number]['id'];
export type RubricItem = { id: string; label: string; hint: string };
export const RUBRIC_IDS = RUBRIC_ITEMS.map((i) => i.id) as [RubricId, ...RubricId[]];

/**
 * What a mentor scores when the Assignment names no rubric: the items each kind of criterion speaks to.
 * A kind missing here adds nothing; the tests require an entry for every kind the spec knows.
 */
export const DEFAULT_RUBRIC_BY_KIND: Record<string, readonly RubricId[]> = {
	'ambient-under': ['ambient'],
	'background-drop': ['ambient'],
	'subject-lift': ['light', 'balance'],
	'flash-evidence': ['light'],
	'background-cooler': ['colour'],
	'shutter-min': ['moment', 'settings'],
	'shutter-max': ['settings'],
	'aperture-range': ['settings'],
	'iso-max': ['settings'],
	'focal-max': ['framing'],
	'focal-min': ['framing'],
	bracket: ['bracket', 'settings'],
	sync: ['settings', 'moment'],
	'flash-share': ['light', 'balance'],
	'subject-clipping': ['light'],
	'motion-blur': ['moment'],
	// a pattern of light on a face: its shape and direction, and how the athlete stands out
	'mentor-judged': ['light', 'balance']
};

/** Every Assignment is also judged as a photograph: the moment is always scored. */
const ALWAYS: readonly RubricId[] = ['moment'];

const byId = new Map<string, RubricItem>(RUBRIC_ITEMS.map((i) => [i.id, i]));

/** The rubric of an Assignment: the author's list when given, else the defaults of its criteria, in catalogue order. */
export function rubricFor(spec: { criteria?: readonly { kind: string }[]; rubric?: readonly string[] } | null | undefined): RubricItem[] {
	if (spec?.rubric && spec.rubric.length > 0) return spec.rubric.map((id) => byId.get(id)).filter((i): i is RubricItem => Boolean(i));
	const wanted = new Set<string>(ALWAYS);
	for (const c of spec?.criteria ?? []) for (const id of DEFAULT_RUBRIC_BY_KIND[c.kind] ?? []) wanted.add(id);
	return RUBRIC_ITEMS.filter((i) => wanted.has(i.id));
}

/** The item for an id (labels for scores given under an earlier rubric), or null. */
export function rubricItem(id: string): RubricItem | null {
	return byId.get(id) ?? null;
}

/** Keeps only the given items with whole scores 1–4 (unscored items are left out). */
export function cleanRubric(input: Record<string, unknown>, items: readonly RubricItem[]): Record<string, number> {
	const out: Record<string, number> = {};
	for (const item of items) {
		const raw = input[item.id];
		const value = typeof raw === 'number' ? raw : typeof raw === 'string' && raw.trim() !== '' ? Number(raw) : NaN;
		if (Number.isInteger(value) && value >= 1 && value <= 4) out[item.id] = value;
	}
	return out;
}
