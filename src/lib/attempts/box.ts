// The subject box on an upload preview: fractions 0–1 of the shown frame; moving and resizing keep it valid.

export interface SubjectBox {
	x: number;
	y: number;
	w: number;
	h: number;
}

/** The default subject box, here and in the frame reader: a centred box where an athlete usually stands. */
export const CENTRED_BOX: Readonly<SubjectBox> = Object.freeze({ x: 0.3, y: 0.2, w: 0.4, h: 0.6 });

/** Smallest side, so the box stays visible and grabbable on a phone. */
export const MIN_SIDE = 0.05;
/** Largest share of the frame a box may cover: the background needs pixels of its own to be measured. */
export const MAX_AREA = 0.9;

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
const tidy = (v: number) => Math.round(v * 10000) / 10000;

function tidyBox(b: SubjectBox): SubjectBox {
	return { x: tidy(b.x), y: tidy(b.y), w: tidy(b.w), h: tidy(b.h) };
}

/** Moves the box by (dx, dy) of the frame, stopping at the edges. */
export function moveBox(box: SubjectBox, dx: number, dy: number): SubjectBox {
	return tidyBox({ ...box, x: clamp(box.x + dx, 0, 1 - box.w), y: clamp(box.y + dy, 0, 1 - box.h) });
}

/** Moves the bottom-right corner by (dw, dh), keeping the box inside the frame, at least MIN_SIDE and under 90 % of it. */
export function resizeBox(box: SubjectBox, dw: number, dh: number): SubjectBox {
	let w = clamp(box.w + dw, MIN_SIDE, 1 - box.x);
	let h = clamp(box.h + dh, MIN_SIDE, 1 - box.y);
	if (w * h > MAX_AREA) {
		// give back whichever side grew
		if (dw > 0) w = Math.max(MIN_SIDE, MAX_AREA / h);
		else h = Math.max(MIN_SIDE, MAX_AREA / w);
	}
	return tidyBox({ ...box, w, h });
}

const ARROWS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

/** Arrow keys move the box by 1 % (5 % with Shift); with Alt they resize it. Null for other keys. */
export function nudgeBox(box: SubjectBox, key: string, big: boolean, resize: boolean): SubjectBox | null {
	const dir = ARROWS[key];
	if (!dir) return null;
	const step = big ? 0.05 : 0.01;
	return resize ? resizeBox(box, dir[0] * step, dir[1] * step) : moveBox(box, dir[0] * step, dir[1] * step);
}

/** "x,y,w,h" for a form field. */
export function formatBox(box: SubjectBox): string {
	return [box.x, box.y, box.w, box.h].map((v) => String(tidy(v))).join(',');
}
