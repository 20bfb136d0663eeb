import { createHash, randomUUID } from 'node:crypto';
import { PDFDocument, rgb } from 'pdf-lib';
import type { Transaction } from '../db';
import { documents } from '../db/schema';
import { embedPlexFont, fitToFont, wrapText } from '../documents/fonts';
import { documentKey } from '../documents/service';
import { putObject } from '../storage';

// Two invented assessment documents for the demo's accepted referral (Maya Okonjo): one the
// physiotherapist shares with the studio, with a summary for the instructor, and one kept in
// the clinic. Stored as an upload stores them: the object first, then its row.

const DEMO_DOCUMENTS = [
	{
		fileName: 'Assessment summary for the studio.pdf',
		share: 'studio' as const,
		summary:
			'Keep to breath work, side-lying and supported bridging for now. No jumping or running until her review in four weeks. She may stop any exercise that brings back heaviness.',
		title: 'Assessment summary (invented demo document)',
		lines: [
			'Client: Maya Okonjo. Assessed by Dr Ilse Marchetti, Fernbank Pelvic Health.',
			'Abdominal wall: narrow gap on the curl-up, good tension; no hernia found.',
			'Pelvic floor: symptoms on impact; a graded strength programme has begun.',
			'For the studio: low-load work is fine; no impact until the review.'
		]
	},
	{
		fileName: 'Pelvic floor assessment notes.pdf',
		share: 'clinic' as const,
		summary: null,
		title: 'Pelvic floor assessment notes (invented demo document)',
		lines: [
			'Clinic record only. Detailed findings and the treatment plan.',
			'Review booked in four weeks.'
		]
	}
];

async function renderDemoPdf(title: string, lines: readonly string[]): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	const regular = await embedPlexFont(doc, 'regular');
	const semibold = await embedPlexFont(doc, 'semibold');
	const page = doc.addPage([595.28, 841.89]);
	let y = 780;
	page.drawText(fitToFont(semibold, title), { x: 56, y, size: 16, font: semibold });
	y -= 32;
	for (const line of lines) {
		for (const part of wrapText(fitToFont(regular, line), regular, 11, 480)) {
			page.drawText(part, { x: 56, y, size: 11, font: regular, color: rgb(0.12, 0.16, 0.19) });
			y -= 17;
		}
		y -= 6;
	}
	doc.setTitle(title);
	return doc.save();
}

export async function seedDemoDocuments(
	tx: Transaction,
	referralId: string,
	physioId: string | null,
	uploadedAt: Date
): Promise<void> {
	for (const [index, demo] of DEMO_DOCUMENTS.entries()) {
		const bytes = await renderDemoPdf(demo.title, demo.lines);
		const id = randomUUID();
		const key = documentKey(referralId, id);
		await putObject(key, Buffer.from(bytes), 'application/pdf');
		await tx.insert(documents).values({
			id,
			referralId,
			storageKey: key,
			fileName: demo.fileName,
			share: demo.share,
			summary: demo.summary,
			sizeBytes: bytes.length,
			pages: 1,
			sha256: createHash('sha256').update(bytes).digest('hex'),
			uploadedBy: physioId,
			uploadedAt: new Date(uploadedAt.getTime() + index * 60_000)
		});
	}
}
