// Everything a lesson page reads from the database, in one round trip: the lesson with its module and course, its
// Assignments in order, its ready clips, and its place in the course's reading order (previous, next, position, count).
// One prepared statement instead of four queries: the lesson page is the most visited page of the app.
import { client } from '../db';
import type { Assignment, Lesson } from '../db/schema';
import type { LessonPageData } from '../../lessons/page-data';
import type { ClipCardSource } from '../clips/view';

export type LessonPageRows = {
	lesson: Pick<Lesson, 'id' | 'slug' | 'title' | 'summary' | 'minutes' | 'freePreview' | 'source' | 'body' | 'contentPath' | 'updatedAt'>;
	module: { slug: string; title: string };
	course: { id: number; slug: string; title: string };
	assignments: Pick<Assignment, 'id' | 'slug' | 'title' | 'brief' | 'spec'>[];
	/** the clips learners may play (ready ones), oldest first */
	clips: ClipCardSource[];
	neighbours: LessonPageData['neighbours'];
};

type Row = {
	id: number;
	slug: string;
	title: string;
	summary: string;
	minutes: number;
	free_preview: boolean;
	source: 'file' | 'db';
	body: string | null;
	content_path: string | null;
	/** as PostgreSQL writes it: the Drizzle client leaves timestamps unparsed */
	updated_at: string;
	module_slug: string;
	module_title: string;
	course_id: number;
	course_slug: string;
	course_title: string;
	position: number;
	count: number;
	previous: LessonPageData['neighbours']['previous'];
	next: LessonPageData['neighbours']['next'];
	assignments: LessonPageRows['assignments'];
	clips: LessonPageRows['clips'];
};

/**
 * A published lesson of a published course by its address, with what its page shows; null when there is none.
 * The course's reading order: modules by position, then lessons by position, then id; published lessons only.
 */
export async function readLessonPageRows(courseSlug: string, lessonSlug: string): Promise<LessonPageRows | null> {
	const [row] = await client<Row[]>`
		with target as (
			select l.id, l.slug, l.title, l.summary, l.minutes, l.free_preview, l.source, l.body, l.content_path, l.updated_at,
				m.slug as module_slug, m.title as module_title, c.id as course_id, c.slug as course_slug, c.title as course_title
			from lessons l
			join modules m on m.id = l.module_id
			join courses c on c.id = m.course_id
			where c.slug = ${courseSlug} and l.slug = ${lessonSlug} and l.published and c.published
			limit 1
		), reading as (
			select l.id, l.slug, l.title, m.title as module_title,
				(row_number() over (order by m.position, l.position, l.id))::int as at
			from lessons l
			join modules m on m.id = l.module_id
			where m.course_id = (select course_id from target) and l.published
		), here as (
			select coalesce((select r.at from reading r join target t on r.id = t.id), 0) as at
		)
		select t.*,
			(select at from here) as position,
			(select count(*) from reading)::int as count,
			(select json_build_object('slug', r.slug, 'title', r.title, 'moduleTitle', r.module_title)
				from reading r where (select at from here) > 0 and r.at = (select at from here) - 1) as previous,
			(select json_build_object('slug', r.slug, 'title', r.title, 'moduleTitle', r.module_title)
				from reading r where (select at from here) > 0 and r.at = (select at from here) + 1) as next,
			coalesce((
				select json_agg(json_build_object('id', a.id, 'slug', a.slug, 'title', a.title, 'brief', a.brief, 'spec', a.spec)
					order by a.position, a.id)
				from assignments a where a.lesson_id = t.id
			), '[]'::json) as assignments,
			coalesce((
				select json_agg(json_build_object('id', k.id, 'name', k.name, 'title', k.title, 'status', k.status,
					'progress', k.progress, 'error', k.error, 'durationSeconds', k.duration_seconds, 'renditions', k.renditions,
					'poster', k.poster) order by k.created_at)
				from lesson_clips k where k.lesson_id = t.id and k.status = 'ready'
			), '[]'::json) as clips
		from target t`;
	if (!row) return null;
	return {
		lesson: {
			id: row.id,
			slug: row.slug,
			title: row.title,
			summary: row.summary,
			minutes: row.minutes,
			freePreview: row.free_preview,
			source: row.source,
			body: row.body,
			contentPath: row.content_path,
			// read as Drizzle reads a timestamptz column, so the render cache keys agree with the publisher's
			updatedAt: new Date(row.updated_at)
		},
		module: { slug: row.module_slug, title: row.module_title },
		course: { id: row.course_id, slug: row.course_slug, title: row.course_title },
		assignments: row.assignments,
		clips: row.clips,
		neighbours: { previous: row.previous, next: row.next, position: row.position, count: row.count }
	};
}
