// The provenance note beside an undecided or failed background comparison: signs of a second save, never a pass.
import { describe, expect, it } from 'vitest';
import { readFrame, type Frame } from '../../analysis/index';
import { emptyExifReport } from '../../analysis/exif';
import { makeFrame, REFERENCE_EXIF } from '../../analysis/test-frames';
import { grade } from '../grade';
import { provenanceNote } from './provenance';

const frame = (exif: Partial<Frame['exif']>): Frame => ({
	file: { kind: 'jpeg', label: 'JPEG', bytes: 1 },
	exif: { ...emptyExifReport(), found: true, make: 'Example', model: 'One', ...exif },
	pixels: null,
	notes: []
});

// a camera writes the moment of capture into both DateTimeOriginal and DateTime (CIPA DC-008, tags 0x9003 and 0x0132)
const straight = { software: 'Firmware 1.0', dateTimeOriginal: '2024-06-01T10:00:00', modifyDate: '2024-06-01T10:00:00' };

describe('provenanceNote', () => {
	it('names a lit frame saved by another program, and later than it was taken', () => {
		const lit = frame({ ...straight, dateTimeOriginal: '2024-06-01T10:00:05', software: 'Example Editor 2', modifyDate: '2024-06-02T18:30:00' });
		const note = provenanceNote(frame(straight), lit, 'reference', 'lit');
		expect(note).toMatch(/Signs of editing/);
		expect(note).toMatch(/saved by “Example Editor 2” and the “reference” frame by “Firmware 1.0”/);
		expect(note).toMatch(/saved again after it was taken \(its DateTime 2024-06-02 18:30, its DateTimeOriginal 2024-06-01 10:00\)/);
	});

	it('names frames from different cameras', () => {
		expect(provenanceNote(frame(straight), frame({ ...straight, model: 'Two' }), 'reference', 'lit')).toMatch(/different cameras \(Example One and Example Two\)/);
	});

	it('says no sign was found only when both frames carry the tags, and that it is no proof', () => {
		expect(provenanceNote(frame(straight), frame(straight), 'reference', 'lit')).toMatch(/show no sign of editing.*no proof/);
		// older reports and stripped files carry no Software or DateTime: nothing to say
		expect(provenanceNote(frame({}), frame({ software: undefined, modifyDate: undefined }), 'reference', 'lit')).toBe('');
	});

	it('reads Software and DateTime from the file', async () => {
		const jpeg = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 }, exif: { ...REFERENCE_EXIF, software: 'Example Editor 2', modifyDate: '2024:06:02 18:30:00' } });
		const read = await readFrame(jpeg);
		expect(read.exif).toMatchObject({ software: 'Example Editor 2', modifyDate: '2024-06-02T18:30:00' });
	});

	it('adds the signs to a failed background comparison without changing its verdict', async () => {
		const ref = await readFrame(await makeFrame({ width: 300, height: 200, backgroundRamp: 3, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF, software: 'Firmware 1.0', modifyDate: '2024:06:01 10:00:00' } }));
		// the settings say 2 stops darker (1/500 → 1/2000 s), the pixels only 1.3: an edited frame, saved by an editor
		const lit = await readFrame(
			await makeFrame({
				width: 300,
				height: 200,
				backgroundRamp: 3,
				subject: { stops: 0 },
				background: { stops: 0.5 - 1.3 },
				exif: { ...REFERENCE_EXIF, exposureTime: 1 / 2000, software: 'Example Editor 2', modifyDate: '2024:06:02 18:30:00' }
			})
		);
		const result = grade({ frames: ['reference', 'lit'], criteria: [{ kind: 'background-drop', tolerance: 0.5 }] }, { reference: ref, lit }).criteria[0];
		expect(result.verdict).toBe('fail');
		expect(result.message).toMatch(/Signs of editing in the files: the “lit” frame was saved by “Example Editor 2”/);
	});
});
