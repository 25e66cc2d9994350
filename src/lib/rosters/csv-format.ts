// The roster CSV format (docs/rosters.md): one row per unit and one per joined leader, the
// columns below, an optional "# name:" / "# force:" preamble. Shared by parser and exporter.

export const CSV_COLUMNS = [
	'name',
	'joins',
	'class',
	'flies',
	'allowance_in',
	'shape',
	'diameter_mm',
	'length_mm',
	'width_mm',
	'hull_in',
	'pieces',
	'value',
	'ring_radius_in',
	'ring_label',
	'points'
] as const;
export type CsvColumn = (typeof CSV_COLUMNS)[number];

/** Without these a row cannot describe a unit; the others may be left out of the header. */
export const REQUIRED_COLUMNS: readonly CsvColumn[] = ['name', 'class', 'allowance_in', 'shape', 'pieces', 'points'];

export const CSV_FIRST_LINE = '# Inchwarden roster, format 1';

/** Where a schema path lands in the CSV, so a message names the column the player sees. */
export function columnForPath(path: readonly PropertyKey[]): CsvColumn | undefined {
	const [a, b] = path.map(String);
	if (a === 'allowanceIn') return 'allowance_in';
	if (a === 'footprint') {
		if (b === 'diameterMm') return 'diameter_mm';
		if (b === 'lengthMm') return 'length_mm';
		if (b === 'widthMm') return 'width_mm';
		if (b === 'points') return 'hull_in';
		return 'shape';
	}
	if (a === 'ring') return b === 'label' ? 'ring_label' : 'ring_radius_in';
	if ((CSV_COLUMNS as readonly string[]).includes(a)) return a as CsvColumn;
	return undefined;
}

// Spreadsheets run a cell that starts with one of these as a formula. Exported text cells get
// a leading apostrophe (which spreadsheets hide) and the parser takes exactly one off again.
const FORMULA_START = /^'*[=+\-@\t\r]/;
export const escapeCell = (text: string): string => (FORMULA_START.test(text) ? `'${text}` : text);
export const unescapeCell = (text: string): string =>
	text.startsWith("'") && FORMULA_START.test(text) ? text.slice(1) : text;
