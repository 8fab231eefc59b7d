import { describe, expect, test } from 'vitest';
import { readMail, splitLinks } from './mailbox';

describe('mailbox', () => {
	test('splitLinks separates links from text without losing a character', () => {
		const text = 'Open http://localhost:3000/verify?token=a-b_c now.\nOr https://x.example/y';
		const parts = splitLinks(text);
		expect(parts.map((p) => p.text).join('')).toBe(text);
		expect(parts.filter((p) => p.href).map((p) => p.href)).toEqual(['http://localhost:3000/verify?token=a-b_c', 'https://x.example/y']);
	});

	test('a message id that is not the fake\'s own pattern never reaches the file system', async () => {
		expect(await readMail('../../etc/passwd')).toBeNull();
		expect(await readMail('index')).toBeNull();
	});
});
