// Checking a pasted certificate (the .jwt text or the .json file): valid, tampered, revoked or not ours.
import { fail } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { verifySchema } from '$lib/forms/credentials';
import { verifyPasted } from '$lib/server/credentials/verify';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	return { form: await superValidate(zod4(verifySchema), { errors: false }) };
};

export const actions = {
	default: async ({ request }) => {
		const form = await superValidate(request, zod4(verifySchema));
		if (!form.valid) return fail(400, { form });
		return { form, result: await verifyPasted(form.data.credential) };
	}
} satisfies Actions;
