// Reading one widget tag: string attributes in, everything else refused with a line-numbered reason.
import { describe, expect, it } from 'vitest';
import { decodeEntities, readWidgetTag } from './widget-tag';

describe('readWidgetTag', () => {
	it('reads double-quoted, single-quoted and bare values, and how much text the tag took', () => {
		const text = `<FalloffRuler gn="60" power='1/4' distance=3 iso=100/>\nnext line`;
		expect(readWidgetTag(text, 7)).toEqual({
			kind: 'widget',
			name: 'FalloffRuler',
			props: { gn: '60', power: '1/4', distance: '3', iso: '100' },
			problems: [],
			length: text.indexOf('next')
		});
	});

	it('accepts an empty element with its closing tag on the same line', () => {
		expect(readWidgetTag('<LightPlan preset="cross"></LightPlan>', 1)).toMatchObject({ kind: 'widget', props: { preset: 'cross' } });
	});

	it('decodes entities in values, so a question can quote', () => {
		expect(readWidgetTag('<Quiz id="q" question="Is &quot;f/8&quot; &lt; f/11?" answer="1" />', 1)).toMatchObject({
			props: { question: 'Is "f/8" < f/11?' }
		});
	});

	it('refuses text after the tag on its line, naming the line', () => {
		expect(readWidgetTag('<SyncGate shutter="1/1000" /> and more', 12)).toEqual({
			kind: 'refused',
			name: 'SyncGate',
			problems: ['Line 12: <SyncGate> must stand on a line of its own; it was left out.'],
			length: '<SyncGate shutter="1/1000" /> and more'.length
		});
	});

	it('refuses an unclosed tag or quote, taking only its first line', () => {
		const unclosed = readWidgetTag('<Quiz id="q" question="no end\n\nMore prose.', 3);
		expect(unclosed).toMatchObject({ kind: 'refused', problems: [expect.stringMatching(/^Line 3: <Quiz> has an unclosed quote/)] });
		expect(unclosed.length).toBe('<Quiz id="q" question="no end\n'.length);
		expect(readWidgetTag('<StopLadder aperture="8"', 1)).toMatchObject({ kind: 'refused', problems: [expect.stringMatching(/is not closed/)] });
	});

	it('warns when an attribute is given twice and keeps the last', () => {
		expect(readWidgetTag('<SyncGate shutter="1/500" shutter="1/1000" />', 1)).toMatchObject({
			props: { shutter: '1/1000' },
			problems: [expect.stringMatching(/gives shutter twice/)]
		});
	});
});

describe('decodeEntities', () => {
	it('decodes named and numeric references and leaves unknown ones alone', () => {
		expect(decodeEntities('&amp;&lt;&gt;&quot;&#39;&apos;&#x2019;&#8211;&bogus;')).toBe('&<>"\'\'’–&bogus;');
	});

	it('turns a lone surrogate or an out-of-range code point into the replacement character, as HTML does', () => {
		expect(decodeEntities('&#xD800;&#1114112;')).toBe('\ufffd\ufffd');
	});
});
