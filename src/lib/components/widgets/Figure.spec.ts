// Lesson figures show one of our own illustrations with its alt text, a label per panel, and say how it was made.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { illustration } from '$lib/illustrations';
import Figure from './Figure.svelte';

const show = (props: Record<string, string>) => render(Figure, { props }).body;

describe('Figure', () => {
	it('shows a rendered figure at its size, with the author’s alt text, a label per panel and the provenance', () => {
		const entry = illustration('dim-and-relight')!;
		const body = show({ name: 'dim-and-relight', alt: 'An invented runner three times.', caption: 'Going under, then relit.' });
		expect(body).toContain(`src="${entry.file}"`);
		expect(body).toContain(`width="${entry.width}"`);
		expect(body).toContain(`height="${entry.height}"`);
		expect(body).toContain('alt="An invented runner three times."');
		for (const label of entry.labels) expect(body).toContain(`>${label}</li>`);
		expect(body).toMatch(/<figcaption[^>]*>[\s\S]*Going under, then relit\.[\s\S]*not photographed\.[\s\S]*<\/figcaption>/);
		expect(body).not.toContain('widget-notice');
	});

	it('calls a drawn diagram drawn', () => {
		const body = show({ name: 'sync-curtains', alt: 'Shutter curtains against time.', caption: '' });
		expect(body).toContain('Drawn by Stopwise, not photographed.');
		expect(body).not.toContain('scene model');
	});

	it('tells the author about a name that is not ours, and shows no image', () => {
		const body = show({ name: 'https://example.com/photo.jpg', alt: 'x' });
		expect(body).toContain('widget-notice');
		expect(body).toContain('is not one of our illustrations');
		expect(body).not.toContain('<img');
	});

	it('asks for alt text when it is missing, describing the panels meanwhile', () => {
		const entry = illustration('kelvin-rower')!;
		const body = show({ name: 'kelvin-rower' });
		expect(body).toContain('widget-notice');
		expect(body).toContain(`alt="${entry.labels.join('; ')}"`);
	});
});
