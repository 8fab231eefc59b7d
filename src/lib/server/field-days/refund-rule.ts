// The cancellation rule of a paid field day: a full refund up to a number of hours before the start, none after.

export type RefundRule = { refundHours: number; startsAt: Date };

/** The last moment a cancellation is refunded in full. */
export function refundDeadline(rule: RefundRule): Date {
	return new Date(rule.startsAt.getTime() - rule.refundHours * 3_600_000);
}

export function refundableAt(rule: RefundRule, now: Date): boolean {
	return now.getTime() <= refundDeadline(rule).getTime();
}

/** The sentence shown before paying and beside the cancel button. */
export function refundRuleText(rule: RefundRule, paid: boolean): string {
	if (!paid) return 'Cancel any time before the day; your seat then goes to the next person on the waiting list.';
	const hours = rule.refundHours;
	const span = hours % 24 === 0 && hours >= 24 ? `${hours / 24} day${hours === 24 ? '' : 's'}` : `${hours} hour${hours === 1 ? '' : 's'}`;
	return `Cancel at least ${span} before the start for a full refund; after that a cancellation frees your seat for the next person but is not refunded.`;
}
