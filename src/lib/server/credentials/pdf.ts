// The printable certificate: an A4 landscape PDF (pdf-lib, the app's own npm fonts) with a QR code to the public check.
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import fontkit from '@pdf-lib/fontkit';
import { PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import QRCode from 'qrcode';
import { subjectName, type OpenBadgeCredential } from './document';

// the fonts the pages ship with (npm packages), found from the project folder, in the built app as in tests
const fromProject = createRequire(join(process.cwd(), 'package.json'));
// (the static JetBrains Mono cuts in WOFF: fontkit's subsetter fails on the variable Inter WOFF2 the page text uses)
const FONT_FILES = {
	heading: '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-600-normal.woff',
	body: '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff'
};

let fonts: Promise<{ heading: Uint8Array; body: Uint8Array }> | null = null;
function fontBytes() {
	fonts ??= Promise.all([readFile(fromProject.resolve(FONT_FILES.heading)), readFile(fromProject.resolve(FONT_FILES.body))]).then(([heading, body]) => ({ heading, body }));
	return fonts;
}

const INK = rgb(0.13, 0.14, 0.16);
const MUTED = rgb(0.36, 0.38, 0.42);
// the app's two accents: tungsten amber (flash) and cobalt (ambient)
const AMBER = rgb(0.85, 0.55, 0.16);
const COBALT = rgb(0.16, 0.33, 0.72);

/** Lines of at most `width` points, broken between words. */
export function wrap(text: string, font: PDFFont, size: number, width: number): string[] {
	const lines: string[] = [];
	let line = '';
	for (const word of text.split(/\s+/).filter(Boolean)) {
		const next = line ? `${line} ${word}` : word;
		if (line && font.widthOfTextAtSize(next, size) > width) {
			lines.push(line);
			line = word;
		} else line = next;
	}
	if (line) lines.push(line);
	return lines;
}

/** The QR code as dark squares drawn by the PDF itself (vector: sharp at any print size). */
function drawQr(page: PDFPage, text: string, x: number, y: number, size: number): void {
	const qr = QRCode.create(text, { errorCorrectionLevel: 'M' });
	const n = qr.modules.size;
	const quiet = 2;
	const cell = size / (n + quiet * 2);
	page.drawRectangle({ x, y, width: size, height: size, color: rgb(1, 1, 1) });
	for (let r = 0; r < n; r++) {
		for (let c = 0; c < n; c++) {
			if (!qr.modules.get(r, c)) continue;
			page.drawRectangle({ x: x + (c + quiet) * cell, y: y + size - (r + quiet + 1) * cell, width: cell, height: cell, color: INK });
		}
	}
}

export async function certificatePdf(credential: OpenBadgeCredential, verifyUrl: string): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	doc.registerFontkit(fontkit);
	const bytes = await fontBytes();
	// the font's code ligatures (//, ->) off: a certificate is prose, and fontkit's subsetter fails on those glyphs
	const features = { calt: false, liga: false };
	const heading = await doc.embedFont(bytes.heading, { subset: true, features });
	const body = await doc.embedFont(bytes.body, { subset: true, features });
	const title = credential.credentialSubject.achievement.name;
	doc.setTitle(title);
	doc.setAuthor(credential.issuer.name);
	doc.setSubject(`Verify at ${verifyUrl}`);
	doc.setCreator('Stopwise');

	// A4 landscape in points
	const page = doc.addPage([841.89, 595.28]);
	const { width, height } = page.getSize();
	const margin = 56;
	page.drawRectangle({ x: 24, y: 24, width: width - 48, height: height - 48, borderColor: MUTED, borderWidth: 0.75 });
	page.drawRectangle({ x: margin, y: height - margin - 6, width: 120, height: 6, color: AMBER });
	page.drawRectangle({ x: margin + 120, y: height - margin - 6, width: 60, height: 6, color: COBALT });

	let y = height - margin - 48;
	page.drawText('Certificate of completion', { x: margin, y, size: 28, font: heading, color: INK });
	y -= 44;
	page.drawText('This certifies that', { x: margin, y, size: 13, font: body, color: MUTED });
	y -= 34;
	for (const line of wrap(subjectName(credential), heading, 24, width - margin * 2)) {
		page.drawText(line, { x: margin, y, size: 24, font: heading, color: INK });
		y -= 30;
	}
	page.drawText('completed the course', { x: margin, y, size: 13, font: body, color: MUTED });
	y -= 28;
	const courseTitle = title.replace(/^Certificate of completion: /, '');
	for (const line of wrap(courseTitle, body, 20, width - margin * 2 - 180)) {
		page.drawText(line, { x: margin, y, size: 20, font: body, color: INK });
		y -= 26;
	}
	y -= 8;
	for (const line of wrap(credential.credentialSubject.achievement.criteria.narrative, body, 10, width - margin * 2 - 200)) {
		page.drawText(line, { x: margin, y, size: 10, font: body, color: MUTED, lineHeight: 13 });
		y -= 13;
	}

	const issued = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' }).format(new Date(credential.validFrom));
	page.drawText(`Issued by ${credential.issuer.name} on ${issued}`, { x: margin, y: margin + 30, size: 12, font: body, color: INK });
	page.drawText(`Check it is genuine: ${verifyUrl}`, { x: margin, y: margin + 12, size: 8, font: body, color: MUTED });

	const qrSize = 120;
	drawQr(page, verifyUrl, width - margin - qrSize, margin, qrSize);
	return doc.save();
}
