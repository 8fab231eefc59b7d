import { describe, expect, test } from 'vitest';
import { instantToZoned, zonedToInstant } from './zoned-time';

describe('venue wall-clock time', () => {
	test('summer and winter offsets of a zone with daylight saving', () => {
		// IANA tz database: America/New_York is UTC−4 in May (EDT) and UTC−5 in January (EST)
		expect(zonedToInstant('2027-05-15T07:30', 'America/New_York').toISOString()).toBe('2027-05-15T11:30:00.000Z');
		expect(zonedToInstant('2027-01-15T07:30', 'America/New_York').toISOString()).toBe('2027-01-15T12:30:00.000Z');
		// IANA tz database: Europe/Berlin is UTC+2 in summer (CEST)
		expect(zonedToInstant('2027-07-01T14:00', 'Europe/Berlin').toISOString()).toBe('2027-07-01T12:00:00.000Z');
	});

	test('round trip back to the wall clock', () => {
		for (const [local, tz] of [
			['2027-05-15T07:30', 'America/New_York'],
			['2027-11-20T16:45', 'Australia/Sydney'],
			['2027-03-01T00:05', 'UTC']
		] as const) {
			expect(instantToZoned(zonedToInstant(local, tz), tz)).toBe(local);
		}
	});
});
