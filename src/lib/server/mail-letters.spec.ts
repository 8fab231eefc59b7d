import { describe, expect, test } from 'vitest';
import { resetPasswordLetter, verifyEmailLetter } from './mail-letters';

describe('mail letters', () => {
	test('each letter has a text part and an HTML part carrying the same link', () => {
		const href = 'http://localhost:3000/verify?token=abc_DEF-123';
		const letter = verifyEmailLetter('a@test.example', 'Robin', href, 48);
		expect(letter.to).toBe('a@test.example');
		expect(letter.text).toContain(href);
		expect(letter.text).toContain('48 hours');
		expect(letter.html).toContain(`href="${href}"`);
		expect(letter.html).toMatch(/^<!doctype html>/);
	});

	test('names are escaped in the HTML part', () => {
		const letter = resetPasswordLetter('a@test.example', '<script>x</script> & co', 'http://localhost/reset?token=t', 60);
		expect(letter.html).not.toContain('<script>');
		expect(letter.html).toContain('&lt;script&gt;x&lt;/script&gt; &amp; co');
		expect(letter.text).toContain('<script>x</script> & co');
	});
});
