// Measured values and targets of criterion results, and Exif fields, as short strings for the verdict page.
import type { EvidenceRow } from '$lib/attempts/criterion-view';
import { formatAperture, formatShutter } from '../../exposure/index';
import { decodeGrid, describeFlash, type ExifReport } from '../analysis/index';
import type { CriterionResult } from '../grading/index';
import { formatOffset, formatStopAmount } from '../grading/format';
import { formatDecimal, formatFocalLength, formatMetres, formatMired, formatMm, formatStops, roundTo } from '../../format/numbers';

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

/**
 * What the pixels showed beside a criterion: the flash's share of the subject's light, the measured subject level and
 * the level predicted from what the learner used (side by side), and the blown-out share. Empty for settings criteria.
 */
export function evidenceRows(r: Pick<CriterionResult, 'evidence'>): EvidenceRow[] {
	const e = r.evidence;
	if (!e) return [];
	const rows: EvidenceRow[] = [];
	const atLeast = e.lowerBound ? 'at least ' : e.upperBound ? 'at most ' : '';
	const ratioWords = (r: number) => `${formatStops(Math.abs(r))} ${r >= 0 ? 'over' : 'under'} the ambient`;
	const shareOf = (r: number) => `${Math.round(100 / (1 + 2 ** -r))} %`;
	if (e.ratioRange) {
		// the ratio known only within a range: its ends, an open low end meaning "no flash" cannot be ruled out
		const [low, high] = e.ratioRange;
		const value =
			low === null
				? high === null
					? 'not measurable'
					: `at most ${shareOf(high)} (flash ${high >= 0 ? 'at most' : 'at least'} ${ratioWords(high)})`
				: high === null
					? `at least ${shareOf(low)} (flash ${low >= 0 ? 'at least' : 'at most'} ${ratioWords(low)})`
					: `${shareOf(low)} to ${shareOf(high)} (flash from ${ratioWords(low)} to ${ratioWords(high)})`;
		rows.push({ key: 'share', label: 'Flash’s share of the light on the subject', value });
	} else if (e.flashShare !== undefined) {
		const ratio = e.ratioStops === undefined ? '' : ` (flash ${ratioWords(e.ratioStops)})`;
		rows.push({ key: 'share', label: 'Flash’s share of the light on the subject', value: `${atLeast}${Math.round(100 * e.flashShare)} %${ratio}` });
	}
	if (e.lift !== undefined) {
		const doubt = e.uncertainty !== undefined && !e.lowerBound && !e.upperBound ? ` (± ${formatStops(e.uncertainty)})` : '';
		rows.push({ key: 'measured', label: 'Subject level, measured', value: `${atLeast}${formatStops(e.lift, { signed: true })} over the ambient alone${doubt}` });
	}
	if (e.predictedLift !== undefined) {
		rows.push({ key: 'predicted', label: 'Subject level, predicted from what you used', value: `${formatStops(e.predictedLift, { signed: true })} over the ambient alone` });
	}
	if (e.blownPercent !== undefined && e.blownPercent >= 1) {
		rows.push({ key: 'blown', label: 'Flash-lit subject blown out', value: `${Math.round(e.blownPercent)} %` });
	}
	return rows;
}

export interface ClippedCells {
	cols: number;
	rows: number;
	/** cell indices, row by row */
	cells: number[];
}

// a measuring cell counts as a clipped area when this share of its pixels has a channel at the top codes
const CLIPPED_CELL = 0.25;

/** The clipped areas of a frame, from the light grid stored with its analysis; null without one. */
export function clippedCells(grid: Parameters<typeof decodeGrid>[0]): ClippedCells | null {
	const cells = decodeGrid(grid);
	if (!cells) return null;
	const out: number[] = [];
	for (let i = 0; i < cells.clipped.length; i++) if (cells.clipped[i] >= CLIPPED_CELL) out.push(i);
	return { cols: cells.cols, rows: cells.rows, cells: out };
}

/** 'guide number 60, ¼ power, 3.5 m from the subject'; null when nothing was stated. */
export function describeFlashUsed(used: { gn?: number; power?: number; distance?: number } | null | undefined): string | null {
	if (!used) return null;
	const parts: string[] = [];
	if (used.gn !== undefined) parts.push(`guide number ${formatDecimal(used.gn)}`);
	if (used.power !== undefined) parts.push(used.power >= 1 ? 'full power' : `${formatPowerFraction(used.power)} power`);
	if (used.distance !== undefined) parts.push(`${formatMetres(used.distance)} from the subject`);
	return parts.length ? parts.join(', ') : null;
}

/** 0.25 → '1/4', 0.3 → '0.3': flash power as the flash shows it when it is one over a whole number. */
function formatPowerFraction(power: number): string {
	const over = 1 / power;
	return Math.abs(over - Math.round(over)) < 1e-6 ? `1/${Math.round(over)}` : formatDecimal(power, 2);
}
