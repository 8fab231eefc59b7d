// The wording of every e-mail Stopwise sends, as plain text and matching HTML.
import type { Letter } from './mail';

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Paragraphs become the text part; the same paragraphs, escaped, with the link as a button, the HTML part. */
export function compose(to: string, subject: string, paragraphs: string[], link?: { href: string; label: string }): Letter {
	const text = [...paragraphs, ...(link ? [`${link.label}: ${link.href}`] : []), '— Stopwise'].join('\n\n');
	const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
	const button = link
		? `<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="background:#f0a040;color:#141518;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(link.label)}</a></p>` +
			`<p style="margin:0 0 14px;font-size:13px;color:#555">Or paste this address into your browser: ${escapeHtml(link.href)}</p>`
		: '';
	const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1b1d21;max-width:560px">${body}${button}<p style="color:#555">— Stopwise</p></body></html>`;
	return { to, subject, text, html };
}

export function verifyEmailLetter(to: string, name: string, href: string, hours: number): Letter {
	return compose(
		to,
		'Confirm your e-mail address for Stopwise',
		[
			`Hello ${name},`,
			`Please confirm that this address is yours, so we can send you course news, receipts and password links. The link works once and for ${hours} hours.`,
			'If you did not sign up for Stopwise, ignore this message and nothing will happen.'
		],
		{ href, label: 'Confirm my address' }
	);
}

/** Someone signed up with an address that has an account: the owner learns of it, the sign-up page said nothing. */
export function existingAccountLetter(to: string, name: string, signInHref: string): Letter {
	return compose(
		to,
		'Someone tried to create a Stopwise account with your address',
		[
			`Hello ${name},`,
			'Someone (perhaps you) asked to create a Stopwise account with this address. You already have one, so nothing was created and nothing changed.',
			'If it was you, sign in with your password. If you have forgotten it, choose “Forgot your password?” on the sign-in page.',
			'If it was not you, you need not do anything.'
		],
		{ href: signInHref, label: 'Sign in' }
	);
}

export function resetPasswordLetter(to: string, name: string, href: string, minutes: number): Letter {
	return compose(
		to,
		'Choose a new Stopwise password',
		[
			`Hello ${name},`,
			`Someone (we hope you) asked to reset the password for this address. The link below works once and for ${minutes} minutes. Choosing a new password signs you out on every device.`,
			'If you did not ask for this, ignore this message: your password stays as it is.'
		],
		{ href, label: 'Choose a new password' }
	);
}

export function changeEmailLetter(to: string, name: string, href: string, hours: number): Letter {
	return compose(
		to,
		'Confirm your new e-mail address for Stopwise',
		[
			`Hello ${name},`,
			`You asked to use this address for your Stopwise account. Confirm it with the link below; it works once and for ${hours} hours. Until then your old address stays in use.`,
			'If this was not you, ignore this message.'
		],
		{ href, label: 'Use this address' }
	);
}

export function emailChangedNotice(to: string, name: string, newEmail: string): Letter {
	return compose(to, 'Your Stopwise e-mail address was changed', [
		`Hello ${name},`,
		`Your Stopwise account now uses ${newEmail}. Mail will no longer come to this address.`,
		'If you did not make this change, reset your password from the sign-in page and contact the school right away.'
	]);
}

export function critiqueLetter(to: string, name: string, r: { assignment: string; verdict: string; changed: boolean; href: string }): Letter {
	return compose(
		to,
		`Your mentor's critique: ${r.assignment}`,
		[
			`Hello ${name},`,
			`A mentor has reviewed your attempt at "${r.assignment}" and written a critique, with notes pinned on your photo.`,
			r.changed ? `The mentor changed the verdict to: ${r.verdict}. The reason is on the verdict page.` : `Verdict: ${r.verdict}.`
		],
		{ href: r.href, label: 'Read the critique' }
	);
}

export function shootPlanLetter(to: string, name: string, r: { assignment: string; approved: boolean; note: string; href: string }): Letter {
	return compose(
		to,
		r.approved ? `Your Shoot Plan is approved: ${r.assignment}` : `Your Shoot Plan came back with a note: ${r.assignment}`,
		[
			`Hello ${name},`,
			r.approved
				? `A mentor approved your Shoot Plan for "${r.assignment}". Uploads are open: shoot it as planned, and keep to the venue's rules on the day.`
				: `A mentor read your Shoot Plan for "${r.assignment}" and asks you to change it before you shoot.`,
			...(r.note ? [`The mentor's note: ${r.note}`] : [])
		],
		{ href: r.href, label: r.approved ? 'Open the Assignment' : 'Revise the plan' }
	);
}

export function passwordChangedNotice(to: string, name: string): Letter {
	return compose(to, 'Your Stopwise password was changed', [
		`Hello ${name},`,
		'The password of your Stopwise account was just changed, and other devices were signed out.',
		'If you did not do this, reset your password from the sign-in page and contact the school.'
	]);
}

export type ReceiptFacts = { course: string; amount: string; paidAt: string; reference: string; coupon: string | null; href: string };

export function receiptLetter(to: string, name: string, r: ReceiptFacts): Letter {
	return compose(
		to,
		`Your Stopwise receipt: ${r.course}`,
		[
			`Hello ${name},`,
			`Thank you for enrolling in "${r.course}". Every lesson of the course is open to you now.`,
			`Paid: ${r.amount}${r.coupon ? ` (coupon ${r.coupon})` : ''}`,
			`Date: ${r.paidAt}`,
			`Reference: ${r.reference}`,
			'Keep this e-mail as your receipt. Your billing page lists every payment.'
		],
		{ href: r.href, label: 'See your billing page' }
	);
}

/** `accessKept`: another payment or a grant still covers the course, so the lessons stay open. */
export function refundLetter(to: string, name: string, r: Omit<ReceiptFacts, 'paidAt' | 'coupon'> & { accessKept?: boolean }): Letter {
	return compose(
		to,
		`Your Stopwise refund: ${r.course}`,
		[
			`Hello ${name},`,
			`We refunded ${r.amount} for "${r.course}" (reference ${r.reference}). It usually reaches your card within a few working days.`,
			r.accessKept
				? 'Your access to this course stays open: another payment or a grant still covers it.'
				: 'The members-only lessons of this course are closed to your account now; the open lessons stay open to everyone.'
		],
		{ href: r.href, label: 'See your billing page' }
	);
}
