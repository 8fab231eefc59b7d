// Scheduling a field day (superforms + zod): when and where, seats and price, kit, the required safety briefing, mentors.
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { fieldDaySchema } from '$lib/forms/field-days';
import { scheduleFieldDay } from '$lib/server/field-days/schedule';
import { scheduleOptions } from '$lib/server/field-days/options';
import { demoSafetyBriefing } from '$lib/server/field-days/demo';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const options = await scheduleOptions();
	const form = await superValidate(
		{ courseSlug: options.courses[0]?.slug ?? '', timeZone: 'America/New_York', seats: 8, refundHours: 48, price: '0', safetyBriefing: demoSafetyBriefing },
		zod4(fieldDaySchema),
		{ id: 'field-day', errors: false }
	);
	return { options, form };
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(fieldDaySchema), { id: 'field-day' });
		if (!form.valid) return fail(400, { form });
		const made = await scheduleFieldDay(user, form.data);
		if (!made.ok) return made.field ? setError(form, made.field, made.message) : setError(form, made.message);
		redirect(303, '/author/field-days?notice=scheduled');
	}
} satisfies Actions;
