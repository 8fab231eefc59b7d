// A drawn portrait of the demo course's invented instructor: simple shapes, lit like the course teaches (cool world, warm key, a rim).
import { colours, svgDocument, type Diagram } from './svg';

const S = 360;

export const instructorPortrait: Diagram = {
	name: 'portrait-jun-halvorsen',
	width: S,
	height: S,
	svg() {
		const cx = 180;
		const skin = '#c59a7a';
		const skinShade = '#8a6450';
		const hair = '#3a2c22';
		const body = [
			`<defs><linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#1f3f86"/><stop offset="1" stop-color="#4a6fb8"/></linearGradient>` +
				`<radialGradient id="key" cx="0.3" cy="0.35" r="0.7"><stop offset="0" stop-color="${skin}"/><stop offset="1" stop-color="${skinShade}"/></radialGradient></defs>`,
			// a dimmed daylight sky and a dark hill line behind
			`<rect x="0" y="0" width="${S}" height="${S}" rx="10" fill="url(#sky)"/>`,
			`<path d="M 0 250 Q 90 220 180 238 T ${S} 230 L ${S} ${S} L 0 ${S} Z" fill="#1c2a22"/>`,
			// shoulders in a field jacket, a camera strap across
			`<path d="M 40 ${S} Q 46 270 130 256 L 230 256 Q 314 270 320 ${S} Z" fill="#2c3038"/>`,
			`<path d="M 110 262 L 250 ${S}" stroke="#111" stroke-width="12"/>`,
			`<path d="M 110 262 L 250 ${S}" stroke="${colours.flash}" stroke-width="2" stroke-dasharray="6 8"/>`,
			// neck, head (warm key from the left), ears
			`<rect x="${cx - 24}" y="212" width="48" height="50" rx="12" fill="${skinShade}"/>`,
			`<ellipse cx="${cx - 62}" cy="168" rx="10" ry="16" fill="${skin}"/>`,
			`<ellipse cx="${cx + 62}" cy="168" rx="10" ry="16" fill="${skinShade}"/>`,
			`<ellipse cx="${cx}" cy="160" rx="62" ry="76" fill="url(#key)"/>`,
			// short hair and a close beard
			`<path d="M ${cx - 64} 150 Q ${cx - 66} 76 ${cx} 78 Q ${cx + 66} 78 ${cx + 64} 150 Q ${cx + 50} 104 ${cx} 106 Q ${cx - 48} 106 ${cx - 64} 150 Z" fill="${hair}"/>`,
			`<path d="M ${cx - 58} 178 Q ${cx - 50} 240 ${cx} 238 Q ${cx + 50} 240 ${cx + 58} 178 Q ${cx + 40} 214 ${cx} 212 Q ${cx - 40} 214 ${cx - 58} 178 Z" fill="${hair}" fill-opacity="0.85"/>`,
			// eyes, brows, nose, a small smile
			`<ellipse cx="${cx - 24}" cy="156" rx="7" ry="4.5" fill="#1d1713"/>`,
			`<ellipse cx="${cx + 24}" cy="156" rx="7" ry="4.5" fill="#1d1713"/>`,
			`<path d="M ${cx - 36} 142 q 12 -7 24 0 M ${cx + 12} 142 q 12 -7 24 0" stroke="${hair}" stroke-width="4" fill="none" stroke-linecap="round"/>`,
			`<path d="M ${cx + 2} 158 L ${cx - 6} 186 Q ${cx + 2} 191 ${cx + 10} 187" stroke="${skinShade}" stroke-width="3" fill="none" stroke-linecap="round"/>`,
			`<path d="M ${cx - 16} 204 Q ${cx} 212 ${cx + 16} 204" stroke="#5b2f28" stroke-width="3.5" fill="none" stroke-linecap="round"/>`,
			// an amber rim light along the right edge of the head and shoulder, the course's signature
			`<path d="M ${cx + 40} 98 Q ${cx + 70} 130 ${cx + 60} 200" stroke="${colours.flashSoft}" stroke-width="3" fill="none" stroke-linecap="round" opacity="0.9"/>`,
			`<path d="M 252 262 Q 306 276 316 330" stroke="${colours.flashSoft}" stroke-width="3" fill="none" stroke-linecap="round" opacity="0.8"/>`
		].join('');
		return svgDocument(S, S, 'A drawn portrait of Jun Halvorsen, the invented instructor: short dark hair, a close beard, a field jacket and a camera strap, lit warm against a deep blue sky', body);
	}
};
