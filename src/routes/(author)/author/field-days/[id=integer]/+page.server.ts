// Changing a field day: the same form; booked learners get the update with the same calendar UID and a higher SEQUENCE.
import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { fieldDaySchema } from '$lib/forms/field-days';
import { changeFieldDay } from '$lib/server/field-days/schedule';
import { scheduleOptions } from '$lib/server/field-days/options';
import { fieldDayForEditing } from '$lib/server/field-days/read';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const found = await fieldDayForEditing(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such field day.' });
	const { values, calledOff } = found;
	const [options, form] = await Promise.all([scheduleOptions(), superValidate(values, zod4(fieldDaySchema), { id: 'field-day', errors: false })]);
	return { id: Number(event.params.id), options, form, title: values.title, calledOff };
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(fieldDaySchema), { id: 'field-day' });
		if (!form.valid) return fail(400, { form });
		const changed = await changeFieldDay(user, Number(event.params.id), form.data, event.url.origin);
		if (!changed.ok) {
			if (!changed.field && changed.message === 'There is no such field day.') return fail(404, { form });
			return changed.field ? setError(form, changed.field, changed.message) : setError(form, changed.message);
		}
		redirect(303, '/author/field-days?notice=changed');
	}
} satisfies Actions;
