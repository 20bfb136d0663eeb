import { sortByTime, SITES, siteLabelCapitalised } from '$lib/domain';
import {
	COLOURS,
	CONTENT_WIDTH,
	LetterWriter,
	MARGIN_X,
	OUTCOME_STYLE,
	type ReferralLetterInput,
	findingsOf,
	formatFingers,
	formatLetterDate
} from './page';

interface Column {
	title: string;
	width: number;
}

export function drawScreeningTable(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const screenings = sortByTime(input.screenings);
	const siteWidth = 104;
	const dateWidth = 84;
	const columns: Column[] = [
		{ title: 'Date', width: dateWidth },
		...SITES.map((site) => ({ title: siteLabelCapitalised(site), width: siteWidth })),
		{ title: 'Outcome', width: CONTENT_WIDTH - dateWidth - 3 * siteWidth }
	];
	const xs = columns.map((_, index) =>
		columns.slice(0, index).reduce((sum, column) => sum + column.width, MARGIN_X)
	);
	const pad = 6;
	const headerHeight = 30;

	const drawHead = () => {
		w.y -= headerHeight;
		w.page.drawRectangle({
			x: MARGIN_X,
			y: w.y,
			width: CONTENT_WIDTH,
			height: headerHeight,
			color: COLOURS.sand100
		});
		columns.forEach((column, index) => {
			const x = (xs[index] ?? MARGIN_X) + pad;
			w.text(column.title, x, w.y + 17, { font: w.fonts.semibold, size: 8.5 });
			if (index >= 1 && index <= 3) {
				w.text('finger widths', x, w.y + 7, { size: 7, colour: COLOURS.inkFaint });
			}
		});
	};

	w.ensure(headerHeight + 24);
	drawHead();

	screenings.forEach((screening, rowIndex) => {
		const cells = SITES.map((site) => {
			const measure = screening.sites[site];
			if (measure === undefined) return { main: '—', note: '' };
			const mm =
				measure.widthMm !== undefined && measure.widthMm !== null
					? ` (${Math.round(measure.widthMm)} mm)`
					: '';
			return { main: `${formatFingers(measure.widthFingers)}${mm}`, note: findingsOf(measure) };
		});
		const noteLines = cells.map((cell) =>
			cell.note ? w.lines(cell.note, siteWidth - 2 * pad, { size: 7.5 }) : []
		);
		const rowHeight = 18 + Math.max(0, ...noteLines.map((lines) => lines.length)) * 10;
		if (w.ensure(rowHeight)) {
			w.y -= 4;
			w.text('Screening history (continued)', MARGIN_X, w.y - 10, {
				font: w.fonts.semibold,
				size: 10,
				colour: COLOURS.tide
			});
			w.y -= 20;
			drawHead();
		}
		w.y -= rowHeight;
		if (rowIndex % 2 === 1) {
			w.page.drawRectangle({
				x: MARGIN_X,
				y: w.y,
				width: CONTENT_WIDTH,
				height: rowHeight,
				color: COLOURS.sand50
			});
		}
		const baseline = w.y + rowHeight - 12.5;
		w.text(formatLetterDate(screening.takenAt, tz), MARGIN_X + pad, baseline, { size: 9 });
		cells.forEach((cell, index) => {
			const x = (xs[index + 1] ?? MARGIN_X) + pad;
			w.text(cell.main, x, baseline, { size: 9 });
			(noteLines[index] ?? []).forEach((text, lineIndex) => {
				w.text(text, x, baseline - 10 * (lineIndex + 1), { size: 7.5, colour: COLOURS.inkSoft });
			});
		});
		const outcome = OUTCOME_STYLE[screening.outcome];
		w.text(outcome.label, (xs[4] ?? MARGIN_X) + pad, baseline, {
			font: w.fonts.semibold,
			size: 9,
			colour: outcome.colour
		});
		w.page.drawLine({
			start: { x: MARGIN_X, y: w.y },
			end: { x: MARGIN_X + CONTENT_WIDTH, y: w.y },
			thickness: 0.4,
			color: COLOURS.sand200
		});
	});
	w.y -= 8;
}
