// Reviewing one Attempt: the measured analysis beside the photo, numbered pins, the rubric, the critique and an override.
import { randomUUID } from 'node:crypto';
import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { loadAttemptView } from '$lib/server/attempts/view';
import { addPin, ownAttemptMessage, removePin, saveReview } from '$lib/server/review/save';
import { sendCritiqueMail } from '$lib/server/review/notify-learner';
import { pinSchema, reviewSchema, unpinSchema, type Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

const newPin = (frame: string) => ({ frame, across: 50, down: 50, text: '', key: randomUUID() });

export const load: PageServerLoad = async (event) => {
	const mentor = requireRole(event, 'mentor');
	const attempt = await loadAttemptView(mentor, event.params.id);
	if (!attempt) error(404, { message: 'There is no such attempt.' });
	// their own work is read on the learner's page; another mentor reviews it
	if (attempt.mine) error(403, { message: `${ownAttemptMessage} Your verdict page is /attempts/${attempt.id}.` });
	const names = attempt.frames.map((f) => f.name);
	const [pinForms, unpinForms, review] = await Promise.all([
		Promise.all(names.map((name) => superValidate(newPin(name), zod4(pinSchema), { id: `pin-${name}`, errors: false }))),
		Promise.all(names.map((name) => superValidate(zod4(unpinSchema), { id: `unpin-${name}` }))),
		superValidate(
			{ text: attempt.critique?.text ?? '', rubric: attempt.critique?.rubric ?? {}, verdict: 'keep' as const, reason: '' },
			zod4(reviewSchema),
			{ id: 'review', errors: false }
		)
	]);
	return {
		attempt,
		pinForms: Object.fromEntries(names.map((n, i) => [n, pinForms[i]])),
		unpinForms: Object.fromEntries(names.map((n, i) => [n, unpinForms[i]])),
		review
	};
};

export const actions = {
	pin: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const form = await superValidate(event.request, zod4(pinSchema));
		if (!form.valid) return fail(400, { form });
		const { frame, across, down, text, key } = form.data;
		const saved = await addPin(mentor, event.params.id, { frameName: frame, x: across / 100, y: down / 100, text, clientKey: key });
		if (!saved.ok) return message(form, { text: saved.message, ok: false } satisfies Notice, { status: saved.status });
		// a fresh, empty form with a new key for the next pin
		form.data = newPin(frame);
		return message(form, { text: `Pin ${saved.number} added.`, ok: true } satisfies Notice);
	},
	unpin: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const form = await superValidate(event.request, zod4(unpinSchema));
		if (!form.valid) return fail(400, { form });
		const saved = await removePin(mentor, event.params.id, form.data.pin);
		if (!saved.ok) return message(form, { text: saved.message, ok: false } satisfies Notice, { status: saved.status });
		return message(form, { text: 'Pin removed.', ok: true } satisfies Notice);
	},
	review: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const form = await superValidate(event.request, zod4(reviewSchema));
		if (!form.valid) return fail(400, { form });
		const saved = await saveReview(mentor, event.params.id, form.data);
		if (!saved.ok) {
			if (saved.field) return setError(form, saved.field, saved.message);
			return message(form, { text: saved.message, ok: false } satisfies Notice, { status: saved.status });
		}
		const mail = await sendCritiqueMail(event.url.origin, event.params.id, {
			learner: saved.learner,
			assignment: saved.assignment,
			verdict: saved.verdict,
			changed: saved.changed
		});
		const sent = mail.ok ? 'The learner has been e-mailed.' : 'Saved, but the e-mail could not be sent; the learner will see the critique on the verdict page.';
		form.data = { ...form.data, verdict: 'keep', reason: '' };
		return message(form, { text: `Review ${saved.first ? 'sent' : 'updated'}. ${sent}`, ok: true } satisfies Notice);
	}
} satisfies Actions;
