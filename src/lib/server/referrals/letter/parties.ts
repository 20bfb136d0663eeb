import {
	COLOURS,
	CONTENT_WIDTH,
	LetterWriter,
	MARGIN_X,
	OUTCOME_STYLE,
	type ReferralLetterInput,
	formatLetterDate
} from './page';

export function drawHeader(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const { semibold } = w.fonts;
	w.text('Seamwell', MARGIN_X, w.y - 10, { font: semibold, size: 10, colour: COLOURS.tide });
	const ref = `Referral ${input.referralId}`;
	w.text(ref, MARGIN_X + CONTENT_WIDTH - w.width(ref, { size: 8 }), w.y - 10, {
		size: 8,
		colour: COLOURS.inkFaint
	});
	w.y -= 42;
	w.text('Referral letter', MARGIN_X, w.y, { font: semibold, size: 22 });
	w.y -= 18;
	const dates = input.sentAt
		? `Sent ${formatLetterDate(input.sentAt, tz)} · written ${formatLetterDate(input.createdAt, tz)}`
		: `Draft, written ${formatLetterDate(input.createdAt, tz)} — not yet sent`;
	w.text(`Pelvic-health physiotherapy · ${dates}`, MARGIN_X, w.y, {
		size: 9.5,
		colour: COLOURS.inkSoft
	});
	w.y -= 14;
	w.rule(w.y, COLOURS.tide, 1.2);
	w.y -= 6;
}

export function drawParties(w: LetterWriter, input: ReferralLetterInput): void {
	const gap = 18;
	const columnWidth = (CONTENT_WIDTH - 2 * gap) / 3;
	const { client, referrer, clinic } = input;
	const columns: Array<{ label: string; lines: string[] }> = [
		{
			label: 'Client',
			lines: [
				client.name,
				...(client.yearOfBirth ? [`Born ${client.yearOfBirth}`] : []),
				client.stage
			]
		},
		{ label: 'Referred by', lines: [referrer.name, referrer.studio] },
		{
			label: 'Referred to',
			lines: [
				clinic.name,
				clinic.physio ? `For ${clinic.physio}` : 'Any physiotherapist at the clinic'
			]
		}
	];
	const size = 10;
	const leading = 14;
	const laidOut = columns.map((column) => ({
		label: column.label,
		lines: column.lines.map((text, index) =>
			w.lines(text, columnWidth, { size, font: index === 0 ? w.fonts.semibold : w.fonts.regular })
		)
	}));
	const height =
		16 + Math.max(...laidOut.map((column) => column.lines.flat().length)) * leading + 8;
	w.ensure(height + 20);
	w.y -= 20;
	const top = w.y;
	laidOut.forEach((column, index) => {
		const x = MARGIN_X + index * (columnWidth + gap);
		w.label(column.label, x, top);
		let y = top - 16;
		column.lines.forEach((wrapped, lineIndex) => {
			for (const text of wrapped) {
				w.text(text, x, y, {
					size,
					font: lineIndex === 0 ? w.fonts.semibold : w.fonts.regular,
					colour: lineIndex === 0 ? COLOURS.ink : COLOURS.inkSoft
				});
				y -= leading;
			}
		});
	});
	w.y = top - height;
	w.rule(w.y + 4);
}

export function drawReason(w: LetterWriter, input: ReferralLetterInput): void {
	w.heading('Reason for referral');
	w.paragraph(input.reason, { size: 10 });

	w.ensure(22);
	w.y -= 16;
	w.text('Urgency:', MARGIN_X, w.y, { font: w.fonts.semibold, size: 10 });
	const urgency =
		input.urgency === 'soon'
			? { text: 'Soon — please offer an early appointment', colour: OUTCOME_STYLE.refer.colour }
			: { text: 'Routine', colour: COLOURS.ink };
	w.text(urgency.text, MARGIN_X + w.width('Urgency: ', { font: w.fonts.semibold }) + 2, w.y, {
		font: w.fonts.semibold,
		size: 10,
		colour: urgency.colour
	});
	w.y -= 6;

	w.heading('Red flags reported', 30);
	if (input.redFlags.length === 0) {
		w.paragraph('None reported at screening.', { colour: COLOURS.inkSoft });
		return;
	}
	for (const flag of input.redFlags) {
		const lines = w.lines(flag, CONTENT_WIDTH - 14);
		lines.forEach((text, index) => {
			w.ensure(15);
			w.y -= 14.5;
			if (index === 0) {
				w.page.drawRectangle({
					x: MARGIN_X + 2,
					y: w.y + 2,
					width: 4,
					height: 4,
					color: OUTCOME_STYLE.refer.colour
				});
			}
			w.text(text, MARGIN_X + 14, w.y);
		});
	}
	w.y -= 6;
}
