// One coupon: change its discount, limit, last day or switch it off (with a reason for the audit log); who used it.
import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { changeCoupon, couponUses, findCouponRow } from '$lib/server/payments/admin-coupons';
import { changeCouponSchema } from '$lib/forms/coupons';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const code = event.params.code.toUpperCase();
	const coupon = await findCouponRow(code);
	if (!coupon) error(404, { message: 'There is no such coupon.' });
	const [uses, form] = await Promise.all([
		couponUses(code),
		superValidate({ percentOff: coupon.percentOff, maxUses: coupon.maxUses ?? 0, lastDay: coupon.lastDay, active: coupon.active, reason: '' }, zod4(changeCouponSchema), {
			id: 'change-coupon',
			errors: false
		})
	]);
	return { coupon, uses, form, created: event.url.searchParams.get('notice') === 'created' };
};

export const actions = {
	change: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(changeCouponSchema), { id: 'change-coupon' });
		if (!form.valid) return fail(400, { form });
		const saved = await changeCoupon(admin, event.params.code.toUpperCase(), form.data);
		if (!saved.ok) return setError(form, saved.message);
		form.data.reason = '';
		return message(form, 'Saved. The change is in the audit log.');
	}
} satisfies Actions;
