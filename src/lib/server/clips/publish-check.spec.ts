// A lesson placing a clip is published only when that clip is the lesson's own and ready.
import { describe, expect, it } from 'vitest';
import type { LessonSegment } from '../../lessons/widgets';
import { clipProblemsIn } from './publish-check';

const clip = (name: string): LessonSegment => ({ kind: 'widget', name: 'Clip', props: { name } });

describe('clips before publishing', () => {
	it('passes ready clips and names each missing, failed or unready one', () => {
		const segments: LessonSegment[] = [{ kind: 'html', html: '<p>x</p>' }, clip('ready-one'), clip('missing'), clip('broken'), clip('busy')];
		const problems = clipProblemsIn(segments, [
			{ name: 'ready-one', status: 'ready' },
			{ name: 'broken', status: 'failed' },
			{ name: 'busy', status: 'transcoding' }
		]);
		expect(problems).toHaveLength(3);
		expect(problems[0]).toMatch(/name="missing".*no clip of that name/);
		expect(problems[1]).toMatch(/name="broken".*could not be processed/);
		expect(problems[2]).toMatch(/name="busy".*still being prepared/);
		expect(clipProblemsIn([clip('ready-one')], [{ name: 'ready-one', status: 'ready' }])).toEqual([]);
	});
});
