// Reads the upload form (multipart): assignment, submission key, subject box, optional Light Plan, stated speed and distance, what flash was used, one file per frame.
import { checkBox, parseBox, DEFAULT_SUBJECT_BOX, type Box } from '../analysis/index';
import { parseLightPlan, type AttachedLightPlan } from './light-plan';
import { readStatedNumber, type StatedMotion } from './stated';
import { flashUsedSchema } from '../../forms/flash-used';
import type { FlashUsed } from '../grading/index';

export interface UploadForm {
	assignmentSlug: string;
	submissionKey: string;
	subjectBox: Box;
	lightPlan: AttachedLightPlan | null;
	/** the subject's speed and distance, when the learner gave them (for blur criteria) */
	stated: StatedMotion;
	/** what the learner says they used (guide number, power, distance); null when nothing was given */
	flashUsed: FlashUsed | null;
	/** by frame name, from fields named `frame:<name>` */
	files: Map<string, File>;
}

export type UploadFormResult = { ok: true; form: UploadForm } | { ok: false; message: string };

// a browser-made UUID or any other unguessable token; bounded so it cannot bloat the unique index
const SUBMISSION_KEY = /^[A-Za-z0-9_-]{8,64}$/;

const text = (data: FormData, name: string) => {
	const value = data.get(name);
	return typeof value === 'string' ? value : '';
};

export function readUploadForm(data: FormData): UploadFormResult {
	const assignmentSlug = text(data, 'assignment').trim();
	if (!assignmentSlug) return { ok: false, message: 'The upload does not say which assignment it is for.' };
	const submissionKey = text(data, 'submissionKey').trim();
	if (!SUBMISSION_KEY.test(submissionKey)) return { ok: false, message: 'The upload is missing its submission key. Reload the page and try again.' };

	let subjectBox: Box = { ...DEFAULT_SUBJECT_BOX };
	const boxText = text(data, 'subjectBox').trim();
	if (boxText) {
		const box = parseBox(boxText);
		const problem = box ? checkBox(box) : 'The subject box needs four numbers: x, y, width, height.';
		if (problem || !box) return { ok: false, message: problem ?? 'The subject box could not be read.' };
		subjectBox = box;
	}

	const plan = parseLightPlan(text(data, 'lightPlan'));
	if (!plan.ok) return { ok: false, message: plan.message };

	const speed = readStatedNumber(text(data, 'subjectSpeed'), 'speed');
	if (!speed.ok) return { ok: false, message: speed.message };
	const distance = readStatedNumber(text(data, 'subjectDistance'), 'distance');
	if (!distance.ok) return { ok: false, message: distance.message };

	const used = flashUsedSchema.safeParse({ gn: text(data, 'flashGn'), power: text(data, 'flashPower'), distance: text(data, 'flashDistance') });
	if (!used.success) return { ok: false, message: used.error.issues[0].message };
	const given = Object.fromEntries(Object.entries(used.data).filter(([, v]) => v !== undefined)) as FlashUsed;

	const files = new Map<string, File>();
	for (const [name, value] of data.entries()) {
		if (!name.startsWith('frame:') || typeof value === 'string') continue;
		files.set(name.slice('frame:'.length), value);
	}
	const stated = { speed: speed.value, distance: distance.value };
	return { ok: true, form: { assignmentSlug, submissionKey, subjectBox, lightPlan: plan.plan, stated, flashUsed: Object.keys(given).length ? given : null, files } };
}
