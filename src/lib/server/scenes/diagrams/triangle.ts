// Top-down diagram of the wide camera–subject–light triangle, with the angle at the subject from the engine's geometry.
import { angleAtSubject, distance } from '../../../exposure/geometry';
import { colours, line, round, svgDocument, text, type Diagram } from './svg';

// positions in metres, top-down: the camera at the bottom, the athlete ahead, the flash well off to the left
const camera = { x: 0, y: 0 };
const subject = { x: 0, y: 3.6 };
const light = { x: -2.6, y: 2.3 };

const W = 640;
const H = 400;
const S = 70; // pixels per metre
const px = (p: { x: number; y: number }) => ({ x: W / 2 + 40 + p.x * S, y: H - 50 - p.y * S });

export const lightTriangle: Diagram = {
	name: 'light-triangle',
	width: W,
	height: H,
	svg() {
		const c = px(camera);
		const s = px(subject);
		const l = px(light);
		const angle = angleAtSubject(camera, subject, light);
		const toLight = distance(subject, light);
		const toCamera = distance(subject, camera);
		// the arc marking the angle at the subject, between the camera and the light directions
		const r = 46;
		const a1 = Math.atan2(c.y - s.y, c.x - s.x);
		const a2 = Math.atan2(l.y - s.y, l.x - s.x);
		const arc = `<path d="M ${round(s.x + r * Math.cos(a1))} ${round(s.y + r * Math.sin(a1))} A ${r} ${r} 0 0 1 ${round(s.x + r * Math.cos(a2))} ${round(s.y + r * Math.sin(a2))}" fill="none" stroke="${colours.flashSoft}" stroke-width="2"/>`;
		const body = [
			`<polygon points="${round(c.x)},${round(c.y)} ${round(s.x)},${round(s.y)} ${round(l.x)},${round(l.y)}" fill="${colours.flash}" fill-opacity="0.08"/>`,
			line(c.x, c.y, s.x, s.y, colours.ambientSoft, 2, '6 5'),
			line(l.x, l.y, s.x, s.y, colours.flash, 3),
			line(c.x, c.y, l.x, l.y, colours.line, 1.5, '3 5'),
			arc,
			// camera: a body and a lens pointing at the athlete
			`<rect x="${c.x - 22}" y="${c.y - 8}" width="44" height="26" rx="4" fill="${colours.ambient}"/>`,
			`<rect x="${c.x - 9}" y="${c.y - 20}" width="18" height="14" rx="2" fill="${colours.ambient}"/>`,
			text(c.x + 34, c.y + 12, 'camera'),
			// athlete seen from above: shoulders and head
			`<ellipse cx="${s.x}" cy="${s.y}" rx="26" ry="12" fill="${colours.midgrey}"/>`,
			`<circle cx="${s.x}" cy="${s.y}" r="10" fill="${colours.ink}"/>`,
			text(s.x + 36, s.y - 6, 'athlete'),
			// flash head on a stand, aimed at the athlete
			`<circle cx="${l.x}" cy="${l.y}" r="16" fill="${colours.flash}"/>`,
			text(l.x, l.y - 26, 'flash on a stand', { anchor: 'middle' }),
			// the angle inside its arc, on the bisector; the distance above the middle of the light's line
			text(s.x + (r + 26) * Math.cos((a1 + a2) / 2), s.y + (r + 26) * Math.sin((a1 + a2) / 2) + 6, `${Math.round(angle)}°`, { anchor: 'middle', mono: true, fill: colours.flashSoft, size: 17 }),
			text((l.x + s.x) / 2 - 8, (l.y + s.y) / 2 - 12, `${toLight.toFixed(1)} m`, { anchor: 'end', mono: true, fill: colours.flashSoft }),
			text(c.x + 10, (c.y + s.y) / 2, `${toCamera.toFixed(1)} m`, { mono: true, fill: colours.ambientSoft }),
			text(24, 34, 'Seen from above: light, athlete and camera make a wide triangle', { fill: colours.muted, size: 14 })
		].join('');
		return svgDocument(W, H, `Top-down plan: the flash stands ${Math.round(angle)}° off the camera's line to the athlete`, body);
	}
};
