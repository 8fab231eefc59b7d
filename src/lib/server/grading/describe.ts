// Says each criterion in plain words for learners (the Assignment card shows these).
import { formatAperture, formatShutter } from '../../exposure/index';
import { targetRatio } from './criteria/flash-share';
import { formatAmount, formatMired, formatMm, formatOffset, formatStopAmount, formatTarget, sentence } from './format';
import { criterionSchema, DEFAULT_SYNC_SPEED, type Criterion, type CriterionInput } from './spec';

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
			return `Light the subject so the flash lifts them at least ${formatStopAmount(c.minStops)} above the ambient alone, standing out of the darker background (measured against your ambient reference frame).`;
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
		case 'sync':
			return c.highSpeedSync
				? `High-speed sync allowed: shutters above ${c.syncSpeed ? `${formatShutter(c.syncSpeed)} s` : 'your sync speed'} pass, and the verdict says what they cost the flash.`
				: `Keep the shutter at or below your camera’s flash sync speed (${formatShutter(c.syncSpeed ?? DEFAULT_SYNC_SPEED)} s unless the assignment says otherwise).`;
		case 'flash-share':
			return c.share !== undefined
				? `Balance your lights so about ${Math.round(c.share * 100)} % of the subject’s light comes from the flash (± ${formatAmount(c.tolerance)} stop of flash against ambient).`
				: `Balance your lights so the flash is ${formatOffset(targetRatio(c))} stops against the ambient on the subject (± ${formatAmount(c.tolerance)}).`;
		case 'subject-clipping':
			return `Keep the flash-lit subject from blowing out: at most ${c.maxPercent} % of it clipped to white.`;
		case 'motion-blur':
			return `Freeze the action: a subject at ${formatAmount(c.speed)} m/s, ${formatAmount(c.distance)} m away, may smear at most ${formatAmount(c.maxPx)} px, counted from your shutter and focal length (you can give your own speed and distance when you upload).`;
		case 'mentor-judged':
			return `A mentor judges from the picture: ${sentence(c.look)}`;
		case 'bracket':
			return `Shoot a bracket at ${c.offsets.map(formatOffset).join(', ')} EV from the first frame (each within ± ${formatAmount(c.tolerance)}).`;
	}
}
