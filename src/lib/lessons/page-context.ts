// The lesson page's data as a widget reads it: typed, and empty outside a SvelteKit page (a bare render).
import { page } from '$app/state';
import type { LessonPageData } from './page-data';

/** What widgets may find in `page.data`: the lesson page's data, the viewer, and the author's-preview flag. */
export type WidgetPageData = Partial<LessonPageData> & { user?: unknown; lessonPreview?: boolean };

export function lessonPageData(): WidgetPageData {
	try {
		return (page.data ?? {}) as WidgetPageData;
	} catch {
		return {};
	}
}
