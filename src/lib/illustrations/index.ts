// Our own pictures (rendered by the scene model or drawn), by name: what lesson figures and pages may show.
import catalogue from './catalogue.json';

/** One illustration: its public path, size in pixels, how it was made, and a label per panel (left to right). */
export interface IllustrationEntry {
	file: string;
	width: number;
	height: number;
	kind: 'rendered' | 'drawn';
	labels: string[];
}

const entries: Readonly<Record<string, IllustrationEntry>> = catalogue as Record<string, IllustrationEntry>;

/** The illustration called `name`, or null when there is none (a typo in a lesson). */
export function illustration(name: string): IllustrationEntry | null {
	return Object.hasOwn(entries, name) ? entries[name] : null;
}

/** Every illustration's name, in catalogue order. */
export const ILLUSTRATION_NAMES: readonly string[] = Object.keys(entries);

/** The sentence every caption ends with, so no reader takes a picture for a photograph. */
export function provenance(kind: IllustrationEntry['kind']): string {
	return kind === 'rendered'
		? 'Rendered by Stopwise’s scene model from the exposure maths, not photographed.'
		: 'Drawn by Stopwise, not photographed.';
}
