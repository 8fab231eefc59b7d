// Diagram: a guide number is distance times f-number; the f-number for a subject at a distance, and the GN at each power.
import { flashAperture, guideNumber } from '../../../exposure/flash';
import { colours, line, svgDocument, text, type Diagram } from './svg';

const W = 640;
const H = 320;
const GN = 40; // an invented speedlight, metres at ISO 100, full power
const D = 5; // metres to the athlete

export const guideNumberDiagram: Diagram = {
	name: 'guide-number',
	width: W,
	height: H,
	svg() {
		const n = flashAperture(GN, D);
		const x0 = 80;
		const x1 = 420;
		const y = 130;
		const rows = [1, 1 / 2, 1 / 4, 1 / 8].map((p, i) => {
			const gn = guideNumber(GN, { power: p });
			return text(x0 + i * 130, 268, `1/${1 / p}: GN ${gn.toFixed(0)}`, { mono: true, fill: i === 0 ? colours.flashSoft : colours.ink, size: 14 }) +
				text(x0 + i * 130, 290, `f/${flashAperture(gn, D).toFixed(1)} at ${D} m`, { mono: true, fill: colours.muted, size: 13 });
		});
		const body = [
			text(24, 34, 'Guide number = distance × f-number (metres, ISO 100)', { fill: colours.muted, size: 14 }),
			// flash head and its beam
			`<polygon points="${x0 + 18},${y - 10} ${x1 - 40},${y - 60} ${x1 - 40},${y + 60} ${x0 + 18},${y + 10}" fill="${colours.flash}" fill-opacity="0.12"/>`,
			`<rect x="${x0 - 22}" y="${y - 16}" width="40" height="32" rx="4" fill="${colours.flash}"/>`,
			text(x0 - 2, y + 40, 'flash', { anchor: 'middle' }),
			text(x0 - 2, y + 58, `GN ${GN}`, { anchor: 'middle', mono: true, fill: colours.flashSoft }),
			// athlete, a simple standing figure
			`<circle cx="${x1}" cy="${y - 42}" r="12" fill="${colours.ink}"/>`,
			`<rect x="${x1 - 14}" y="${y - 28}" width="28" height="58" rx="12" fill="${colours.midgrey}"/>`,
			text(x1 + 28, y - 30, 'athlete'),
			// the distance
			line(x0 + 20, y + 82, x1, y + 82, colours.ink, 1.5),
			line(x0 + 20, y + 74, x0 + 20, y + 90, colours.ink, 1.5),
			line(x1, y + 74, x1, y + 90, colours.ink, 1.5),
			text((x0 + x1) / 2, y + 76, `${D} m`, { anchor: 'middle', mono: true }),
			text(x1 + 28, y + 4, `${GN} ÷ ${D} m = f/${n.toFixed(0)}`, { mono: true, fill: colours.flashSoft, size: 17, weight: 600 }),
			text(24, 246, 'Each halving of power divides the guide number by √2 (one stop):', { fill: colours.muted, size: 14 }),
			...rows
		].join('');
		return svgDocument(W, H, `A flash of guide number ${GN} lights an athlete ${D} m away correctly at f/${n.toFixed(0)}`, body);
	}
};
