// Inserting a widget or image into the lesson text keeps it on a line of its own, wherever the cursor is.
import { describe, expect, it } from 'vitest';
import { WIDGET_NAMES, WIDGET_ATTRIBUTES } from '$lib/lessons/widgets';
import { WIDGET_SNIPPETS, insertBlock } from './snippets';

describe('insertBlock', () => {
	it('separates the block from text on both sides by a blank line', () => {
		expect(insertBlock('Before.After.', 7, 7, '<SyncGate />')).toEqual({ body: 'Before.\n\n<SyncGate />\n\nAfter.', cursor: 'Before.\n\n<SyncGate />\n\n'.length });
	});

	it('adds no extra blank lines where they already are, and ends an empty text with a newline', () => {
		expect(insertBlock('A\n\nB', 3, 3, 'X').body).toBe('A\n\nX\n\nB');
		expect(insertBlock('', 0, 0, 'X').body).toBe('X\n');
		expect(insertBlock('A\n', 2, 2, 'X').body).toBe('A\n\nX\n');
	});

	it('replaces a selection', () => {
		expect(insertBlock('keep DROP keep', 5, 9, 'X').body).toBe('keep \n\nX\n\n keep');
	});
});

describe('WIDGET_SNIPPETS', () => {
	it('has one example per widget, using only the attributes that widget takes', () => {
		expect(Object.keys(WIDGET_SNIPPETS).sort()).toEqual([...WIDGET_NAMES].sort());
		for (const name of WIDGET_NAMES) {
			const attrs = [...WIDGET_SNIPPETS[name].matchAll(/\s([a-z]+)="/g)].map((m) => m[1]);
			expect(WIDGET_SNIPPETS[name].startsWith(`<${name} `)).toBe(true);
			for (const a of attrs) expect(WIDGET_ATTRIBUTES[name] as readonly string[]).toContain(a);
		}
	});
});
