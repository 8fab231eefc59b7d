// Coupons: every code with its terms and uses, and a new coupon (limit uses, last day); each change is audited.
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { createCoupon, listCoupons } from '$lib/server/payments/admin-coupons';
import { newCouponSchema } from '$lib/forms/coupons';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const [coupons, form] = await Promise.all([listCoupons(), superValidate(zod4(newCouponSchema), { id: 'new-coupon' })]);
	return { coupons, form };
};

export const actions = {
	create: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(newCouponSchema), { id: 'new-coupon' });
		if (!form.valid) return fail(400, { form });
		const made = await createCoupon(admin, form.data);
		if (!made.ok) return made.field ? setError(form, made.field, made.message) : setError(form, made.message);
		redirect(303, `/admin/coupons/${made.code}?notice=created`);
	}
} satisfies Actions;
