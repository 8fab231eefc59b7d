// An Assignment's upload page and the learner's history of attempts at it (enrolled learners and staff).
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { requireCourseAccess } from '$lib/server/enrolment-access';
import { findLessonAssignment } from '$lib/server/attempts/assignment';
import { listAttemptsFor } from '$lib/server/attempts/history';
import { maxUploadBytes } from '$lib/server/attempts/limits';
import { describeCriterion } from '$lib/server/grading';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const { course, lesson, slug } = event.params;
	const assignment = await findLessonAssignment(course, lesson, slug);
	if (!assignment) error(404, { message: 'There is no such assignment.' });
	await requireCourseAccess(user, assignment.course.id, assignment.course.slug);
	const blur = assignment.spec?.criteria.find((c) => c.kind === 'motion-blur');
	return {
		assignment: {
			slug: assignment.slug,
			title: assignment.title,
			brief: assignment.brief,
			frames: assignment.spec?.frames ?? [],
			criteria: assignment.spec?.criteria.map(describeCriterion) ?? [],
			open: assignment.spec !== null,
			motion: blur ? { speed: blur.speed, distance: blur.distance } : null,
			planLights: assignment.spec?.lightPlan?.minLights ?? null
		},
		lesson: assignment.lesson,
		course: { slug: assignment.course.slug, title: assignment.course.title },
		history: await listAttemptsFor(user.id, assignment.id),
		maxUploadBytes: maxUploadBytes()
	};
};
