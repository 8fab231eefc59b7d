// Wall-clock time at a venue (an IANA zone) to an instant and back, with the platform's own zone data (Intl).

function offsetMs(instant: number, timeZone: string): number {
	const parts = new Intl.DateTimeFormat('en-US', {
		timeZone,
		hourCycle: 'h23',
		year: 'numeric',
		month: '2-digit',
		day: '2-digit',
		hour: '2-digit',
		minute: '2-digit',
		second: '2-digit'
	}).formatToParts(new Date(instant));
	const n = (type: string) => Number(parts.find((p) => p.type === type)!.value);
	return Date.UTC(n('year'), n('month') - 1, n('day'), n('hour'), n('minute'), n('second')) - Math.floor(instant / 1000) * 1000;
}

/** "2027-05-15T07:30" at `timeZone` as an instant; a time skipped by a clock change moves forward with it. */
export function zonedToInstant(local: string, timeZone: string): Date {
	const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local);
	if (!m) throw new Error(`not a local date-time: ${local}`);
	const wall = Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5]);
	let guess = wall - offsetMs(wall, timeZone);
	// a second pass settles times near a change of offset
	guess = wall - offsetMs(guess, timeZone);
	return new Date(guess);
}

/** The instant as the venue's wall clock, in the form a datetime-local field takes. */
export function instantToZoned(instant: Date, timeZone: string): string {
	const shifted = new Date(instant.getTime() + offsetMs(instant.getTime(), timeZone));
	return shifted.toISOString().slice(0, 16);
}
