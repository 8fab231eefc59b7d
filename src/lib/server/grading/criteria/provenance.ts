// What the two frames' Exif says about where they came from, for the mentor who compares them when the pixels cannot.
//
// A camera writes its firmware into Software (TIFF tag 0x0131) and the moment of capture into both DateTimeOriginal
// and DateTime (0x0132); a program that saves the file again usually writes its own name into Software and the time
// of saving into DateTime (CIPA DC-008; the usual behaviour of editors is common practice, no published source).
// So a lit frame whose Software differs from its reference's, or whose DateTime is later than its DateTimeOriginal,
// was most likely saved again by another program. The other way round proves nothing: an editor can keep every tag,
// and many files carry none. That is why this is only a note beside an undecided or failed verdict, never a reason
// to pass one (pair/comparametric.ts says why the pixels cannot rule out an edit under an unknown picture style).
import type { Frame } from '../../analysis/index';
import { capitalise, frameWords } from '../result';

/** 'YYYY-MM-DDTHH:MM:SS' → 'YYYY-MM-DD HH:MM' for a sentence. */
const when = (date: string) => date.slice(0, 16).replace('T', ' ');

/** Signs in one frame that it was saved again after it was taken; '' when none. */
function savedLater(frame: Frame, name: string): string {
	const saved = frame.exif.modifyDate ?? null;
	const taken = frame.exif.dateTimeOriginal;
	// both local camera times: the offset (when any) is the same clock's
	return saved && taken && saved.slice(0, 19) > taken.slice(0, 19)
		? `${frameWords(name)} was saved again after it was taken (its DateTime ${when(saved)}, its DateTimeOriginal ${when(taken)})`
		: '';
}

/**
 * A sentence about the frames' provenance for an undecided or failed comparison: the signs of editing found, or,
 * when both carry the tags and show none, that they show none (and why that is no proof); '' when the tags are absent.
 */
export function provenanceNote(ref: Frame, lit: Frame, refName: string, litName: string): string {
	const signs: string[] = [];
	const [a, b] = [ref.exif, lit.exif];
	const refSoftware = a.software ?? null;
	const litSoftware = b.software ?? null;
	if (refSoftware && litSoftware && refSoftware !== litSoftware) {
		signs.push(`${frameWords(litName)} was saved by “${litSoftware}” and ${frameWords(refName)} by “${refSoftware}” (their Software tags)`);
	}
	for (const [frame, name] of [[lit, litName], [ref, refName]] as const) {
		const sign = savedLater(frame, name);
		if (sign) signs.push(sign);
	}
	if (a.make && b.make && (a.make !== b.make || a.model !== b.model)) {
		signs.push(`the frames name different cameras (${[a.make, a.model].filter(Boolean).join(' ')} and ${[b.make, b.model].filter(Boolean).join(' ')})`);
	}
	if (signs.length) return ` Signs of editing in the files: ${signs.join('; ')}.`;
	const clean = (e: Frame['exif']) => Boolean(e.software && e.modifyDate && e.dateTimeOriginal && e.modifyDate.slice(0, 19) === e.dateTimeOriginal.slice(0, 19));
	if (clean(a) && clean(b) && a.make && b.make) {
		return ` ${capitalise(frameWords(refName))} and ${frameWords(litName)} show no sign of editing in their Exif (the same camera and Software, each saved when it was taken), which the mentor may weigh; an editor can keep these tags, so it is no proof.`;
	}
	return '';
}
