// The frame's light on a coarse grid of cells (linear-light means of usable pixels), stored compactly with the frame.
import type { Box } from './region';

/** Cells along the longer side of the frame; a cell is about 2.5 % of the frame wide. */
export const GRID_CELLS_LONG_SIDE = 40;

/** As stored with a frame (JSON): per-cell values in base64 so a frame stays a few kilobytes. */
export interface LightGrid {
	cols: number;
	rows: number;
	/** Float32 triplets per cell, row by row: mean linear-light R, G, B of the cell's usable pixels (NaN when none). */
	rgb: string;
	/** Uint8 per cell: share of pixels with a channel at the top codes (clipped), 0–255 for 0–1. */
	clipped: string;
	/** Uint8 per cell: share of pixels with every channel at the bottom codes (crushed), 0–255 for 0–1. */
	crushed: string;
}

/** A grid ready for arithmetic. */
export interface Cells {
	cols: number;
	rows: number;
	r: Float32Array;
	g: Float32Array;
	b: Float32Array;
	clipped: Float32Array;
	crushed: Float32Array;
}

const toBase64 = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('base64');

export function encodeGrid(cells: Cells): LightGrid {
	const n = cells.cols * cells.rows;
	const rgb = new Float32Array(n * 3);
	const clipped = new Uint8Array(n);
	const crushed = new Uint8Array(n);
	for (let i = 0; i < n; i++) {
		rgb[3 * i] = cells.r[i];
		rgb[3 * i + 1] = cells.g[i];
		rgb[3 * i + 2] = cells.b[i];
		clipped[i] = Math.round(255 * cells.clipped[i]);
		crushed[i] = Math.round(255 * cells.crushed[i]);
	}
	return { cols: cells.cols, rows: cells.rows, rgb: toBase64(new Uint8Array(rgb.buffer)), clipped: toBase64(clipped), crushed: toBase64(crushed) };
}

/** null when the stored grid is damaged or of another size than it says. */
export function decodeGrid(grid: LightGrid | undefined | null): Cells | null {
	if (!grid || !Number.isInteger(grid.cols) || !Number.isInteger(grid.rows) || grid.cols < 1 || grid.rows < 1) return null;
	const n = grid.cols * grid.rows;
	const rgbBytes = Buffer.from(grid.rgb ?? '', 'base64');
	const clippedBytes = Buffer.from(grid.clipped ?? '', 'base64');
	const crushedBytes = Buffer.from(grid.crushed ?? '', 'base64');
	if (rgbBytes.length !== n * 12 || clippedBytes.length !== n || crushedBytes.length !== n) return null;
	const rgb = new Float32Array(new Uint8Array(rgbBytes).buffer);
	const cells: Cells = {
		cols: grid.cols,
		rows: grid.rows,
		r: new Float32Array(n),
		g: new Float32Array(n),
		b: new Float32Array(n),
		clipped: new Float32Array(n),
		crushed: new Float32Array(n)
	};
	for (let i = 0; i < n; i++) {
		cells.r[i] = rgb[3 * i];
		cells.g[i] = rgb[3 * i + 1];
		cells.b[i] = rgb[3 * i + 2];
		cells.clipped[i] = clippedBytes[i] / 255;
		cells.crushed[i] = crushedBytes[i] / 255;
	}
	return cells;
}

/** Grid size for an image: GRID_CELLS_LONG_SIDE along the longer side, about square cells, never more cells than pixels. */
export function gridSizeFor(width: number, height: number): { cols: number; rows: number } {
	const long = Math.max(width, height);
	const n = Math.min(GRID_CELLS_LONG_SIDE, long);
	const short = Math.max(1, Math.min(Math.min(width, height), Math.round((n * Math.min(width, height)) / long)));
	return width >= height ? { cols: n, rows: short } : { cols: short, rows: n };
}

export type CellPlace = 'subject' | 'background' | 'edge';

/**
 * Where each cell lies against the subject box: 'subject' when its centre is inside, 'background'
 * when no part of it touches the box, 'edge' otherwise (mixed cells are left out of both).
 */
export function cellPlaces(cols: number, rows: number, box: Box): CellPlace[] {
	const places: CellPlace[] = [];
	for (let row = 0; row < rows; row++) {
		for (let col = 0; col < cols; col++) {
			const x0 = col / cols;
			const x1 = (col + 1) / cols;
			const y0 = row / rows;
			const y1 = (row + 1) / rows;
			const cx = (x0 + x1) / 2;
			const cy = (y0 + y1) / 2;
			const centreIn = cx >= box.x && cx < box.x + box.w && cy >= box.y && cy < box.y + box.h;
			const touches = x1 > box.x && x0 < box.x + box.w && y1 > box.y && y0 < box.y + box.h;
			places.push(centreIn ? 'subject' : touches ? 'edge' : 'background');
		}
	}
	return places;
}
