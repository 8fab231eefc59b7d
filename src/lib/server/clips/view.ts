// A lesson's clips as the Clip widget reads them (page data): the player's addresses, or the state of one not ready yet.
import type { ClipCard } from '../../lessons/page-data';
import { clipUrl } from './keys';
import { clipsOfLesson, type LessonClip } from './records';

export function clipCard(clip: LessonClip): ClipCard {
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

/** Called only after the lesson's access rule let the viewer in: learners get ready clips, the editor every one. */
export async function lessonClipCards(lessonId: number, options: { readyOnly: boolean }): Promise<ClipCard[]> {
	const rows = await clipsOfLesson(lessonId);
	return rows.filter((c) => !options.readyOnly || c.status === 'ready').map(clipCard);
}
