// The test helper that reads server-rendered HTML finds the right element even when elements nest.
import { describe, expect, it } from 'vitest';
import { attrOf, elementsByTestId, listItems, plainText, textOf } from './ssr-html';

const html =
	'<div data-testid="outer"><div>a <div>b</div></div> c<!---->&amp; d</div><div data-testid="next">e</div>' +
	'<input data-testid="box" value="1 &lt; 2"/><ul data-testid="list"><li>one</li><li class="x">two <b>2</b></li></ul>';

describe('ssr-html', () => {
	it('takes the whole element, nested same-name elements included', () => {
		expect(textOf(html, 'outer')).toBe('a b c& d');
		expect(textOf(html, 'next')).toBe('e');
	});
	it('reads void elements and decodes attributes', () => {
		expect(attrOf(html, 'box', 'value')).toBe('1 < 2');
		expect(attrOf(html, 'box', 'missing')).toBeNull();
	});
	it('lists items and fails loudly on a missing or repeated test id', () => {
		expect(listItems(html, 'list')).toEqual(['one', 'two 2']);
		expect(() => textOf(html, 'nowhere')).toThrow(/found 0/);
		expect(() => textOf(html + html, 'next')).toThrow(/found 2/);
		expect(elementsByTestId(html + html, 'next')).toHaveLength(2);
		expect(plainText('<p>x</p>\n<p>y</p>')).toBe('x y');
	});
});
