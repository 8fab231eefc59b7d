// The upload page's subject box stays inside the frame and within the reader's limits however it is dragged.
import { describe, expect, it } from 'vitest';
import { checkBox } from '$lib/server/analysis';
import { CENTRED_BOX, formatBox, MIN_SIDE, moveBox, nudgeBox, resizeBox } from './box';

describe('subject box', () => {
	it('moves and stops at the edges', () => {
		expect(moveBox(CENTRED_BOX, 0.1, -0.1)).toEqual({ x: 0.4, y: 0.1, w: 0.4, h: 0.6 });
		expect(moveBox(CENTRED_BOX, 5, 5)).toEqual({ x: 0.6, y: 0.4, w: 0.4, h: 0.6 });
		expect(moveBox(CENTRED_BOX, -5, -5)).toEqual({ x: 0, y: 0, w: 0.4, h: 0.6 });
	});

	it('resizes within the frame, never below the smallest side nor over 90 % of the frame', () => {
		expect(resizeBox(CENTRED_BOX, 0.1, 0.1)).toEqual({ x: 0.3, y: 0.2, w: 0.5, h: 0.7 });
		expect(resizeBox(CENTRED_BOX, -1, -1)).toEqual({ x: 0.3, y: 0.2, w: MIN_SIDE, h: MIN_SIDE });
		const huge = resizeBox({ x: 0, y: 0, w: 0.9, h: 0.9 }, 0.1, 0);
		expect(huge.w * huge.h).toBeLessThanOrEqual(0.9 + 1e-9);
		// every result passes the reader's own check
		for (const box of [huge, resizeBox(CENTRED_BOX, 1, 1), moveBox(resizeBox(CENTRED_BOX, 1, 1), 1, 1)]) expect(checkBox(box)).toBeNull();
	});

	it('answers arrow keys: move by 1 % or 5 %, Alt resizes; other keys are ignored', () => {
		expect(nudgeBox(CENTRED_BOX, 'ArrowRight', false, false)).toEqual({ ...CENTRED_BOX, x: 0.31 });
		expect(nudgeBox(CENTRED_BOX, 'ArrowUp', true, false)).toEqual({ ...CENTRED_BOX, y: 0.15 });
		expect(nudgeBox(CENTRED_BOX, 'ArrowDown', false, true)).toEqual({ ...CENTRED_BOX, h: 0.61 });
		expect(nudgeBox(CENTRED_BOX, 'Enter', false, false)).toBeNull();
	});

	it('writes the form value the server parses', () => {
		expect(formatBox({ x: 0.1, y: 0.2, w: 0.30000000000000004, h: 0.4 })).toBe('0.1,0.2,0.3,0.4');
	});
});
