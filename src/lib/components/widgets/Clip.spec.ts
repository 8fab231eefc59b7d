// The Clip widget: a ready clip is a native player with captions and no autoplay; others show their state or a notice.
import { render } from 'svelte/server';
import { describe, expect, it, vi } from 'vitest';
import type { ClipCard } from '$lib/lessons/page-data';
import Clip from './Clip.svelte';
import { elementsByTestId } from './parts/ssr-html';

const state = vi.hoisted(() => ({ data: {} as Record<string, unknown> }));
vi.mock('$app/state', () => ({
	page: {
		get data() {
			return state.data;
		}
	}
}));

const ready: ClipCard = {
	id: '00000000-0000-4000-8000-000000000001',
	name: 'dim-then-light',
	title: 'Dimming the daylight',
	status: 'ready',
	progress: 1,
	error: null,
	durationSeconds: 6,
	sources: [
		{ src: '/api/v1/clips/00000000-0000-4000-8000-000000000001/720.mp4', type: 'video/mp4', width: 960, height: 540 },
		{ src: '/api/v1/clips/00000000-0000-4000-8000-000000000001/360.mp4', type: 'video/mp4', width: 640, height: 360 }
	],
	poster: '/api/v1/clips/00000000-0000-4000-8000-000000000001/poster.jpg',
	captions: '/api/v1/clips/00000000-0000-4000-8000-000000000001/captions.vtt'
};

describe('Clip', () => {
	it('plays a ready clip in the browser’s player: controls, no autoplay, a captions track on by default and a captions button', () => {
		state.data = { clips: [ready] };
		const body = render(Clip, { props: { name: 'dim-then-light' } }).body;
		expect(elementsByTestId(body, 'clip-video')).toHaveLength(1);
		expect(body).toMatch(/<video[^>]*\scontrols/);
		expect(body).not.toMatch(/autoplay/);
		expect(body).toMatch(/<track kind="captions" src="[^"]*captions\.vtt" srclang="en" label="English captions" default/);
		expect(body).toMatch(/<source src="[^"]*360\.mp4" type="video\/mp4" media="\(max-width: 640px\)"/);
		expect(body).toContain('720.mp4');
		expect(body).toMatch(/aria-pressed="true"[^>]*>\s*Captions on/);
		expect(body).toContain('Dimming the daylight');
	});

	it('shows a clip being prepared with its progress, and one that failed with its reason', () => {
		state.data = { clips: [{ ...ready, status: 'transcoding', progress: 0.42, sources: [], poster: null }], lessonPreview: true };
		expect(render(Clip, { props: { name: 'dim-then-light' } }).body).toMatch(/42 %/);
		state.data = { clips: [{ ...ready, status: 'failed', error: 'This file could not be read as video.', sources: [], poster: null }] };
		const failed = render(Clip, { props: { name: 'dim-then-light' } }).body;
		expect(failed).toContain('could not be read as video');
		expect(elementsByTestId(failed, 'clip-video')).toHaveLength(0);
	});

	it('names a missing clip in a notice, without a player', () => {
		state.data = { clips: [] };
		const body = render(Clip, { props: { name: 'nothing-here' } }).body;
		expect(elementsByTestId(body, 'widget-notice')).toHaveLength(1);
		expect(body).toContain('nothing-here');
		expect(body).not.toContain('<video');
	});
});
