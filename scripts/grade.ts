// Command line for authors: grade frames against an Assignment spec and print the verdict (table or --json).
import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { checkBox, describeFlash, parseBox, tryReadFrame, type Box, type Frame } from '../src/lib/server/analysis/index';
import { describeCriterion, formatSpecErrors, grade, parseSpecText, type AssignmentSpec, type FlashUsed, type GradeResult } from '../src/lib/server/grading/index';
import { formatAperture, formatShutter } from '../src/lib/exposure/index';

const USAGE = `Usage: npm run grade -- --spec spec.json --frame reference=ref.jpg --frame lit=lit.jpg [--subject x,y,w,h] [--json]

  --spec FILE          Assignment spec (JSON)
  --frame NAME=FILE    a frame named as in the spec's "frames" (repeat for each)
  --subject x,y,w,h    subject box in fractions of the frame (default: a centred box)
  --used gn,power,distance
                       what you used: guide number (m, ISO 100), power (1/4 or 0.25), distance (m);
                       the verdict then shows the predicted subject lift beside the measured one
  --json               print the full result as JSON
Exit codes: 0 graded (any verdict), 1 bad input.`;

/** A problem with what the author gave us: printed as is, never with a stack trace. */
class InputProblem extends Error {}

interface Options {
	specPath: string;
	frames: Map<string, string>;
	subject: Box | undefined;
	used: FlashUsed | undefined;
	json: boolean;
}

function parseUsed(text: string): FlashUsed {
	const parts = text.split(',').map((p) => p.trim());
	const num = (p: string | undefined) => {
		if (p === undefined || p === '') return undefined;
		const fraction = /^(\d+(?:\.\d+)?)\/(\d+(?:\.\d+)?)$/.exec(p);
		const n = fraction ? Number(fraction[1]) / Number(fraction[2]) : Number(p);
		if (!Number.isFinite(n) || n <= 0) throw new InputProblem(`--used needs positive numbers gn,power,distance, got "${text}".`);
		return n;
	};
	const [gn, power, distance] = [num(parts[0]), num(parts[1]), num(parts[2])];
	if (parts.length !== 3 || gn === undefined || distance === undefined) throw new InputProblem(`--used needs gn,power,distance (power may be empty for full), got "${text}".`);
	if (power !== undefined && power > 1) throw new InputProblem('--used: power is a fraction of full power, at most 1 (1/4 or 0.25).');
	return { gn, power, distance };
}

function readOptions(argv: string[]): Options | 'help' {
	let values;
	try {
		({ values } = parseArgs({
			args: argv,
			options: {
				spec: { type: 'string' },
				frame: { type: 'string', multiple: true },
				subject: { type: 'string' },
				used: { type: 'string' },
				json: { type: 'boolean', default: false },
				help: { type: 'boolean', short: 'h', default: false }
			},
			strict: true,
			allowPositionals: false
		}));
	} catch (error) {
		throw new InputProblem(error instanceof Error ? error.message : String(error));
	}
	if (values.help) return 'help';
	if (!values.spec) throw new InputProblem('--spec is required.');
	const frames = new Map<string, string>();
	for (const entry of values.frame ?? []) {
		const at = entry.indexOf('=');
		if (at <= 0 || at === entry.length - 1) throw new InputProblem(`--frame needs NAME=FILE, got "${entry}".`);
		const name = entry.slice(0, at);
		if (frames.has(name)) throw new InputProblem(`--frame ${name} is given twice.`);
		frames.set(name, entry.slice(at + 1));
	}
	let subject: Box | undefined;
	if (values.subject !== undefined) {
		const box = parseBox(values.subject);
		if (!box) throw new InputProblem(`--subject needs four numbers x,y,w,h (fractions 0–1), got "${values.subject}".`);
		const problem = checkBox(box);
		if (problem) throw new InputProblem(`--subject: ${problem}`);
		subject = box;
	}
	return { specPath: values.spec, frames, subject, used: values.used !== undefined ? parseUsed(values.used) : undefined, json: values.json ?? false };
}

async function readFileFor(what: string, path: string): Promise<Buffer> {
	try {
		return await readFile(path);
	} catch (error) {
		const code = (error as NodeJS.ErrnoException).code;
		const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : (error as Error).message;
		throw new InputProblem(`Cannot read ${what} "${path}": ${why}.`);
	}
}

async function loadSpec(path: string): Promise<AssignmentSpec> {
	const parsed = parseSpecText((await readFileFor('the spec', path)).toString('utf8'));
	if (!parsed.ok) throw new InputProblem(`The spec "${path}" is not valid:\n${formatSpecErrors(parsed.errors).replace(/^/gm, '  ')}`);
	return parsed.spec;
}

