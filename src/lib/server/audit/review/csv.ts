import { stringify } from 'csv-stringify/sync';

// CSV for the access-log export: RFC 4180 (csv-stringify quotes every field and doubles
// quotes inside), and no cell a spreadsheet would run as a formula (OWASP "CSV injection"):
// a cell starting with = + - @ tab or carriage return gets a leading apostrophe, which
// spreadsheets show as text and do not evaluate.

const FORMULA_START = /^[=+\-@\t\r]/;

export function neutralise(cell: string): string {
	return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

/** CSV text for `rows` (each a list of cells), CRLF line ends, every cell quoted. */
export function csvLines(rows: Array<Array<string | null>>): string {
	return stringify(
		rows.map((row) => row.map((cell) => neutralise(cell ?? ''))),
		{ quoted: true, quoted_empty: true, record_delimiter: 'windows' }
	);
}
