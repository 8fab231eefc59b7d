// Reading the upload form: defaults, the subject box and Light Plan checks, and the frame files by name.
import { describe, expect, it } from 'vitest';
import { DEFAULT_SUBJECT_BOX } from '../analysis/index';
import { readUploadForm } from './upload-form';

function form(fields: Record<string, string>, files: Record<string, string> = {}): FormData {
	const data = new FormData();
	for (const [k, v] of Object.entries(fields)) data.append(k, v);
	for (const [k, v] of Object.entries(files)) data.append(`frame:${k}`, new Blob([v]), `${k}.jpg`);
	return data;
}
const base = { assignment: 'off-the-axis', submissionKey: '3f0c2b8e-7d1a-4c55-9a0e-2d4b6f8a1c3e' };
const plan = { camera: { x: 0, y: -3 }, subject: { x: 0, y: 0 }, lights: [{ x: -1.41, y: -1.41 }] };

describe('readUploadForm', () => {
	it('reads the fields and files; the box defaults to the centred one and the plan to none', () => {
		const read = readUploadForm(form(base, { reference: 'a', lit: 'b' }));
		expect(read.ok).toBe(true);
		if (!read.ok) return;
		expect(read.form).toMatchObject({ assignmentSlug: 'off-the-axis', submissionKey: base.submissionKey, subjectBox: DEFAULT_SUBJECT_BOX, lightPlan: null });
		expect([...read.form.files.keys()]).toEqual(['reference', 'lit']);
	});

	it('takes a subject box and a Light Plan', () => {
		const read = readUploadForm(form({ ...base, subjectBox: '0.1,0.2,0.3,0.4', lightPlan: JSON.stringify(plan) }));
		expect(read).toMatchObject({ ok: true, form: { subjectBox: { x: 0.1, y: 0.2, w: 0.3, h: 0.4 }, lightPlan: plan } });
	});

	it('says what is wrong with a missing key, a bad box or a bad plan', () => {
		expect(readUploadForm(form({ assignment: 'x' }))).toEqual({ ok: false, message: 'The upload is missing its submission key. Reload the page and try again.' });
		expect(readUploadForm(form({ submissionKey: base.submissionKey }))).toMatchObject({ ok: false });
		expect(readUploadForm(form({ ...base, subjectBox: '0.8,0.8,0.5,0.5' }))).toEqual({
			ok: false,
			message: 'The subject box must end inside the frame (x + width and y + height at most 1).'
		});
		expect(readUploadForm(form({ ...base, subjectBox: 'middle' }))).toMatchObject({ ok: false, message: 'The subject box needs four numbers: x, y, width, height.' });
		expect(readUploadForm(form({ ...base, lightPlan: '{' }))).toMatchObject({ ok: false, message: expect.stringContaining('could not be read') });
		const farLight = { ...plan, lights: [{ x: 40, y: 0 }] };
		expect(readUploadForm(form({ ...base, lightPlan: JSON.stringify(farLight) }))).toMatchObject({ ok: false, message: expect.stringContaining('one to three lights') });
		expect(readUploadForm(form({ ...base, lightPlan: JSON.stringify({ ...plan, lights: [] }) }))).toMatchObject({ ok: false });
	});

	it("reads the subject's stated speed and distance, empty as not stated, and refuses nonsense", () => {
		expect(readUploadForm(form(base))).toMatchObject({ ok: true, form: { stated: { speed: null, distance: null } } });
		expect(readUploadForm(form({ ...base, subjectSpeed: '7.5', subjectDistance: '12' }))).toMatchObject({ ok: true, form: { stated: { speed: 7.5, distance: 12 } } });
		expect(readUploadForm(form({ ...base, subjectSpeed: 'quick' }))).toMatchObject({ ok: false, message: expect.stringContaining("subject's speed") });
		expect(readUploadForm(form({ ...base, subjectDistance: '-3' }))).toMatchObject({ ok: false, message: expect.stringContaining("subject's distance") });
	});

	it('reads what flash was used, all optional, and refuses what cannot be a setting', () => {
		const read = readUploadForm(form({ ...base, flashGn: '60', flashPower: '1/4', flashDistance: '3,5' }));
		expect(read).toMatchObject({ ok: true, form: { flashUsed: { gn: 60, power: 0.25, distance: 3.5 } } });
		expect(readUploadForm(form({ ...base, flashGn: '', flashPower: ' ', flashDistance: '' }))).toMatchObject({ ok: true, form: { flashUsed: null } });
		expect(readUploadForm(form({ ...base, flashPower: '2' }))).toMatchObject({ ok: false, message: expect.stringContaining('fraction of full power') });
		expect(readUploadForm(form({ ...base, flashGn: 'lots' }))).toMatchObject({ ok: false, message: 'The guide number must be a number, or left empty.' });
	});
});
