// Issued certificates, newest first; an admin revokes one with a reason (audit line; the public page then says revoked).
import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { listIssued, revokeCredential } from '$lib/server/credentials/register';
import { revokeSchema, type RevokeForm } from '$lib/forms/credentials';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

/** Each row has its own revoke form, told apart by the certificate's id. */
const revokeFormId = (id: string) => `credential-${id}`;

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const issued = await listIssued();
	const forms = await Promise.all(
		issued.filter((c) => !c.revokedAt).map((c) => superValidate<RevokeForm, Notice>({ credentialId: c.id }, zod4(revokeSchema), { id: revokeFormId(c.id), errors: false }))
	);
	return { issued, revokeForms: Object.fromEntries(forms.map((f) => [f.data.credentialId, f])) };
};

export const actions = {
	revoke: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate<RevokeForm, Notice>(event.request, zod4(revokeSchema));
		if (!form.valid) return fail(400, { form });
		const result = await revokeCredential(admin, form.data.credentialId, form.data.reason);
		if (!result.ok) return message(form, { text: result.message, ok: false }, { status: 400 });
		return message(form, { text: result.message, ok: true });
	}
} satisfies Actions;
