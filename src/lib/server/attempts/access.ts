// Who may see an Attempt and its files: the learner who made it, mentors and admins; nobody else.
import type { Role } from '../db/schema';

export interface Viewer {
	id: string;
	roles: readonly Role[];
}

export function isStaffReviewer(viewer: Viewer): boolean {
	return viewer.roles.includes('mentor') || viewer.roles.includes('admin');
}

export function canSeeAttempt(viewer: Viewer | null, ownerId: string): boolean {
	if (!viewer) return false;
	return viewer.id === ownerId || isStaffReviewer(viewer);
}
