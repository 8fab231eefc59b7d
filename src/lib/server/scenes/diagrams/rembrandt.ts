// Diagram: the Rembrandt pattern on a drawn face, key light 45° to the side and 45° above (see the Light Plan for placement).
import { colours, line, svgDocument, text, type Diagram } from './svg';

const W = 640;
const H = 360;

export const rembrandtDiagram: Diagram = {
	name: 'rembrandt-face',
	width: W,
	height: H,
	svg() {
		const cx = 250;
		const cy = 190;
		const skin = '#b98a6c';
		const shade = '#5a4034';
		const body = [
			text(24, 34, 'Key 45° to the side and about 45° above: a triangle of light under the far eye', { fill: colours.muted, size: 14 }),
			// neck and shoulders
			`<path d="M ${cx - 120} ${H} Q ${cx - 110} ${cy + 110} ${cx - 30} ${cy + 100} L ${cx + 30} ${cy + 100} Q ${cx + 110} ${cy + 110} ${cx + 120} ${H} Z" fill="${colours.midgrey}"/>`,
			`<rect x="${cx - 26}" y="${cy + 60}" width="52" height="50" fill="${shade}"/>`,
			// the face, lit on the viewer's left, in shadow on the right
			`<ellipse cx="${cx}" cy="${cy}" rx="78" ry="100" fill="${skin}"/>`,
			`<path d="M ${cx + 6} ${cy - 100} C ${cx + 30} ${cy - 40}, ${cx + 10} ${cy + 40}, ${cx + 14} ${cy + 100} A 78 100 0 0 0 ${cx + 6} ${cy - 100} Z" fill="${shade}"/>`,
			// the lit triangle on the shadow side: bounded by the nose's shadow and the cheekbone
			`<polygon points="${cx + 16},${cy + 4} ${cx + 52},${cy + 2} ${cx + 22},${cy + 44}" fill="${skin}"/>`,
			// eyes, brows, nose, mouth
			`<ellipse cx="${cx - 30}" cy="${cy - 18}" rx="13" ry="6" fill="#2a211c"/>`,
			`<ellipse cx="${cx + 32}" cy="${cy - 18}" rx="13" ry="6" fill="#1a1512"/>`,
			`<path d="M ${cx - 46} ${cy - 36} q 16 -10 32 0 M ${cx + 18} ${cy - 36} q 16 -10 32 0" stroke="#2a211c" stroke-width="4" fill="none"/>`,
			`<path d="M ${cx - 2} ${cy - 14} L ${cx - 10} ${cy + 28} Q ${cx} ${cy + 34} ${cx + 12} ${cy + 28}" stroke="#6d4c3c" stroke-width="3" fill="none"/>`,
			`<path d="M ${cx - 22} ${cy + 58} Q ${cx} ${cy + 68} ${cx + 22} ${cy + 58}" stroke="#6d3a30" stroke-width="4" fill="none"/>`,
			// hair
			`<path d="M ${cx - 80} ${cy - 20} Q ${cx - 80} ${cy - 112} ${cx} ${cy - 108} Q ${cx + 84} ${cy - 106} ${cx + 80} ${cy - 24} Q ${cx + 60} ${cy - 80} ${cx} ${cy - 82} Q ${cx - 60} ${cy - 82} ${cx - 80} ${cy - 20} Z" fill="#2b2119"/>`,
			// the key light, high on the viewer's left, with its direction
			`<circle cx="${cx - 190}" cy="${cy - 80}" r="18" fill="${colours.flash}"/>`,
			line(cx - 170, cy - 68, cx - 76, cy - 20, colours.flash, 2.5, '7 5'),
			text(cx - 190, cy - 108, 'key', { anchor: 'middle', fill: colours.flashSoft }),
			// callout for the triangle
			line(cx + 40, cy + 22, cx + 150, cy + 40, colours.ink, 1.2),
			text(cx + 156, cy + 36, 'the Rembrandt triangle:', { size: 14 }),
			text(cx + 156, cy + 56, 'lit cheek under the far eye,', { size: 14, fill: colours.muted }),
			text(cx + 156, cy + 76, 'closed by the nose’s shadow', { size: 14, fill: colours.muted }),
			line(cx + 48, cy - 20, cx + 150, cy - 40, colours.ink, 1.2),
			text(cx + 156, cy - 40, 'far eye still catches', { size: 14, fill: colours.muted }),
			text(cx + 156, cy - 20, 'a little light', { size: 14, fill: colours.muted })
		].join('');
		return svgDocument(W, H, 'A drawn face lit from high on the left, showing a small triangle of light on the shadowed cheek under the far eye', body);
	}
};
