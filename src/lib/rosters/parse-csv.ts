// Reads a roster CSV (format in docs/rosters.md) with papaparse: every row is checked on its
// own against the shared unit schema, and every problem is reported with its file line.
import Papa from 'papaparse';
import { profileSchema, ROSTER_LIMITS, type Profile, type Unit } from '$lib/schemas/roster';
import { parseHullPoints } from './footprint';
import { CSV_COLUMNS, REQUIRED_COLUMNS, columnForPath, unescapeCell, type CsvColumn } from './csv-format';
import { fatalResult, type ParseResult, type RowError } from './import-result';

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;
const NEWLINES = /\r\n|\r|\n/g;
const YES = new Set(['yes', 'y', 'true', '1']);
const NO = new Set(['', 'no', 'n', 'false', '0']);

const SHAPE_CELLS: Record<'round' | 'oval' | 'hull', CsvColumn[]> = {
	round: ['diameter_mm'],
	oval: ['length_mm', 'width_mm'],
	hull: ['hull_in']
};

interface Row {
	line: number;
	name: string;
	joins: string;
	errors: RowError[];
	profile?: Profile;
}

/** Header cells as written by people: "Allowance in" and "ALLOWANCE_IN" both mean allowance_in. */
const normaliseHeader = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, '_');

function readPreamble(text: string): { body: string; skippedLines: number; name?: string; force?: string } {
	let offset = 0;
	let skippedLines = 0;
	let name: string | undefined;
	let force: string | undefined;
	while (offset < text.length) {
		const m = /\r\n|\r|\n/.exec(text.slice(offset));
		const end = m ? offset + m.index : text.length;
		const line = text.slice(offset, end).trim();
		if (line !== '' && !line.startsWith('#')) break;
		const meta = /^#\s*(name|force)\s*:(.*)$/i.exec(line);
		if (meta) {
			if (meta[1].toLowerCase() === 'name') name = meta[2].trim();
			else force = meta[2].trim();
		}
		skippedLines++;
		offset = m ? end + m[0].length : text.length;
	}
	return { body: text.slice(offset), skippedLines, name, force };
}

function rowToProfile(cells: Partial<Record<CsvColumn, string>>, line: number): { profile?: Profile; errors: RowError[] } {
	const errors: RowError[] = [];
	const cell = (c: CsvColumn) => (cells[c] ?? '').trim();
	const fail = (field: CsvColumn, message: string) => errors.push({ line, field, message });

	const num = (c: CsvColumn): number | undefined => {
		const raw = cell(c);
		if (raw === '') return undefined;
		if (!NUMBER.test(raw)) {
			fail(c, `"${raw}" is not a number`);
			return undefined;
		}
		return Number(raw);
	};

	const fliesRaw = cell('flies').toLowerCase();
	let flies = false;
	if (YES.has(fliesRaw)) flies = true;
	else if (!NO.has(fliesRaw)) fail('flies', `"${cell('flies')}" is not yes or no`);

	const shape = cell('shape').toLowerCase();
	let footprint: unknown;
	if (shape === 'round') footprint = { shape, diameterMm: num('diameter_mm') };
	else if (shape === 'oval') footprint = { shape, lengthMm: num('length_mm'), widthMm: num('width_mm') };
	else if (shape === 'hull') {
		const parsed = parseHullPoints(cell('hull_in'));
		if (parsed.ok) footprint = { shape, points: parsed.points };
		else fail('hull_in', parsed.message);
	} else if (shape === '') fail('shape', 'The footprint shape is missing: write round, oval or hull');
	else fail('shape', `The footprint shape "${cell('shape')}" is not round, oval or hull`);

	// A size in another shape's column is almost always a mistyped shape: say so, do not guess.
	if (shape in SHAPE_CELLS) {
		for (const [other, columns] of Object.entries(SHAPE_CELLS)) {
			if (other === shape) continue;
			for (const c of columns) {
				if (cell(c) !== '') fail(c, `${c} is for ${other} footprints; leave it empty for ${shape === 'oval' ? 'an' : 'a'} ${shape} one`);
			}
		}
	}

	const ringRadius = num('ring_radius_in');
	const ringLabel = unescapeCell(cell('ring_label'));
	const ring = ringRadius === undefined && ringLabel === '' && cell('ring_radius_in') === '' ? undefined : { radiusIn: ringRadius, label: ringLabel };

	const candidate = {
		name: unescapeCell(cell('name')),
		class: cell('class').toLowerCase() || undefined,
		flies,
		allowanceIn: num('allowance_in'),
		footprint,
		pieces: num('pieces'),
		value: cell('value') === '' ? 0 : num('value'),
		ring,
		points: num('points')
	};
	const parsed = profileSchema.safeParse(candidate);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const field = columnForPath(issue.path);
			// A cell that was not a number has been reported already; zod would only repeat it.
			if (field && errors.some((e) => e.field === field)) continue;
			// An unreadable footprint is reported by its shape or hull cell above.
			if (footprint === undefined && field === 'shape') continue;
			errors.push({ line, field, message: issue.message });
		}
	}
	return errors.length === 0 && parsed.success ? { profile: parsed.data, errors } : { errors };
}

