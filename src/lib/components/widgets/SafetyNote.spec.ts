// Safety note renders the asked-for cautions in order and always ends deferring to venue rules and professionals.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import SafetyNote from './SafetyNote.svelte';
import { SAFETY_CAUTIONS, SAFETY_TOPICS } from './parts/safety';
import { attrOf, elementsByTestId, textOf } from './parts/ssr-html';

const show = (topics?: string) => render(SafetyNote, { props: topics === undefined ? {} : { topics } }).body;
const shownTopics = (body: string) => [...body.matchAll(/data-topic="([^"]+)"/g)].map((m) => m[1]);

describe('Safety note', () => {
	it('shows the named topics in the order the lesson gives them', () => {
		const body = show('stands,wind,batteries,eyes');
		expect(shownTopics(body)).toEqual(['stands', 'wind', 'batteries', 'eyes']);
		expect(textOf(body, 'safety-cautions')).toContain(SAFETY_CAUTIONS.eyes.text);
		expect(attrOf(body, 'safety-note', 'role')).toBe('note');
	});

	it('covers every topic lessons may name, each ending with the same deference', () => {
		for (const topic of SAFETY_TOPICS) {
			const body = show(topic);
			expect(shownTopics(body)).toEqual([topic]);
			const deference = textOf(body, 'safety-deference');
			expect(deference).toMatch(/Venue rules/);
			expect(deference).toMatch(/local codes/);
			expect(deference).toMatch(/licensed professionals/);
		}
	});

	it("warns against flashing into an athlete's eyes mid-move", () => {
		expect(textOf(show('eyes'), 'safety-cautions')).toMatch(/Never fire a flash into a rider's, climber's or runner's eyes/);
	});

	it('cautions about flashing-light sensitivity, heat from bursts, thunder, tall stands and water', () => {
		expect(textOf(show('flashing'), 'safety-cautions')).toMatch(/sensitive to flashing light/);
		expect(textOf(show('flashing'), 'safety-cautions')).toMatch(/seizures/);
		const heat = textOf(show('heat'), 'safety-cautions');
		for (const word of [/cut out/, /burn/, /scorch/, /high-speed sync/]) expect(heat).toMatch(word);
		const thunder = textOf(show('thunder'), 'safety-cautions');
		expect(thunder).toMatch(/tall metal stands/);
		expect(thunder).toMatch(/open fields/);
		const tall = textOf(show('tall-stands'), 'safety-cautions');
		for (const word of [/Sandbag/, /guy/, /crash mats/, /helper/]) expect(tall).toMatch(word);
		// a buoyancy aid always, not only when someone asks
		expect(textOf(show('water'), 'safety-cautions')).toMatch(/buoyancy aid on docks, pontoons and boats at all times/);
	});

	it('defaults to the general caution', () => {
		expect(shownTopics(show())).toEqual(['general']);
		expect(elementsByTestId(show(), 'widget-notice')).toHaveLength(0);
	});

	it('notes unknown topics and still shows the known ones', () => {
		const body = show('stands,lava,heights');
		expect(textOf(body, 'widget-notice')).toContain('unknown lava');
		expect(shownTopics(body)).toEqual(['stands', 'heights']);
		expect(shownTopics(show('lava'))).toEqual(['general']);
	});
});
