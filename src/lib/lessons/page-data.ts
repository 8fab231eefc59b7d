// What a lesson page hands its widgets (`page.data`): one typed shape, written by the server and read by the widgets.
import type { LessonSegment } from './widgets';

/** One Assignment as the lesson's Assignment card shows it. */
export interface AssignmentCard {
	slug: string;
	title: string;
	brief: string;
	frames: string[];
	criteria: string[];
	/** the viewer's last verdict; `at` is an ISO date */
	lastVerdict: { verdict: string; at: string | null } | null;
	/** null unless the viewer may upload (signed in, with course access) */
	uploadHref: string | null;
}

/** One lesson clip as the Clip widget shows it; the addresses are given only to a viewer the lesson's rule lets in. */
export interface ClipCard {
	id: string;
	name: string;
	title: string;
	status: 'uploading' | 'queued' | 'transcoding' | 'ready' | 'failed';
	/** 0–1 while transcoding */
	progress: number;
	error: string | null;
	durationSeconds: number | null;
	/** largest first; empty until ready */
	sources: { src: string; type: string; width: number; height: number }[];
	poster: string | null;
	captions: string;
}

/** A learner's saved quiz answers, keyed by quiz id. */
export type SavedQuizAnswers = Record<string, { answer: string; correct: boolean }>;

export type LessonLink = { slug: string; title: string; moduleTitle: string };

/** The lesson page's data. */
export interface LessonPageData {
	course: { slug: string; title: string };
	module: { slug: string; title: string };
	lesson: { slug: string; title: string; summary: string; minutes: number; freePreview: boolean };
	segments: LessonSegment[];
	/** null for a visitor */
	progress: { completed: boolean } | null;
	quizAnswers: SavedQuizAnswers;
	assignments: AssignmentCard[];
	/** the lesson's clips that are ready to play (what `<Clip name>` finds) */
	clips: ClipCard[];
	neighbours: { previous: LessonLink | null; next: LessonLink | null; position: number; count: number };
}
