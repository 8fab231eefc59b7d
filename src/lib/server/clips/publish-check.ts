// Before a lesson is published: every <Clip name> in it must name one of the lesson's clips that is ready to play.
import type { LessonSegment } from '../../lessons/widgets';
import { clipsOfLesson } from './records';

type ClipState = { name: string; status: string };

export function clipProblemsIn(segments: LessonSegment[], clips: ClipState[]): string[] {
	const problems: string[] = [];
	for (const s of segments) {
		if (s.kind !== 'widget' || s.name !== 'Clip') continue;
		const name = (s.props.name ?? '').trim();
		const clip = clips.find((c) => c.name === name);
		if (!clip) problems.push(`<Clip name="${name}" />: this lesson has no clip of that name. Add it under Clips, or correct the name.`);
		else if (clip.status === 'failed') problems.push(`<Clip name="${name}" />: the clip could not be processed. Delete it and add it again.`);
		else if (clip.status !== 'ready') problems.push(`<Clip name="${name}" />: the clip is still being prepared. Publish once it is ready.`);
	}
	return problems;
}

export async function clipProblems(lessonId: number, segments: LessonSegment[]): Promise<string[]> {
	if (!segments.some((s) => s.kind === 'widget' && s.name === 'Clip')) return [];
	return clipProblemsIn(segments, await clipsOfLesson(lessonId));
}
