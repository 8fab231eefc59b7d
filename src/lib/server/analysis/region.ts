// The subject box (fractions 0–1 of the oriented frame), its default, checks and pixel bounds.

import { CENTRED_BOX, MAX_AREA, type SubjectBox } from '../../attempts/box';

/** The one subject-box shape, shared with the upload form's editor. */
export type Box = SubjectBox;

/** A centred box covering the middle of the frame, where an athlete usually stands. */
export const DEFAULT_SUBJECT_BOX: Readonly<Box> = CENTRED_BOX;

const MAX_SUBJECT_AREA = MAX_AREA;
const EDGE_SLACK = 1e-9;

/** A reason the box is unusable, in words for a person, or null when it is fine. */
export function checkBox(box: Box): string | null {
	const values = [box.x, box.y, box.w, box.h];
	if (!values.every((v) => typeof v === 'number' && Number.isFinite(v))) return 'The subject box needs four numbers: x, y, width, height.';
	if (box.x < 0 || box.y < 0) return 'The subject box must start inside the frame (x and y from 0 to 1).';
	if (box.w <= 0 || box.h <= 0) return 'The subject box needs a width and a height above 0.';
	if (box.x + box.w > 1 + EDGE_SLACK || box.y + box.h > 1 + EDGE_SLACK) return 'The subject box must end inside the frame (x + width and y + height at most 1).';
	if (box.w * box.h > MAX_SUBJECT_AREA) return 'The subject box covers almost the whole frame, leaving no background to measure.';
	return null;
}

/** Reads "x,y,w,h" as typed on a command line or in a form. */
export function parseBox(text: string): Box | null {
	const parts = text.split(',').map((p) => p.trim());
	if (parts.length !== 4 || parts.some((p) => p === '')) return null;
	const [x, y, w, h] = parts.map(Number);
	return [x, y, w, h].every(Number.isFinite) ? { x, y, w, h } : null;
}

export interface PixelBounds {
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}

/** Box to whole-pixel bounds in an image of the given size, at least one pixel wide and high. */
export function toPixelBounds(box: Box, width: number, height: number): PixelBounds {
	const x0 = Math.min(width - 1, Math.max(0, Math.round(box.x * width)));
	const y0 = Math.min(height - 1, Math.max(0, Math.round(box.y * height)));
	const x1 = Math.max(x0 + 1, Math.min(width, Math.round((box.x + box.w) * width)));
	const y1 = Math.max(y0 + 1, Math.min(height, Math.round((box.y + box.h) * height)));
	return { x0, y0, x1, y1 };
}
