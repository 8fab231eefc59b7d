// One cohort: its members (added and removed by e-mail) and a due date per Assignment of its course, each change audited.
import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { clearDueSchema, dueDateSchema, memberSchema, type ClearDueForm, type DueDateForm, type MemberForm } from '$lib/forms/cohorts';
import type { Notice } from '$lib/forms/review';
import { addMember, clearDueDate, cohortDetail, removeMember, setDueDate } from '$lib/server/cohorts/manage';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const detail = await cohortDetail(Number(event.params.id));
	if (!detail) error(404, { message: 'There is no such cohort.' });
	const firstOpen = detail.dues.find((d) => !d.dueAt) ?? detail.dues[0];
	const [memberForm, dueForm] = await Promise.all([
		superValidate<MemberForm, Notice>(zod4(memberSchema), { id: 'member' }),
		superValidate<DueDateForm, Notice>({ assignmentId: firstOpen?.assignmentId ?? 0, dueAt: '' }, zod4(dueDateSchema), { id: 'due-date', errors: false })
	]);
	return { ...detail, memberForm, dueForm, notice: event.url.searchParams.get('notice') };
};

async function memberChange(event: RequestEvent, change: typeof addMember) {
	const user = requireRole(event, 'author');
	const form = await superValidate<MemberForm, Notice>(event.request, zod4(memberSchema), { id: 'member' });
	if (!form.valid) return fail(400, { form });
	const done = await change(user, Number(event.params.id), form.data.email);
	if (!done.ok) return message(form, { text: done.message, ok: false }, { status: 400 });
	return message(form, { text: done.message, ok: true });
}

export const actions = {
	addMember: (event) => memberChange(event, addMember),
	removeMember: (event) => memberChange(event, removeMember),
	setDue: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate<DueDateForm, Notice>(event.request, zod4(dueDateSchema), { id: 'due-date' });
		if (!form.valid) return fail(400, { form });
		const done = await setDueDate(user, Number(event.params.id), form.data.assignmentId, new Date(`${form.data.dueAt}:00Z`));
		if (!done.ok) return message(form, { text: done.message, ok: false }, { status: 400 });
		return message(form, { text: done.message, ok: true });
	},
	// a plain post from a due date's row: its answer comes back as the due-date form's message
	clearDue: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate<ClearDueForm, Notice>(event.request, zod4(clearDueSchema), { id: 'due-date' });
		if (!form.valid) return fail(400, { form });
		const done = await clearDueDate(user, Number(event.params.id), form.data.assignmentId);
		if (!done.ok) return message(form, { text: done.message, ok: false }, { status: 400 });
		return message(form, { text: done.message, ok: true });
	}
} satisfies Actions;
