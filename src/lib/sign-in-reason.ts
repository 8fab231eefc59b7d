// Why the sign-in page was shown: a short sentence from the path the visitor was trying to reach.

const reasons: ReadonlyArray<[RegExp, string]> = [
	[/^\/courses\/[^/]+\/[^/]+\/assignments\/[^/]+/, 'Sign in to open this Assignment.'],
	[/^\/courses\/[^/]+\/[^/]+/, 'Sign in to open this lesson.'],
	[/^\/courses\/[^/]+/, 'Sign in to enrol in this course.'],
	[/^\/attempts\//, 'Sign in to see this Attempt and its Verdict.'],
	[/^\/progress/, 'Sign in to see your progress.'],
	[/^\/checkout/, 'Sign in to finish enrolling.'],
	[/^\/account\/billing/, 'Sign in to see your billing and receipts.'],
	[/^\/account/, 'Sign in to manage your account.'],
	[/^\/mentor/, 'Sign in to open the Review queue.'],
	[/^\/author/, 'Sign in to write and publish lessons.'],
	[/^\/admin/, 'Sign in to open the admin pages.']
];

/** 'Sign in to open this lesson.' for '/courses/c/l', null when the path says nothing (the catalogue, the home page). */
export function signInReason(redirectTo: string | null | undefined): string | null {
	if (!redirectTo) return null;
	const path = redirectTo.split(/[?#]/)[0];
	return reasons.find(([pattern]) => pattern.test(path))?.[1] ?? null;
}
