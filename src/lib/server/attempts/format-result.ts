// Measured values and targets of criterion results, and Exif fields, as short strings for the verdict page.
import { formatAperture, formatShutter } from '../../exposure/index';
import { describeFlash, type ExifReport } from '../analysis/index';
import type { CriterionResult } from '../grading/index';
import { formatOffset, formatStopAmount } from '../grading/format';
import { formatDecimal, formatFocalLength, formatMired, formatMm, formatStops, roundTo } from '../../format/numbers';

/** '+1', '−0.7', '0': EV offsets with their sign, one decimal at most. */
function signed(value: number): string {
	return roundTo(value, 1) > 0 ? `+${formatDecimal(value)}` : formatDecimal(value);
}

/** One number in the criterion's unit. */
export function formatValue(value: number, unit: CriterionResult['unit']): string {
	switch (unit) {
		case 'stops':
			return formatStops(value);
		case 'EV':
			return `${signed(value)} EV`;
		case 's':
			return value > 0 ? `${formatShutter(value)} s` : '—';
		case 'f-number':
			return value > 0 ? formatAperture(value) : '—';
		case 'ISO':
			return `ISO ${Math.round(value)}`;
		case 'mm':
			return formatMm(value);
		case 'mired':
			return formatMired(value);
		case 'flash':
			return value ? 'fired' : 'not fired';
		case 'percent':
			return `${Math.round(value)} %`;
		case 'px':
			return `${value < 10 ? value.toFixed(1) : Math.round(value)} px`;
		case 'judged':
			return '—';
	}
}

function many(values: number | number[] | null, unit: CriterionResult['unit'], format = formatValue): string {
	if (values === null) return '—';
	return Array.isArray(values) ? values.map((v) => format(v, unit)).join(', ') : format(values, unit);
}

/** Targets and tolerances are what an author typed: ⅓ and ½ stops read better than 0.3 and 0.5. */
function formatAuthored(value: number, unit: CriterionResult['unit']): string {
	if (unit === 'stops') return formatStopAmount(value);
	if (unit === 'EV') return `${formatOffset(value)} EV`;
	return formatValue(value, unit);
}

export function formatMeasured(r: Pick<CriterionResult, 'measured' | 'unit'>): string {
	return many(r.measured, r.unit);
}

/** "1½ stops ± ½ stop", "at least 1 stop", "1/1000 s or shorter", "f/5.6 to f/11". */
export function formatTargetOf(r: Pick<CriterionResult, 'target' | 'tolerance' | 'unit' | 'comparison'>): string {
	const { target, tolerance, unit, comparison } = r;
	if (target === null) return tolerance === null ? '—' : `what your settings say, ± ${formatAuthored(tolerance, 'stops')}`;
	if (comparison === 'between' && Array.isArray(target) && target.length === 2) return `${formatAuthored(target[0], unit)} to ${formatAuthored(target[1], unit)}`;
	const shown = many(target, unit, formatAuthored);
	if (comparison === 'within') {
		if (tolerance === null) return shown;
		const tol = formatAuthored(tolerance, unit === 'EV' ? 'stops' : unit);
		return Array.isArray(target) ? `${shown} (each ± ${tol})` : `${shown} ± ${tol}`;
	}
	if (comparison === 'at-least') return unit === 's' ? `${shown} or longer` : `at least ${shown}`;
	return unit === 's' ? `${shown} or shorter` : `at most ${shown}`;
}

export interface ExifRow {
	label: string;
	value: string;
}

/** The Exif panel: the settings that matter for lighting, in camera words; absent tags say so. */
export function exifRows(exif: ExifReport): ExifRow[] {
	const or = (value: string | null) => value ?? 'not recorded';
	return [
		{ label: 'Shutter', value: or(exif.exposureTime ? `${formatShutter(exif.exposureTime)} s` : null) },
		{ label: 'Aperture', value: or(exif.fNumber ? formatAperture(exif.fNumber) : null) },
		{ label: 'ISO', value: or(exif.iso ? String(Math.round(exif.iso)) : null) },
		{ label: 'Exposure bias', value: or(exif.exposureBias === null ? null : `${signed(exif.exposureBias)} EV`) },
		{ label: 'Flash', value: or(exif.flash ? describeFlash(exif.flash) : null) },
		{ label: 'Focal length', value: or(exif.focalLength ? formatFocalLength(exif.focalLength, exif.focal35) : null) },
		{ label: 'White balance', value: or(exif.whiteBalance) },
		{ label: 'Taken', value: or(exif.dateTimeOriginal?.replace('T', ' ') ?? null) },
		{ label: 'Camera', value: or([exif.make, exif.model].filter(Boolean).join(' ') || null) }
	];
}
