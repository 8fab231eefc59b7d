// Says each criterion in plain words for learners (the Assignment card shows these).
import { formatAperture, formatShutter } from '../../exposure/index';
import { formatAmount, formatMired, formatMm, formatOffset, formatStopAmount, formatTarget } from './format';
import { criterionSchema, type Criterion, type CriterionInput } from './spec';

/** Accepts a criterion as stored or as an author is still typing it (defaults applied here). */
export function describeCriterion(criterion: Criterion | CriterionInput): string {
	const parsed = criterionSchema.safeParse(criterion);
	if (!parsed.success) return 'This criterion is not complete yet: check its fields.';
	return describeParsed(parsed.data);
}

function describeParsed(c: Criterion): string {
	switch (c.kind) {
		case 'ambient-under': {
			const against = c.sceneEv !== undefined ? `a scene that meters EV ${c.sceneEv} at ISO 100` : 'your ambient reference frame';
			return `Set the ambient exposure ${formatTarget(c.stops, c.tolerance)} stops under ${against}, so the background goes deep.`;
		}
		case 'subject-lift':
			return `Light the subject so they stand at least ${formatStopAmount(c.minStops)} brighter than the background.`;
		case 'background-drop':
			return `The background must darken between the reference and the lit frame by what your settings say, within ${formatStopAmount(c.tolerance)} (frames straight from the camera).`;
		case 'shutter-min':
			return `Use a shutter speed of ${formatShutter(c.seconds)} s or faster.`;
		case 'shutter-max':
			return `Use a shutter speed of ${formatShutter(c.seconds)} s or slower.`;
		case 'aperture-range':
			if (c.min !== undefined && c.max !== undefined) return `Shoot at an aperture between ${formatAperture(c.min)} and ${formatAperture(c.max)}.`;
			return c.min !== undefined ? `Shoot at ${formatAperture(c.min)} or a smaller aperture (larger f-number).` : `Shoot at ${formatAperture(c.max as number)} or a wider aperture (smaller f-number).`;
		case 'iso-max':
			return `Keep the ISO at ${c.iso} or lower.`;
		case 'focal-max':
			return `Use a focal length of ${formatMm(c.mm35)} or wider (35 mm equivalent).`;
		case 'focal-min':
			return `Use a focal length of ${formatMm(c.mm35)} or longer (35 mm equivalent).`;
		case 'flash-evidence':
			return 'Light the subject with flash; if your trigger leaves no record in the file, a mentor will confirm it from the picture.';
		case 'background-cooler':
			return `Make the background render at least ${formatMired(c.minMired)} cooler (bluer) than the subject: low Kelvin white balance and a warming gel on the flash.`;
		case 'bracket':
			return `Shoot a bracket at ${c.offsets.map(formatOffset).join(', ')} EV from the first frame (each within ± ${formatAmount(c.tolerance)}).`;
	}
}
