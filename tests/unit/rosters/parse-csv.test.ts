// The roster CSV parser: good files read whole, and each kind of bad row is reported with the
// line it is on and a sentence a player can act on. Sizes are invented test values.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseRosterFile, formatRowError } from '$lib/rosters/parse';
import { CSV_COLUMNS } from '$lib/rosters/csv-format';

const HEADER = CSV_COLUMNS.join(',');
const enc = (s: string) => new TextEncoder().encode(s);
const parse = (s: string) => parseRosterFile(enc(s));
/** A CSV with the header on line 1 and the given rows on lines 2, 3, … */
const csv = (...rows: string[]) => [HEADER, ...rows].join('\n') + '\n';

const ROUND = 'Pikes,,foot,no,6,round,32,,,,10,1,,,100';
const OVAL = 'Riders,,mounted,no,10,oval,,75,42,,3,1,,,90';
const HULL = 'Engine,,vehicle,no,10,hull,,,,-2.5 -1.5; 2.5 -1.5; 2.5 1.5; -2.5 1.5,1,0,6,Lanterns,160';

describe('reading a good roster CSV', () => {
	it('reads the example file in docs/ whole, leader joined to its unit', () => {
		const r = parseRosterFile(readFileSync('docs/roster-example.csv'));
		expect(r.errors).toEqual([]);
		expect(r.fatal).toBe(false);
		expect(r.name).toBe('Saltmarsh patrol');
		expect(r.force).toBe('The Saltmarsh Wardens');
		expect(r.rows).toBe(6);
		expect(r.units.map((u) => u.name)).toEqual(['Reedline Pikes', 'Heron Scouts', 'Marsh Striders', 'Tide Engine', 'Bog Wyrm']);
		const pikes = r.units[0];
		expect(pikes.leader?.name).toBe('Warden Hetta');
		expect(pikes.leader?.ring).toEqual({ radiusIn: 6, label: 'Hold the dyke' });
		expect(r.units[1].flies).toBe(true);
		expect(r.units[2].footprint).toEqual({ shape: 'oval', lengthMm: 75, widthMm: 42 });
		expect(r.units[3].footprint).toEqual({ shape: 'hull', points: [[-3, -1.75], [3, -1.75], [3.5, 0], [3, 1.75], [-3, 1.75]] });
		// A quoted cell keeps its comma.
		expect(r.units[3].ring?.label).toBe('Lanterns, lit');
	});

	it('reads one round, one oval and one hull unit with every value in place', () => {
		const r = parse(csv(ROUND, OVAL, HULL));
		expect(r.errors).toEqual([]);
		expect(r.units).toEqual([
			{ name: 'Pikes', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 10, value: 1, points: 100 },
			{ name: 'Riders', class: 'mounted', flies: false, allowanceIn: 10, footprint: { shape: 'oval', lengthMm: 75, widthMm: 42 }, pieces: 3, value: 1, points: 90 },
			{ name: 'Engine', class: 'vehicle', flies: false, allowanceIn: 10, footprint: { shape: 'hull', points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] }, pieces: 1, value: 0, ring: { radiusIn: 6, label: 'Lanterns' }, points: 160 }
		]);
	});

	it('accepts headers in any order and case, Windows line ends and a byte-order mark', () => {
		const text = '\uFEFFPoints,Name,Class,Allowance In,Shape,Diameter_mm,Pieces\r\n40,Scouts,Swarm,7.5,round,25,4\r\n';
		const r = parse(text);
		expect(r.errors).toEqual([]);
		expect(r.units[0]).toMatchObject({ name: 'Scouts', class: 'swarm', allowanceIn: 7.5, pieces: 4, points: 40, value: 0, flies: false });
	});
});

