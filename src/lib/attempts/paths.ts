// Where an Assignment's page lives (its upload form and history): one place for the server's pages, letters and feeds.

/** `/courses/<course>/<lesson>/assignments/<assignment>`, relative to the site's origin. */
export function assignmentPath(courseSlug: string, lessonSlug: string, assignmentSlug: string): string {
	return `/courses/${courseSlug}/${lessonSlug}/assignments/${assignmentSlug}`;
}
