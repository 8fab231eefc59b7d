// Diagram: shutter curtains against time at sync speed, above it with one flash pop, and with high-speed-sync pulses.
import { hssCost } from '../../../exposure/flash';
import { colours, line, svgDocument, text, type Diagram } from './svg';

const W = 640;
const H = 420;
// Common practice, no published source: a focal-plane shutter's curtain crosses the frame in about 3 ms.
const TRAVEL_MS = 3.2;

interface Row {
	title: string;
	subtitle: string;
	shutterMs: number;
	pops: number[];
	note: string;
}

export const syncDiagram: Diagram = {
	name: 'sync-curtains',
	width: W,
	height: H,
	svg() {
		const x0 = 214;
		const msPx = 50; // pixels per millisecond
		const rowH = 84;
		const pulses = Array.from({ length: 15 }, (_, i) => 0.1 + i * 0.28);
		const cost = hssCost({ shutter: 1 / 2000, syncSpeed: 1 / 250 });
		const rows: Row[] = [
			{ title: '1/250 s', subtitle: 'at sync', shutterMs: 4, pops: [3.5], note: 'whole frame open: one pop lights all of it' },
			{ title: '1/2000 s', subtitle: 'one pop', shutterMs: 0.5, pops: [1.8], note: 'only a slit is open: a band of flash, the rest dark' },
			{ title: '1/2000 s', subtitle: 'high-speed sync', shutterMs: 0.5, pops: pulses, note: `pulses all the way across: even, but ${cost} stops weaker` }
		];
		const parts: string[] = [text(24, 34, 'Sensor height against time: what is open when the flash fires', { fill: colours.muted, size: 14 })];
		rows.forEach((row, i) => {
			const top = 62 + i * (rowH + 36);
			const bottom = top + rowH;
			const t = (ms: number) => x0 + ms * msPx;
			// open area: between the first curtain's edge and the second's, each crossing the frame in TRAVEL_MS
			const open = `${t(0)},${bottom} ${t(TRAVEL_MS)},${top} ${t(TRAVEL_MS + row.shutterMs)},${top} ${t(row.shutterMs)},${bottom}`;
			parts.push(`<rect x="${x0}" y="${top}" width="${8 * msPx}" height="${rowH}" fill="#141518"/>`);
			parts.push(`<polygon points="${open}" fill="${colours.ambient}" fill-opacity="0.35"/>`);
			for (const p of row.pops) {
				// the part of the pop's vertical line that falls inside the open area exposes the sensor
				const frac = (ms: number) => Math.min(1, Math.max(0, ms / TRAVEL_MS));
				const hi = frac(p);
				const lo = frac(p - row.shutterMs);
				parts.push(line(t(p), bottom, t(p), top, colours.flash, row.pops.length > 1 ? 1.4 : 2, '2 3'));
				parts.push(line(t(p), bottom - lo * rowH, t(p), bottom - hi * rowH, colours.flash, row.pops.length > 1 ? 2 : 4));
			}
			parts.push(text(24, top + 20, row.title, { size: 14, weight: 600 }));
			parts.push(text(24, top + 40, row.subtitle, { size: 13, fill: colours.muted }));
			parts.push(text(x0, bottom + 20, row.note, { fill: colours.muted, size: 13 }));
		});
		parts.push(text(x0 + 8 * msPx, H - 12, 'time →', { anchor: 'end', fill: colours.muted, size: 13 }));
		return svgDocument(W, H, 'At sync speed the whole frame is open when the flash fires; above it only a slit is, unless the flash pulses (high-speed sync) at a cost', parts.join(''));
	}
};