describe('reporting bad rows by line', () => {
	it('a wrong class names its line and the classes allowed', () => {
		const r = parse(csv(ROUND, 'Wizards,,wizard,no,6,round,32,,,,5,1,,,50'));
		expect(r.errors).toHaveLength(1);
		expect(r.errors[0]).toMatchObject({ line: 3, field: 'class', unit: 'Wizards' });
		expect(formatRowError(r.errors[0])).toBe('Line 3 (class): The class "wizard" is not one of foot, beast, swarm, mounted, vehicle, monster');
		// The good row is still offered.
		expect(r.units.map((u) => u.name)).toEqual(['Pikes']);
		expect(r.goodRows).toBe(1);
		expect(r.rows).toBe(2);
	});

	it('a negative allowance names its line', () => {
		const r = parse(csv('Backwards,,foot,no,-2,round,32,,,,5,1,,,50', ROUND));
		expect(r.errors.map(formatRowError)).toEqual(['Line 2 (allowance_in): The move allowance cannot be negative']);
		expect(r.units.map((u) => u.name)).toEqual(['Pikes']);
	});

	it('a round base without its diameter names its line', () => {
		const r = parse(csv(ROUND, OVAL, 'Baseless,,foot,no,6,round,,,,,5,1,,,50'));
		expect(r.errors.map(formatRowError)).toEqual(['Line 4 (diameter_mm): The round base diameter is missing']);
	});

	it('an unknown shape names its line and the shapes allowed', () => {
		const r = parse(csv('Squares,,foot,no,6,square,32,,,,5,1,,,50'));
		expect(r.errors.map(formatRowError)).toEqual(['Line 2 (shape): The footprint shape "square" is not round, oval or hull']);
		expect(r.units).toEqual([]);
	});

	it('a hull with fewer than 3 points names its line and the count', () => {
		const r = parse(csv(ROUND, 'Plank,,vehicle,no,8,hull,,,,0 0; 3 0,1,0,,,80'));
		expect(r.errors.map(formatRowError)).toEqual(['Line 3 (hull_in): A hull needs at least 3 points (this one has 2)']);
	});

	it('a hull that crosses itself, or whose points cannot be read, is refused', () => {
		const r = parse(csv('Bowtie,,vehicle,no,8,hull,,,,0 0; 2 2; 2 0; 0 2,1,0,,,80', 'Smudge,,vehicle,no,8,hull,,,,0 0; 2 x; 2 2,1,0,,,80'));
		expect(r.errors.map(formatRowError)).toEqual([
			'Line 2 (hull_in): The hull outline crosses itself (edges 1 and 3 meet)',
			'Line 3 (hull_in): Hull point 2 ("2 x") is not two numbers "x y" in inches'
		]);
	});

	it('counts lines as a text editor does: preamble, blank lines and line breaks inside quotes', () => {
		const text = ['# name: Test', '', HEADER, 'Pikes,,foot,no,6,round,32,,,,10,1,4,"Two', 'lines",100', '', 'Bad,,foot,no,six,round,32,,,,10,1,,,100'].join('\n');
		const r = parse(text);
		// The two-line cell is refused too (labels are one line), which shows where its row starts.
		expect(r.errors.map(formatRowError)).toEqual([
			'Line 4 (ring_label): The support ring label must fit on one line',
			'Line 7 (allowance_in): "six" is not a number'
		]);
	});

	it('lists every problem of a row, and of every row', () => {
		const r = parse(csv('Mess,,robot,maybe,-1,round,0,,,,0,1,,,-5', 'Also bad,,foot,no,6,oval,,40,60,,1,1,,,10'));
		expect(r.errors.map(formatRowError)).toEqual([
			'Line 2 (flies): "maybe" is not yes or no',
			'Line 2 (class): The class "robot" is not one of foot, beast, swarm, mounted, vehicle, monster',
			'Line 2 (allowance_in): The move allowance cannot be negative',
			'Line 2 (diameter_mm): The round base diameter must be more than 0 mm',
			'Line 2 (pieces): A unit needs at least 1 piece',
			'Line 2 (points): The points cost cannot be negative',
			'Line 3 (width_mm): An oval base is given length first: its width may not exceed its length'
		]);
		expect(r.units).toEqual([]);
	});

	it('a size written in another shape\'s column is reported, not guessed at', () => {
		const r = parse(csv('Mixed,,foot,no,6,round,32,60,35,,1,1,,,10'));
		expect(r.errors.map(formatRowError)).toEqual([
			'Line 2 (length_mm): length_mm is for oval footprints; leave it empty for a round one',
			'Line 2 (width_mm): width_mm is for oval footprints; leave it empty for a round one'
		]);
	});

	it('a leader must join a unit that exists and is good, one leader per unit', () => {
		const r = parse(
			csv(
				ROUND,
				'Captain,Pikes,foot,no,6,round,40,,,,1,1,,,40',
				'Second captain,Pikes,foot,no,6,round,40,,,,1,1,,,40',
				'Lost captain,Nobody,foot,no,6,round,40,,,,1,1,,,40',
				'Broken,,foot,no,6,round,,,,,1,1,,,40',
				'Broken captain,Broken,foot,no,6,round,40,,,,1,1,,,40'
			)
		);
		expect(r.errors.map(formatRowError)).toEqual([
			'Line 4 (joins): "Pikes" already has a joined leader (line 3); a unit takes one',
			'Line 5 (joins): joins "Nobody", but no unit row has that name',
			'Line 6 (diameter_mm): The round base diameter is missing',
			'Line 7 (joins): joins "Broken" (line 6), which has problems of its own'
		]);
		expect(r.units).toHaveLength(1);
		expect(r.units[0].leader?.name).toBe('Captain');
	});

	it('two units may not share a name', () => {
		const r = parse(csv(ROUND, ROUND.replace('Pikes', 'PIKES')));
		expect(r.errors.map(formatRowError)).toEqual(['Line 3 (name): Line 2 already has a unit called "PIKES"']);
	});

	it('a row with more cells than the header says so', () => {
		const r = parse(csv(ROUND + ',extra'));
		expect(r.errors.map(formatRowError)).toEqual(['Line 2: This row has 16 cells but the header has 15 columns (a comma inside a cell needs "quotes")']);
	});

	it('an unclosed quote is reported on the line it opens', () => {
		const r = parse(csv(ROUND, 'Open,,foot,no,6,round,32,,,,1,1,6,"never closed,10'));
		expect(r.errors[0]).toMatchObject({ line: 3 });
		expect(r.errors[0].message).toMatch(/never closed/);
		expect(r.units.map((u) => u.name)).toEqual(['Pikes']);
	});
});

