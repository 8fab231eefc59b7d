// Diagram: the same light spread over 1, 4 and 9 times the area at 1, 2 and 3 metres (inverse square), in stops from the engine.
import { falloffStops } from '../../../exposure/flash';
import { colours, line, round, svgDocument, text, type Diagram } from './svg';

const W = 640;
const H = 330;

export const inverseSquareDiagram: Diagram = {
	name: 'inverse-square',
	width: W,
	height: H,
	svg() {
		const ox = 60;
		const oy = 170;
		const unit = 150; // pixels per metre along the axis
		const side = 34; // pixels per metre of square side
		const parts: string[] = [text(24, 34, 'The same flash spread over more area as the distance grows', { fill: colours.muted, size: 14 })];
		const far = 3;
		// the cone of light, edges through the corners of each square
		parts.push(`<polygon points="${ox},${oy} ${ox + far * unit},${oy - (far * side) / 2} ${ox + far * unit},${oy + (far * side) / 2}" fill="${colours.flash}" fill-opacity="0.1"/>`);
		parts.push(line(ox, oy, ox + far * unit, oy - (far * side) / 2, colours.flash, 1.2, '4 4'));
		parts.push(line(ox, oy, ox + far * unit, oy + (far * side) / 2, colours.flash, 1.2, '4 4'));
		for (const d of [1, 2, 3]) {
			const x = ox + d * unit;
			const s = d * side;
			// a square seen at an angle: a parallelogram, cut into d × d cells of the size the light covered at 1 m
			const skew = s * 0.35;
			const pts = [[x - skew / 2, oy - s / 2], [x + skew / 2, oy - s / 2 - skew / 3], [x + skew / 2, oy + s / 2 - skew / 3], [x - skew / 2, oy + s / 2]];
			parts.push(`<polygon points="${pts.map(([a, b]) => `${round(a)},${round(b)}`).join(' ')}" fill="${colours.flash}" fill-opacity="${round(0.55 / (d * d) + 0.05)}" stroke="${colours.flashSoft}" stroke-width="1.5"/>`);
			for (let k = 1; k < d; k++) {
				const t = k / d;
				const lerp = (p: number[], q: number[]) => [p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t];
				const [a1, b1] = lerp(pts[0], pts[1]);
				const [a2, b2] = lerp(pts[3], pts[2]);
				parts.push(line(a1, b1, a2, b2, colours.flashSoft, 0.8));
				const [c1, e1] = lerp(pts[0], pts[3]);
				const [c2, e2] = lerp(pts[1], pts[2]);
				parts.push(line(c1, e1, c2, e2, colours.flashSoft, 0.8));
			}
			const stops = falloffStops(1, d);
			const share = d === 1 ? 'all of it' : `1/${d * d} of it`;
			parts.push(text(x, oy + 92, `${d} m`, { anchor: 'middle', mono: true }));
			parts.push(text(x, oy + 114, share, { anchor: 'middle', fill: colours.flashSoft, size: 14 }));
			parts.push(text(x, oy + 134, d === 1 ? '±0 stops' : `−${stops.toFixed(1)} stops`, { anchor: 'middle', mono: true, fill: colours.muted, size: 13 }));
		}
		parts.push(`<circle cx="${ox}" cy="${oy}" r="12" fill="${colours.flash}"/>`);
		parts.push(text(ox, oy + 36, 'flash', { anchor: 'middle' }));
		return svgDocument(W, H, 'Inverse square: at 2 m the light covers 4 times the area (2 stops less), at 3 m 9 times (3.2 stops less)', parts.join(''));
	}
};
