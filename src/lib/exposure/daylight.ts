// Daylight exposure rules of thumb: EV100 for common outdoor conditions (the Ambient Dimmer's starting points).
import { ExposureInputError } from './errors';

/** Identifier of a daylight condition. */
export type DaylightCondition = 'sun-on-sand-or-snow' | 'bright-sun' | 'hazy-sun' | 'overcast' | 'heavy-overcast' | 'open-shade';

/** A daylight condition with its human label, EV100 (stops) and the sunny-16 style f-number at 1/ISO s giving about that EV. */
export interface DaylightConditionInfo {
	id: DaylightCondition;
	label: string;
	ev100: number;
	sunnyRule: string;
}

// Common practice, no published source of our own checking: the EV100 figures are the daylight rows of the
// ANSI PH2.7 exposure guide as widely reproduced (not verified against the standard's text); they assume front
// light between about two hours after sunrise and two hours before sunset. The hints restate each EV the sunny-16
// way (f-number at a shutter of 1/ISO s, within half a stop); some sunny-16 lists put open shade a stop darker.
/** Daylight conditions in order from brightest to dimmest, for pickers; EV100 in stops. */
export const daylightConditions: readonly DaylightConditionInfo[] = Object.freeze([
	{ id: 'sun-on-sand-or-snow', label: 'Bright sun on sand or snow', ev100: 16, sunnyRule: 'f/22 at 1/ISO s' },
	{ id: 'bright-sun', label: 'Bright sun, distinct shadows', ev100: 15, sunnyRule: 'f/16 at 1/ISO s' },
	{ id: 'hazy-sun', label: 'Hazy sun, soft shadows', ev100: 14, sunnyRule: 'f/11 at 1/ISO s' },
	{ id: 'overcast', label: 'Overcast, no shadows', ev100: 13, sunnyRule: 'f/8 at 1/ISO s' },
	{ id: 'heavy-overcast', label: 'Heavy overcast', ev100: 12, sunnyRule: 'f/5.6 at 1/ISO s' },
	{ id: 'open-shade', label: 'Open shade on a sunny day', ev100: 12, sunnyRule: 'f/5.6 at 1/ISO s' }
].map((c) => Object.freeze(c as DaylightConditionInfo)));

/** EV100 (stops) for a daylight condition, by rule of thumb (common practice). */
export function daylightEv(condition: DaylightCondition): number {
	const found = daylightConditions.find((c) => c.id === condition);
	if (!found) {
		const known = daylightConditions.map((c) => c.id).join(', ');
		throw new ExposureInputError(`unknown daylight condition '${String(condition)}'; use one of ${known}`);
	}
	return found.ev100;
}