async function loadFrames(spec: AssignmentSpec, options: Options): Promise<Record<string, Frame>> {
	const unknown = [...options.frames.keys()].filter((name) => !spec.frames.includes(name));
	if (unknown.length) throw new InputProblem(`The spec has no frame named ${unknown.join(', ')}; it lists: ${spec.frames.join(', ')}.`);
	const absent = spec.frames.filter((name) => !options.frames.has(name));
	if (absent.length) throw new InputProblem(`Give every frame the spec lists; missing: ${absent.map((n) => `--frame ${n}=FILE`).join(', ')}.`);
	const frames: Record<string, Frame> = {};
	const problems: string[] = [];
	for (const [name, path] of options.frames) {
		const read = await tryReadFrame(await readFileFor(`frame "${name}"`, path), { subject: options.subject });
		if (read.ok) frames[name] = read.frame;
		else problems.push(`${name} (${path}): ${read.error.message}`);
	}
	if (problems.length) throw new InputProblem(problems.join('\n'));
	return frames;
}

const n = (value: number, digits: number) => String(Number(value.toFixed(digits)));

function showValue(value: number | number[] | null, unit: string): string {
	if (value === null) return '—';
	if (Array.isArray(value)) return value.map((v) => n(v, 2)).join(', ');
	if (unit === 's') return `${formatShutter(value)} s`;
	if (unit === 'f-number') return formatAperture(value);
	if (unit === 'stops' || unit === 'EV') return n(value, 2);
	return n(value, 0);
}

function showFrame(name: string, frame: Frame): string[] {
	const e = frame.exif;
	const settings = [
		e.exposureTime !== null ? `${formatShutter(e.exposureTime)} s` : 'shutter ?',
		e.fNumber !== null ? formatAperture(e.fNumber) : 'f/?',
		e.iso !== null ? `ISO ${e.iso}` : 'ISO ?',
		e.exposureBias !== null ? `bias ${n(e.exposureBias, 2)} EV` : 'bias ?',
		e.flash ? `flash ${describeFlash(e.flash)}` : 'flash ?',
		e.focal35 !== null ? `${e.focal35} mm (35 mm eq.)` : e.focalLength !== null ? `${e.focalLength} mm` : 'focal ?'
	].join(', ');
	const lines = [`  ${name}: ${frame.file.label}, ${settings}`];
	const p = frame.pixels;
	if (p) {
		const k = (v: number | null) => (v === null ? '—' : `${Math.round(v)} K`);
		lines.push(
			`    ${p.width}×${p.height}; subject ${n(p.subject.stops, 2)} stops (${k(p.subject.cct)}, ${n(100 * p.subject.clippedShare, 1)} % clipped), background ${n(p.background.stops, 2)} stops (${k(p.background.cct)}, ${n(100 * p.background.clippedShare, 1)} % clipped); clipped ${n(p.clippedHighlights, 1)} % highlights, ${n(p.clippedShadows, 1)} % shadows`
		);
	}
	for (const note of frame.notes) lines.push(`    note: ${note}`);
	return lines;
}

function printTable(spec: AssignmentSpec, result: GradeResult): void {
	const out: string[] = [];
	if (spec.title) out.push(spec.title, '');
	out.push('Frames');
	for (const [name, frame] of Object.entries(result.frames)) out.push(...showFrame(name, frame));
	out.push('', 'Criteria');
	const rows = result.criteria.map((c, i) => [c.verdict.toUpperCase(), c.kind, showValue(c.measured, c.unit), showValue(c.target, c.unit) + (c.tolerance !== null ? ` ± ${n(c.tolerance, 2)}` : ''), c.unit, i] as const);
	const widths = [0, 1, 2, 3, 4].map((col) => Math.max(...rows.map((r) => String(r[col]).length), ['verdict', 'kind', 'measured', 'target', 'unit'][col].length));
	const line = (cells: readonly (string | number)[]) => cells.slice(0, 5).map((cell, col) => String(cell).padEnd(widths[col])).join('  ');
	out.push(`  ${line(['verdict', 'kind', 'measured', 'target', 'unit'])}`);
	for (const row of rows) {
		const c = result.criteria[row[5]];
		out.push(`  ${line(row)}`, `      ${describeCriterion(spec.criteria[row[5]])}`, `      → ${c.message}`);
		const e = c.evidence;
		if (e?.lift !== undefined) {
			const predicted = e.predictedLift !== undefined ? `; predicted from what you used ${n(e.predictedLift, 2)}` : '';
			out.push(`      lift ${n(e.lift, 2)} ± ${n(e.uncertainty ?? 0, 2)} stops, flash ${Math.round(100 * (e.flashShare ?? 0))} % of the subject's light${predicted}`);
		}
	}
	for (const note of result.notes) out.push('', `Note: ${note}`);
	out.push('', `Verdict: ${result.verdict}`);
	console.log(out.join('\n'));
}

async function main(): Promise<number> {
	const options = readOptions(process.argv.slice(2));
	if (options === 'help') {
		console.log(USAGE);
		return 0;
	}
	const spec = await loadSpec(options.specPath);
	const frames = await loadFrames(spec, options);
	const result = grade(spec, frames, { used: options.used });
	if (options.json) console.log(JSON.stringify(result, null, 2));
	else printTable(spec, result);
	return 0;
}

main().then(
	(code) => process.exit(code),
	(error: unknown) => {
		if (error instanceof InputProblem) console.error(`${error.message}\n\n${USAGE.split('\n')[0]}`);
		else console.error(`Grading stopped unexpectedly: ${error instanceof Error ? error.message : String(error)}`);
		process.exit(1);
	}
);

