// The segment renderer mounts exactly the allow-listed widgets, in order, between the sanitised HTML.
import { render } from 'svelte/server';
import { describe, expect, it, vi } from 'vitest';
import { WIDGET_NAMES } from '$lib/lessons/widgets';
import LessonSegments from './LessonSegments.svelte';

vi.mock('$app/state', () => ({ page: { data: {}, url: new URL('http://localhost/courses/x/y') } }));

const widgetFiles = Object.keys(import.meta.glob('./widgets/*.svelte')).map((p) => p.slice('./widgets/'.length, -'.svelte'.length));

describe('LessonSegments', () => {
	it('knows every widget file as an allowed tag, and no other', () => {
		expect([...WIDGET_NAMES].sort()).toEqual(widgetFiles.sort());
	});

	it('renders HTML and widgets in order, with the widget reading its string props', () => {
		const body = render(LessonSegments, {
			props: {
				segments: [
					{ kind: 'html', html: '<p>Before the ruler.</p>' },
					{ kind: 'widget', name: 'FalloffRuler', props: { gn: '60', power: '1/4', distance: '3', iso: '100', aperture: '8' } },
					{ kind: 'html', html: '<p>After the ruler.</p>' }
				]
			}
		}).body;
		const before = body.indexOf('Before the ruler.');
		const ruler = body.indexOf('aria-label="Falloff Ruler"');
		const after = body.indexOf('After the ruler.');
		expect(before).toBeGreaterThanOrEqual(0);
		expect(ruler).toBeGreaterThan(before);
		expect(after).toBeGreaterThan(ruler);
		// GN = distance × f-number, so GN scales with √(light): 1/4 power gives 60 × √(1/4) = 30 (ISO 1230:1992 definition, from memory)
		expect(body).toMatch(/data-testid="falloff-gn-now"[^>]*>30(\.0)? m</);
	});

	it('renders nothing for an empty lesson', () => {
		expect(render(LessonSegments, { props: { segments: [] } }).body.replace(/<!--[\s\S]*?-->/g, '').trim()).toBe('');
	});
});