export function parseRosterCsv(text: string): ParseResult {
	const { body, skippedLines, name, force } = readPreamble(text);
	if (body.trim() === '') {
		return fatalResult('csv', skippedLines + 1, 'The file has no header row and no units: it is not a roster CSV');
	}
	const parsed = Papa.parse<string[]>(body, { delimiter: ',', header: false, skipEmptyLines: false });

	// Physical line of each parsed row: quoted cells may hold line breaks, so count them.
	const lines: number[] = [];
	let line = skippedLines + 1;
	for (const row of parsed.data) {
		lines.push(line);
		line += 1 + row.reduce((n, c) => n + (c.match(NEWLINES)?.length ?? 0), 0);
	}

	const headerLine = lines[0];
	const header = (parsed.data[0] ?? []).map(normaliseHeader);
	const unknown = header.filter((h) => h !== '' && !(CSV_COLUMNS as readonly string[]).includes(h));
	const missingCols = REQUIRED_COLUMNS.filter((c) => !header.includes(c));
	if (missingCols.length === REQUIRED_COLUMNS.length) {
		return fatalResult(
			'csv',
			headerLine,
			`This is not a roster CSV: the first row must be a header naming the columns ${REQUIRED_COLUMNS.join(', ')} (and any of the others in docs/rosters.md)`
		);
	}
	const headerErrors: string[] = [];
	if (missingCols.length > 0) headerErrors.push(`the header lacks the column${missingCols.length > 1 ? 's' : ''} ${missingCols.join(', ')}`);
	if (unknown.length > 0) headerErrors.push(`unknown column${unknown.length > 1 ? 's' : ''} ${unknown.map((u) => `"${u}"`).join(', ')}`);
	const dupes = header.filter((h, i) => h !== '' && header.indexOf(h) !== i);
	if (dupes.length > 0) headerErrors.push(`the column ${dupes[0]} appears twice`);
	if (header.some((h) => h === '')) headerErrors.push('a header cell is empty');
	if (headerErrors.length > 0) {
		return fatalResult('csv', headerLine, `The header row is wrong: ${headerErrors.join('; ')}. The columns are ${CSV_COLUMNS.join(', ')}`);
	}

	const quoteErrors = new Map<number, string>();
	for (const e of parsed.errors) {
		if (e.type === 'Delimiter' || e.row === undefined) continue;
		quoteErrors.set(e.row, e.code === 'MissingQuotes' ? 'A quoted cell is never closed' : `The quoting is broken (${e.message})`);
	}

	const rows: Row[] = [];
	for (let r = 1; r < parsed.data.length; r++) {
		const cellsArr = parsed.data[r];
		if (cellsArr.every((c) => c.trim() === '')) continue; // blank lines, the trailing newline
		const rowLine = lines[r];
		const cells: Partial<Record<CsvColumn, string>> = {};
		header.forEach((h, i) => (cells[h as CsvColumn] = cellsArr[i] ?? ''));
		const nameCell = unescapeCell((cells.name ?? '').trim());
		const row: Row = { line: rowLine, name: nameCell, joins: unescapeCell((cells.joins ?? '').trim()), errors: [] };
		if (quoteErrors.has(r)) row.errors.push({ line: rowLine, message: quoteErrors.get(r)! });
		if (cellsArr.length > header.length) {
			row.errors.push({ line: rowLine, message: `This row has ${cellsArr.length} cells but the header has ${header.length} columns (a comma inside a cell needs "quotes")` });
		}
		if (row.errors.length === 0) {
			const { profile, errors } = rowToProfile(cells, rowLine);
			row.profile = profile;
			row.errors.push(...errors);
		}
		for (const e of row.errors) if (nameCell) e.unit = nameCell;
		rows.push(row);
	}

	// Units first (in file order), then each leader onto the unit it joins.
	const same = (a: string, b: string) => a.toLowerCase() === b.toLowerCase();
	const unitRows = rows.filter((r) => r.joins === '');
	const kept: { row: Row; unit: Unit; leaderRow?: Row }[] = [];
	for (const row of unitRows) {
		const earlier = unitRows.find((o) => o !== row && o.line < row.line && same(o.name, row.name) && o.name !== '');
		if (earlier) row.errors.push({ line: row.line, field: 'name', unit: row.name, message: `Line ${earlier.line} already has a unit called "${row.name}"` });
		if (row.errors.length === 0 && row.profile) {
			if (kept.length >= ROSTER_LIMITS.units) {
				row.errors.push({ line: row.line, unit: row.name, message: `A roster may have at most ${ROSTER_LIMITS.units} units` });
			} else kept.push({ row, unit: { ...row.profile } });
		}
	}
	for (const row of rows.filter((r) => r.joins !== '')) {
		const target = unitRows.find((u) => same(u.name, row.joins));
		const fail = (message: string) => row.errors.push({ line: row.line, field: 'joins', unit: row.name, message });
		if (!target) fail(`joins "${row.joins}", but no unit row has that name`);
		else {
			const home = kept.find((k) => k.row === target);
			if (!home) fail(`joins "${row.joins}" (line ${target.line}), which has problems of its own`);
			else if (home.leaderRow) fail(`"${row.joins}" already has a joined leader (line ${home.leaderRow.line}); a unit takes one`);
			else if (row.errors.length === 0 && row.profile) {
				home.leaderRow = row;
				home.unit.leader = row.profile;
			}
		}
	}

	const errors = rows.flatMap((r) => r.errors).sort((a, b) => a.line - b.line);
	return {
		format: 'csv',
		name: name || undefined,
		force: force || undefined,
		units: kept.map((k) => k.unit),
		errors,
		rows: rows.length,
		goodRows: rows.filter((r) => r.errors.length === 0).length,
		fatal: false
	};
}
