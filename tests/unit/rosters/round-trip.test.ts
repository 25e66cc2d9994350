// Export then import gives the same roster, in both formats: for the demo rosters, and for
// random valid rosters (fast-check), names with commas, quotes and formula-like starts included.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseRosterFile } from '$lib/rosters/parse';
import { rosterToCsv, rosterToJson, exportFileName, TEMPLATE_ROSTER } from '$lib/rosters/export';
import { PIECE_CLASSES, rosterSchema, type Roster } from '$lib/schemas/roster';
import { DEMO_FORCES } from '../../../seeds/data/demo';

const bytes = (s: string) => new TextEncoder().encode(s);

function roundTrip(roster: Roster) {
	for (const text of [rosterToCsv(roster), rosterToJson(roster)]) {
		const back = parseRosterFile(bytes(text));
		expect(back.errors).toEqual([]);
		expect(back.units).toEqual(roster.units);
		expect(back.name).toBe(roster.name);
		expect(back.force ?? '').toBe(roster.force);
	}
}

const text = (max: number) =>
	fc
		.string({ minLength: 1, maxLength: max, unit: fc.constantFrom('a', 'Z', ' ', ',', '"', "'", '=', '+', '-', '@', '#', ';', 'é', '🜂') })
		.filter((s) => s.trim().length > 0);
const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const footprint = fc.oneof(
	fc.record({ shape: fc.constant('round' as const), diameterMm: num(1, 500) }),
	fc.tuple(num(1, 500), num(1, 500)).map(([a, b]) => ({ shape: 'oval' as const, lengthMm: Math.max(a, b), widthMm: Math.min(a, b) })),
	// A random star-shaped polygon around the reference point is always simple.
	fc.array(num(0.2, 10), { minLength: 3, maxLength: 12 }).map((radii) => ({
		shape: 'hull' as const,
		points: radii.map((r, i): [number, number] => [r * Math.cos((2 * Math.PI * i) / radii.length), r * Math.sin((2 * Math.PI * i) / radii.length)])
	}))
);
const profile = fc.record(
	{
		name: text(30),
		class: fc.constantFrom(...PIECE_CLASSES),
		flies: fc.boolean(),
		allowanceIn: num(0, 60),
		footprint,
		pieces: fc.integer({ min: 1, max: 100 }),
		value: fc.integer({ min: 0, max: 10 }),
		ring: fc.option(fc.record({ radiusIn: num(0.01, 36), label: text(20) }), { nil: undefined }),
		points: fc.integer({ min: 0, max: 10000 })
	},
	{ requiredKeys: ['name', 'class', 'flies', 'allowanceIn', 'footprint', 'pieces', 'value', 'points'] }
);
const unit = fc.tuple(profile, fc.option(profile, { nil: undefined })).map(([p, leader]) => (leader ? { ...p, leader } : p));
const roster = fc
	.record({ name: text(40), force: fc.oneof(fc.constant(''), text(40)), units: fc.uniqueArray(unit, { maxLength: 8, selector: (u) => u.name.trim().toLowerCase() }) })
	.map((r) => rosterSchema.safeParse(r))
	.filter((r) => r.success)
	.map((r) => r.data!);

describe('export → import round trip', () => {
	it('the demo rosters come back the same from CSV and JSON', () => {
		for (const f of DEMO_FORCES) roundTrip(rosterSchema.parse(f));
	});

	it('the template comes back the same', () => {
		roundTrip(rosterSchema.parse(TEMPLATE_ROSTER));
	});

	it('random valid rosters come back the same from CSV and JSON', () => {
		fc.assert(fc.property(roster, (r) => roundTrip(r)), { numRuns: 150 });
	});

	it('text cells that a spreadsheet would run as formulas are exported quoted with an apostrophe', () => {
		const r = rosterSchema.parse({ name: 'R', units: [{ ...TEMPLATE_ROSTER.units[1], name: '=SUM(A1)', ring: { radiusIn: 3, label: '@x' } }] });
		const csv = rosterToCsv(r);
		expect(csv).toContain("'=SUM(A1)");
		expect(csv).toContain("'@x");
		roundTrip(r);
	});

	it('download names are made of safe characters only', () => {
		expect(exportFileName('Copperline first muster', 'csv')).toBe('copperline-first-muster.csv');
		expect(exportFileName('../../etc/passwd', 'json')).toBe('etc-passwd.json');
		expect(exportFileName('🜂🜂', 'csv')).toBe('roster.csv');
	});
});
