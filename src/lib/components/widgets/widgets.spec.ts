// Every registered lesson widget renders a labelled section with no attributes, and shows a notice (never throws) on nonsense.
import { render } from 'svelte/server';
import type { Component } from 'svelte';
import { describe, expect, it, vi } from 'vitest';
import { attrOf, elementsByTestId } from './parts/ssr-html';

vi.mock('$app/state', () => ({ page: { data: {}, url: new URL('http://localhost/courses/x/y') } }));

// The tag/attribute contract lessons are written against (WIDGETS.md), with each widget's section label.
const CONTRACT: Record<string, { label: string; attributes: string[] }> = {
	StopLadder: { label: 'Stop Ladder', attributes: ['aperture', 'shutter', 'iso'] },
	AmbientDimmer: { label: 'Ambient Dimmer', attributes: ['scene', 'under', 'sync', 'iso'] },
	FalloffRuler: { label: 'Falloff Ruler', attributes: ['gn', 'power', 'distance', 'iso', 'aperture'] },
	SyncGate: { label: 'Sync Gate', attributes: ['shutter', 'sync', 'entry'] },
	ExposureSplit: { label: 'Exposure Split', attributes: ['scene', 'aperture', 'shutter', 'iso', 'gn', 'power', 'distance', 'sync'] },
	DaylightBlend: { label: 'Daylight Blend', attributes: ['rim', 'shade', 'flash', 'background'] },
	BurstBudget: { label: 'Burst Budget', attributes: ['power', 'recycle', 'fps', 'frames', 'hss'] },
	GelMixer: { label: 'Gel Mixer', attributes: ['ambient', 'flash', 'gel', 'wb'] },
	LightPlan: { label: 'Light Plan', attributes: ['preset'] },
	FreezeMeter: { label: 'Freeze Meter', attributes: ['speed', 'distance', 'focal', 'sensor', 'pixels', 'shutter'] },
	SafetyNote: { label: 'Safety note', attributes: ['topics'] },
	Quiz: { label: 'Quiz', attributes: ['id', 'question', 'answer', 'tolerance', 'unit'] },
	AssignmentCard: { label: 'Assignment', attributes: ['slug'] },
	Figure: { label: 'Figure', attributes: ['name', 'alt', 'caption'] },
	Clip: { label: 'Clip', attributes: ['name'] }
};

const modules = import.meta.glob<{ default: Component<Record<string, string>> }>('./*.svelte', { eager: true });
const widgets = Object.fromEntries(Object.entries(modules).map(([path, m]) => [path.slice(2, -'.svelte'.length), m.default]));

describe('lesson widgets', () => {
	it('are exactly the tags of the contract', () => {
		expect(Object.keys(widgets).sort()).toEqual(Object.keys(CONTRACT).sort());
	});

	for (const [name, { label, attributes }] of Object.entries(CONTRACT)) {
		it(`${name} renders a section labelled “${label}” with no attributes`, () => {
			const body = render(widgets[name], { props: {} }).body;
			// Svelte's hydration markers are comments; the first element is the section.
			expect(body.replace(/<!--[\s\S]*?-->/g, '').startsWith('<section')).toBe(true);
			expect(body).toContain(`aria-label="${label}"`);
		});

		it(`${name} shows a notice instead of throwing when every attribute is nonsense`, () => {
			const props = Object.fromEntries(attributes.map((a) => [a, a === 'question' ? 'What?' : '%%']));
			const body = render(widgets[name], { props }).body;
			expect(elementsByTestId(body, 'widget-notice')).toHaveLength(1);
			expect(attrOf(body, 'widget-notice', 'role')).toBe('note');
		});
	}
});
