// The verdict's and the progress page's charts carry their values in words, for whoever cannot see the picture.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { attrOf } from '$lib/components/widgets/parts/ssr-html';
import Histogram from './Histogram.svelte';
import ProgressChart from './ProgressChart.svelte';
import StopsChart from './StopsChart.svelte';

describe('chart text alternatives', () => {
	it('reads each frame’s subject and background levels', () => {
		const { body } = render(StopsChart, {
			props: { frames: [{ name: 'reference', stops: { subject: -0.4, background: 0.5 } }, { name: 'lit', stops: { subject: 0.2, background: -1.1 } }, { name: 'spare', stops: null }] }
		});
		expect(attrOf(body, 'stops-chart', 'aria-label')).toBe(
			'Subject and background brightness of each frame in stops from mid-grey: reference frame, subject \u22120.4 stops, background +0.5 stops; lit frame, subject +0.2 stops, background \u22121.1 stops.'
		);
	});

	it('gives the share of pixels in each quarter of the histogram, and what is clipped', () => {
		// 256 bins: 64 per quarter; one count in each of the first three quarters, none in the last
		const bins = Array.from({ length: 256 }, (_, i) => (i === 10 || i === 100 || i === 150 ? 1 : 0));
		const { body } = render(Histogram, { props: { bins, clipped: { highlights: 0, shadows: 2.5 } } });
		expect(attrOf(body, 'histogram', 'aria-label')).toBe(
			'Histogram of brightness, dark to bright: 33% in the darkest quarter, 33% in the dark middle, 33% in the light middle, 0% in the brightest quarter; 2.5% blocked, 0.0% blown'
		);
	});

	it('lists every attempt’s misses, saying which were not measured', () => {
		const { body } = render(ProgressChart, {
			props: { points: [{ ambientMiss: 0.5, flashMiss: null, assignment: 'Off the axis' }, { ambientMiss: 0, flashMiss: 1.25, assignment: 'Off the axis' }] }
		});
		expect(attrOf(body, 'progress-chart', 'aria-label')).toBe(
			'Stops off target for each attempt, ambient and flash: attempt 1 (Off the axis), ambient 0.5 stops off, flash not measured; attempt 2 (Off the axis), ambient 0 stops off, flash 1.3 stops off.'
		);
	});
});
