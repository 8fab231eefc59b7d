// What rendering a lesson's Markdown will cost, estimated before any of it is compiled: length alone is not enough.
// The Markdown reader's time grows with runs of the characters that may open inline markup, and with underscores far
// faster than linearly, so a short hostile text can cost more than a long lesson. Weights measured with mdsvex 0.12.8
// on the development machine (one unit ≈ the time one plain character takes), not from any published source.

const PLAIN = 1;
// per character that may open a link, image, emphasis or tag: each starts a search along the rest of the paragraph
const OPENERS: Record<string, number> = { '[': 60, '*': 50, '<': 40 };
// underscores within one paragraph: measured 1000 → about 420 000 units, 4000 → about 64× that (cubic)
const UNDERSCORE_UNITS_PER_THOUSAND_CUBED = 420_000;

/** The most a lesson's text may cost to render: about 40× the heaviest course file today, about 2 s of compiling here. */
export const MAX_RENDER_COST = 400_000;

/** The estimated cost of rendering `markdown`, in units of one plain character. */
export function renderCost(markdown: string): number {
	let cost = 0;
	// inline markup never spans a blank line: each paragraph is searched on its own
	for (const paragraph of markdown.split(/\n[ \t]*\n/)) {
		let underscores = 0;
		for (const ch of paragraph) {
			cost += OPENERS[ch] ?? PLAIN;
			if (ch === '_') underscores++;
		}
		cost += UNDERSCORE_UNITS_PER_THOUSAND_CUBED * (underscores / 1000) ** 3;
	}
	return Math.round(cost);
}

/** A clear sentence for the author when the text is over the limit, or null when it may be rendered. */
export function renderCostProblem(markdown: string): string | null {
	const cost = renderCost(markdown);
	if (cost <= MAX_RENDER_COST) return null;
	const times = cost / MAX_RENDER_COST;
	const over = times >= 2 ? `about ${Math.round(times)} times` : `${Math.round((times - 1) * 100)} %`;
	return (
		`This text is too heavy to render (${over} over the limit): long runs of [ * _ or < characters make the ` +
		'Markdown reader slow. Shorten them, or put such text in a code block; until then it is shown as plain text.'
	);
}
