// The spec form's working copy: what authors type becomes spec values; JSON round-trips; frame renames follow through.
import { describe, expect, it } from 'vitest';
import { parseField, parseSeconds, readDraft, removeFrame, renameFrame, showField, showSeconds, writeDraft } from './spec-draft';

describe('seconds as typed on a camera', () => {
	it('reads 1/1000, decimals and whole seconds, and shows short times as fractions', () => {
		expect(parseSeconds('1/1000')).toBe(0.001);
		expect(parseSeconds(' 1 / 250 ')).toBe(0.004);
		expect(parseSeconds('0.5')).toBe(0.5);
		expect(parseSeconds('2')).toBe(2);
		expect(parseSeconds('')).toBeUndefined();
		expect(showSeconds(0.001)).toBe('1/1000');
		expect(showSeconds(1 / 60)).toBe('1/60');
		expect(showSeconds(2)).toBe('2');
	});
	it('keeps what it cannot read, for the checker to name', () => {
		expect(parseSeconds('fast')).toBe('fast');
		expect(parseField('number', '1.5x')).toBe('1.5x');
	});
});

describe('fields', () => {
	it('reads lists of numbers and frames, and leaves empty optional fields out', () => {
		expect(parseField('numbers', '0, -1, +1')).toEqual([0, -1, 1]);
		expect(parseField('numbers', '0, −1')).toEqual([0, -1]);
		expect(parseField('frames', 'a, b ,, c')).toEqual(['a', 'b', 'c']);
		expect(parseField('frame', '  ')).toBeUndefined();
		expect(parseField('number', '')).toBeUndefined();
		expect(showField('numbers', [0, -1, 1])).toBe('0, -1, 1');
		expect(showField('seconds', 0.004)).toBe('1/250');
		expect(showField('number', undefined)).toBe('');
	});
});

describe('draft', () => {
	const text = JSON.stringify({ frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 1.5, reference: 'reference' }, { kind: 'bracket', offsets: [0, 1], frames: ['reference', 'lit'] }] });

	it('reads spec text and writes it back unchanged in meaning', () => {
		const draft = readDraft(text)!;
		expect(JSON.parse(writeDraft(draft))).toEqual(JSON.parse(text));
		expect(readDraft('{ not json')).toBeNull();
		expect(readDraft('[1, 2]')).toBeNull();
	});

	it('renames a frame in every criterion that names it, and removing one drops the references', () => {
		const draft = readDraft(text)!;
		renameFrame(draft, 'reference', 'ambient only');
		expect(draft.frames).toEqual(['ambient only', 'lit']);
		expect(draft.criteria[0].reference).toBe('ambient only');
		expect(draft.criteria[1].frames).toEqual(['ambient only', 'lit']);
		removeFrame(draft, 'ambient only');
		expect(draft.frames).toEqual(['lit']);
		expect(draft.criteria[0].reference).toBeUndefined();
		expect(draft.criteria[1].frames).toEqual(['lit']);
	});

	it('leaves an empty rubric list out of the JSON (the defaults apply)', () => {
		const draft = readDraft(text)!;
		draft.rubric = [];
		expect(JSON.parse(writeDraft(draft))).not.toHaveProperty('rubric');
	});
});
