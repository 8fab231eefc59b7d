// The wording of field-day e-mails: a booked seat (with the invitation), a cancellation, a freed seat offered, a day called off.
import { compose } from '../mail-letters';
import type { Letter } from '../mail';

type Day = { title: string; when: string; meetingPoint: string; href: string };

export function seatBookedLetter(to: string, name: string, d: Day & { safetyBriefing: string; kitList: string }, ics: string): Letter {
	return {
		...compose(
			to,
			`Your seat: ${d.title}`,
			[
				`Hello ${name},`,
				`Your seat at “${d.title}” is booked: ${d.when}, meeting at ${d.meetingPoint}. The attached invitation adds it to your calendar.`,
				d.kitList ? `Bring: ${d.kitList}` : '',
				`Safety briefing (we go through it again on the day): ${d.safetyBriefing}`
			].filter(Boolean),
			{ href: d.href, label: 'See the field day' }
		),
		icalEvent: { method: 'REQUEST', filename: 'field-day.ics', content: ics }
	};
}

export function seatCancelledLetter(to: string, name: string, d: Day & { refunded: string | null }, ics: string): Letter {
	return {
		...compose(
			to,
			`Cancelled: ${d.title}`,
			[
				`Hello ${name},`,
				`Your seat at “${d.title}” (${d.when}) is cancelled. The attached update removes it from your calendar.`,
				d.refunded ? `${d.refunded} is on its way back to you.` : ''
			].filter(Boolean),
			{ href: d.href, label: 'See the field day' }
		),
		icalEvent: { method: 'CANCEL', filename: 'field-day.ics', content: ics }
	};
}

export function seatOfferedLetter(to: string, name: string, d: Day & { until: string; pay: string | null }): Letter {
	return compose(
		to,
		`A seat is free: ${d.title}`,
		[
			`Hello ${name},`,
			`A seat at “${d.title}” (${d.when}) has come free and it is yours if you take it by ${d.until}. After that it goes to the next person on the waiting list.`,
			d.pay ? `Taking it means paying ${d.pay} at checkout.` : 'Taking it books your seat at once.'
		],
		{ href: d.href, label: 'Take the seat' }
	);
}

export function fieldDayChangedLetter(to: string, name: string, d: Day, ics: string): Letter {
	return {
		...compose(
			to,
			`Changed: ${d.title}`,
			[`Hello ${name},`, `“${d.title}” has changed: it is now ${d.when}, meeting at ${d.meetingPoint}. The attached update changes it in your calendar.`],
			{ href: d.href, label: 'See the field day' }
		),
		icalEvent: { method: 'REQUEST', filename: 'field-day.ics', content: ics }
	};
}

/** To everyone who had a seat, a hold, an offer or a place in the queue; only a seat had a calendar event to remove. */
export function fieldDayCalledOffLetter(to: string, name: string, d: Day & { reason: string; refunded: string | null }, ics: string | null): Letter {
	const letter = compose(
		to,
		`Called off: ${d.title}`,
		[
			`Hello ${name},`,
			`We have called off “${d.title}” (${d.when}). ${d.reason}`,
			ics ? 'Your seat is cancelled; the attached update removes it from your calendar.' : 'Your place for it is cancelled.',
			d.refunded ? `${d.refunded} is on its way back to you in full.` : '',
			'We are sorry. Other field days are listed on the site.'
		].filter(Boolean),
		{ href: d.href, label: 'See the field day' }
	);
	return ics ? { ...letter, icalEvent: { method: 'CANCEL', filename: 'field-day.ics', content: ics } } : letter;
}