describe('files that are not a roster CSV', () => {
	it('a PNG picture is refused as binary, on its first line', () => {
		const png = Uint8Array.from(Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex'));
		const r = parseRosterFile(png);
		expect(r.fatal).toBe(true);
		expect(r.units).toEqual([]);
		expect(formatRowError(r.errors[0])).toBe(
			'Line 1: The file is not UTF-8 text: it is binary data or another encoding. Save the roster as CSV (UTF-8) or JSON'
		);
	});

	it('prose is refused as not a roster CSV, naming the header line', () => {
		const r = parse('Dear organiser,\nhere is my list for Saturday.\n');
		expect(r.fatal).toBe(true);
		expect(formatRowError(r.errors[0])).toMatch(/^Line 1: This is not a roster CSV: the first row must be a header naming the columns name, class, allowance_in, shape, pieces, points/);
	});

	it('text with NUL bytes is refused as binary, naming the line', () => {
		const r = parse('name,class\nabc\u0000def\n');
		expect(r.fatal).toBe(true);
		expect(formatRowError(r.errors[0])).toBe('Line 2: The file holds binary data (a NUL byte), not CSV or JSON text');
	});

	it('a header with a misspelt or missing column is refused before any row is read', () => {
		const r = parse('name,class,alowance_in,shape,pieces,points\nPikes,foot,6,round,10,100\n');
		expect(r.fatal).toBe(true);
		expect(formatRowError(r.errors[0])).toBe(
			`Line 1: The header row is wrong: the header lacks the column allowance_in; unknown column "alowance_in". The columns are ${CSV_COLUMNS.join(', ')}`
		);
	});

	it('an empty file is refused; a header without rows is an empty roster (what an empty roster exports)', () => {
		expect(formatRowError(parseRosterFile(new Uint8Array()).errors[0])).toBe('Line 1: The file is empty');
		expect(parse(HEADER + '\n')).toMatchObject({ fatal: false, errors: [], units: [], rows: 0 });
	});
});
