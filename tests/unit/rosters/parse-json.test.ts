// The roster JSON reader: the example file, per-unit problems on the line each unit starts,
// and files that are not roster JSON.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseRosterFile, formatRowError } from '$lib/rosters/parse';
import { unitOffsets } from '$lib/rosters/parse-json';

const parse = (s: string) => parseRosterFile(new TextEncoder().encode(s));

describe('roster JSON', () => {
	it('reads the example file in docs/ whole, and it is the same roster as the example CSV', () => {
		const json = parseRosterFile(readFileSync('docs/roster-example.json'));
		const csv = parseRosterFile(readFileSync('docs/roster-example.csv'));
		expect(json.format).toBe('json');
		expect(json.errors).toEqual([]);
		expect(json.units).toEqual(csv.units);
		expect([json.name, json.force]).toEqual([csv.name, csv.force]);
	});

	it('finds where each unit starts, whatever strings and nesting come before', () => {
		const text = '{"name": "a [ { , } ]\\" x",\n "units": [\n  {"name": "A", "footprint": {"shape": "hull", "points": [[0,0],[1,0],[0,1]]}},\n  {"name": "B"}\n ],\n "force": ""}';
		expect(unitOffsets(text).map((o) => text.slice(o, o + 12))).toEqual(['{"name": "A"', '{"name": "B"']);
	});

	it('a bad unit is reported on the line it starts, with the path of the bad value', () => {
		const text = JSON.stringify(
			{
				format: 'inchwarden-roster',
				version: 1,
				name: 'Test',
				force: 'Test force',
				units: [
					{ name: 'Good', class: 'foot', allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 5, points: 50 },
					{ name: 'Bad', class: 'wizard', allowanceIn: -1, footprint: { shape: 'hull', points: [[0, 0], [1, 1]] }, pieces: 5, points: 50 },
					{ name: 'Shapeless', class: 'foot', allowanceIn: 6, footprint: { shape: 'square' }, pieces: 5, points: 50 }
				]
			},
			null,
			2
		);
		const r = parse(text);
		const badLine = text.split('\n').findIndex((l) => l.includes('"Bad"')) ; // name is one line below the "{"
		expect(r.errors.map(formatRowError)).toEqual([
			`Line ${badLine} (units[1].class): The class "wizard" is not one of foot, beast, swarm, mounted, vehicle, monster`,
			`Line ${badLine} (units[1].allowanceIn): The move allowance cannot be negative`,
			`Line ${badLine} (units[1].footprint.points): A hull needs at least 3 points (this one has 2)`,
			expect.stringMatching(/^Line \d+ \(units\[2\]\.footprint\.shape\): The footprint shape must be round, oval or hull$/)
		]);
		expect(r.units.map((u) => u.name)).toEqual(['Good']);
		expect([r.rows, r.goodRows]).toEqual([3, 1]);
	});

	it('a syntax error names its line', () => {
		const r = parse('{\n  "units": [\n    { "name": "A", }\n  ]\n}');
		expect(r.fatal).toBe(true);
		expect(r.errors[0].line).toBe(3);
		expect(r.errors[0].message).toMatch(/^The file is not valid JSON/);
	});

	it('JSON that is not a roster is refused as a whole', () => {
		expect(formatRowError(parse('[1, 2]').errors[0])).toMatch(/^Line 1: A roster JSON file is one object/);
		expect(formatRowError(parse('{"format": "board-layout", "units": []}').errors[0])).toBe('Line 1: "format" is "board-layout"; a roster file says "inchwarden-roster"');
		expect(formatRowError(parse('{"name": "x"}').errors[0])).toBe('Line 1: The roster has no "units" list');
		expect(formatRowError(parse('{"version": 2, "units": []}').errors[0])).toBe('Line 1: This is format version 2; only version 1 can be read');
	});
});
