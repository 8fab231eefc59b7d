// A lesson's clips as the Clip widget reads them (page data): the player's addresses, or the state of one not ready yet.
import type { ClipCard } from '../../lessons/page-data';
import { clipUrl } from './keys';
import { clipsOfLesson, type LessonClip } from './records';

/** What a card is made from: the clip's row less its upload, captions text and bookkeeping. */
export type ClipCardSource = Pick<LessonClip, 'id' | 'name' | 'title' | 'status' | 'progress' | 'error' | 'durationSeconds' | 'renditions' | 'poster'>;

export function clipCard(clip: ClipCardSource): ClipCard {
	const ready = clip.status === 'ready';
	return {
		id: clip.id,
		name: clip.name,
		title: clip.title,
		status: clip.status,
		progress: clip.progress,
		error: clip.error,
		durationSeconds: clip.durationSeconds,
		sources: ready ? [...clip.renditions].sort((a, b) => b.height - a.height).map((r) => ({ src: clipUrl(clip.id, r.file), type: r.type, width: r.width, height: r.height })) : [],
		poster: ready && clip.poster ? clipUrl(clip.id, clip.poster) : null,
		captions: clipUrl(clip.id, 'captions.vtt')
	};
}

/** Every clip of a lesson with its state, for its editor (learners' ready clips come with the lesson page's one query). */
export async function lessonClipCards(lessonId: number): Promise<ClipCard[]> {
	return (await clipsOfLesson(lessonId)).map(clipCard);
}
