import { degrees, PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { disarmPdf } from './disarm';
import { embedPlexFont, fitToFont, wrapText } from './fonts';
import { rewritePlain } from './qpdf';

export interface StampOptions {
	viewerName: string;
	at: Date;
	organisation?: string | null;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2 Dec 2026, 14:05 UTC": the same on every server, whatever its locale or zone. */
export function formatStampTime(at: Date): string {
	if (Number.isNaN(at.getTime())) throw new RangeError('The download time is not a valid date');
	const pad = (value: number) => String(value).padStart(2, '0');
	return `${at.getUTCDate()} ${MONTHS[at.getUTCMonth()]} ${at.getUTCFullYear()}, ${pad(at.getUTCHours())}:${pad(at.getUTCMinutes())} UTC`;
}

/** "Downloaded by Tess Almeida (Linden Row Studio) on 2 Dec 2026, 14:05 UTC — Seamwell". */
export function stampText({ viewerName, at, organisation }: StampOptions): string {
	const who = organisation ? `${viewerName.trim()} (${organisation.trim()})` : viewerName.trim();
	return `Downloaded by ${who} on ${formatStampTime(at)} — Seamwell`;
}

const MAX_SIZE = 7.5;
const MIN_SIZE = 5;
const INK = rgb(0.2, 0.24, 0.27);

/**
 * Draws the lines along the bottom edge of the page as the reader sees it. A page's /Rotate
 * turns its whole user space clockwise when shown, so for each rotation the origin moves to the
 * corner that ends up bottom left and the text turns the opposite way to read upright.
 */
function drawFooter(page: PDFPage, text: string, font: PDFFont): void {
	const box = page.getCropBox();
	const rotation = (((Math.round(page.getRotation().angle / 90) * 90) % 360) + 360) % 360;
	const sideways = rotation === 90 || rotation === 270;
	const shownWidth = sideways ? box.height : box.width;
	const margin = Math.min(18, shownWidth * 0.04);
	const maxWidth = shownWidth - 2 * margin;

	let size = MAX_SIZE;
	while (size > MIN_SIZE && font.widthOfTextAtSize(text, size) > maxWidth) size -= 0.25;
	const lines = wrapText(text, font, size, maxWidth);
	const lineHeight = size * 1.3;
	const padding = size * 0.45;
	const bandWidth = Math.max(...lines.map((line) => font.widthOfTextAtSize(line, size)));
	const bandHeight = lines.length * lineHeight;

	// Position along the shown bottom edge (u to the right, v up), mapped into user space.
	const toUser = (u: number, v: number): { x: number; y: number } => {
		const { x, y, width, height } = box;
		switch (rotation) {
			case 90:
				return { x: x + width - v, y: y + u };
			case 180:
				return { x: x + width - u, y: y + height - v };
			case 270:
				return { x: x + v, y: y + height - u };
			default:
				return { x: x + u, y: y + v };
		}
	};
	const rotate = degrees(rotation);
	const bottom = Math.min(margin, 12);

	// A pale band behind the text keeps it legible over dark or busy page content.
	const bandOrigin = toUser(margin - padding, bottom - padding);
	page.drawRectangle({
		...bandOrigin,
		width: bandWidth + 2 * padding,
		height: bandHeight + padding,
		rotate,
		color: rgb(1, 1, 1),
		opacity: 0.85
	});
	lines.forEach((line, index) => {
		const baseline = bottom + (lines.length - 1 - index) * lineHeight + size * 0.25;
		page.drawText(line, { ...toUser(margin, baseline), size, font, color: INK, rotate });
	});
}

/**
 * A copy of `original` for a reader: rewritten plainly by qpdf, disarmed (no action but
 * in-document navigation, no scripts, attachments or XFA — ./disarm.ts), with a line naming who
 * downloaded it and when at the foot of every page, in IBM Plex Sans. The input bytes are never
 * changed. The PDF must have passed `inspectPdf` (encrypted files cannot be rewritten).
 */
export async function stampPdf(original: Uint8Array, options: StampOptions): Promise<Uint8Array> {
	const doc = await PDFDocument.load(await rewritePlain(original), { updateMetadata: false });
	disarmPdf(doc);
	const regular = await embedPlexFont(doc, 'regular');
	const text = fitToFont(regular, stampText(options));
	for (const page of doc.getPages()) drawFooter(page, text, regular);
	return doc.save();
}
