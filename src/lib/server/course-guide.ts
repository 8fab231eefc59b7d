// The course's first-visit guide: every Assignment in reading order, the frames it wants and the gear it asks for.
import { gearFor, type GearItem } from './grading/gear';

export interface GuideAssignment {
	slug: string;
	title: string;
	lessonSlug: string;
	lessonTitle: string;
	moduleTitle: string;
	frames: string[];
	gear: GearItem[];
}

/** An Assignment as the course page's query reads it: its spec as the stored JSON text. */
export type GuideRow = Omit<GuideAssignment, 'frames' | 'gear'> & { specText: string };

// Frames and gear depend on the spec's text alone: each distinct text is read once (bounded), not on every visit.
const MAX_KEPT = 256;
const kept = new Map<string, Pick<GuideAssignment, 'frames' | 'gear'>>();

function framesAndGear(specText: string): Pick<GuideAssignment, 'frames' | 'gear'> {
	const hit = kept.get(specText);
	if (hit) return hit;
	const spec: unknown = JSON.parse(specText);
	const frames = (spec as { frames?: unknown } | null)?.frames;
	const read = { frames: Array.isArray(frames) ? frames.map(String) : [], gear: gearFor(spec) };
	kept.set(specText, read);
	if (kept.size > MAX_KEPT) kept.delete(kept.keys().next().value!);
	return read;
}

/** Titles, frame names and gear only: an Assignment's brief stays behind enrolment with its lesson. */
export function courseGuide(rows: readonly GuideRow[]): GuideAssignment[] {
	// copies: the page's data must not share arrays with what is kept
	return rows.map(({ specText, ...r }) => {
		const { frames, gear } = framesAndGear(specText);
		return { ...r, frames: [...frames], gear: gear.map((g) => ({ ...g })) };
	});
}
