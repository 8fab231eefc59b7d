// Reviewing one Attempt: the measured analysis beside the photo, numbered pins, the rubric, the critique and an override.
import { error, fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { loadAttemptView } from '$lib/server/attempts/view';
import { addPin, removePin, saveReview } from '$lib/server/review/save';
import { sendCritiqueMail } from '$lib/server/review/notify-learner';
import type { AttemptVerdict } from '$lib/server/db/schema';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const mentor = requireRole(event, 'mentor');
	const attempt = await loadAttemptView(mentor, event.params.id);
	if (!attempt) error(404, { message: 'There is no such attempt.' });
	return { attempt };
};

const field = (data: FormData, name: string) => {
	const v = data.get(name);
	return typeof v === 'string' ? v : '';
};

export const actions = {
	pin: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const data = await event.request.formData();
		const saved = await addPin(mentor, event.params.id, {
			frameName: field(data, 'frame'),
			x: Number(field(data, 'x')),
			y: Number(field(data, 'y')),
			text: field(data, 'text')
		});
		if (!saved.ok) return fail(saved.status, { pin: { message: saved.message } });
		return { pin: { message: `Pin ${saved.number} added.`, ok: true } };
	},
	unpin: async (event) => {
		requireRole(event, 'mentor');
		const data = await event.request.formData();
		const saved = await removePin(event.params.id, Number(field(data, 'pin')));
		if (!saved.ok) return fail(saved.status, { pin: { message: saved.message } });
		return { pin: { message: 'Pin removed.', ok: true } };
	},
	review: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const data = await event.request.formData();
		const rubric: Record<string, string> = {};
		for (const [k, v] of data.entries()) if (k.startsWith('rubric:') && typeof v === 'string') rubric[k.slice(7)] = v;
		const saved = await saveReview(mentor, event.params.id, {
			text: field(data, 'text'),
			rubric,
			verdict: (field(data, 'verdict') || 'keep') as AttemptVerdict | 'keep',
			reason: field(data, 'reason')
		});
		if (!saved.ok) return fail(saved.status, { review: { message: saved.message } });
		const mail = await sendCritiqueMail(event.url.origin, event.params.id, {
			learner: saved.learner,
			assignment: saved.assignment,
			verdict: saved.verdict,
			changed: saved.changed
		});
		const sent = mail.ok ? 'The learner has been e-mailed.' : 'Saved, but the e-mail could not be sent; the learner will see the critique on the verdict page.';
		return { review: { ok: true, message: `Review ${saved.first ? 'sent' : 'updated'}. ${sent}` } };
	}
} satisfies Actions;
