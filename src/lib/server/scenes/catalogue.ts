// The catalogue the site reads (src/lib/illustrations/catalogue.json): every illustration's file, size, kind and panel labels.
import type { IllustrationEntry } from '../../illustrations/index';
import { diagrams } from './diagrams/index';
import { renderedFigures } from './figures';
import { figureSize } from './picture';

/** name → entry, rendered figures first, then the drawn diagrams, each in the order they are declared. */
export function buildCatalogue(): Record<string, IllustrationEntry> {
	const out: Record<string, IllustrationEntry> = {};
	for (const f of renderedFigures) {
		out[f.name] = { file: `/illustrations/${f.name}.webp`, ...figureSize(f), kind: 'rendered', labels: f.panels.map((p) => p.label) };
	}
	for (const d of diagrams) {
		out[d.name] = { file: `/illustrations/${d.name}.svg`, width: d.width, height: d.height, kind: 'drawn', labels: [] };
	}
	return out;
}
