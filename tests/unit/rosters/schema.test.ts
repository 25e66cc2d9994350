// The shared roster schema: the demo data passes it, and its limits hold on both sides.
import { describe, expect, it } from 'vitest';
import { OVAL_BASES_MM, ROUND_BASES_MM, rosterPoints, rosterSchema, unitSchema } from '$lib/schemas/roster';
import { DEMO_FORCES } from '../../../seeds/data/demo';

const base = { name: 'U', class: 'foot', allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 1, points: 10 };

describe('roster schema', () => {
	it('every demo roster is valid', () => {
		for (const f of DEMO_FORCES) expect(rosterSchema.safeParse(f).error?.issues ?? []).toEqual([]);
	});

	it('the offered base sizes are all valid footprints (oval given length first)', () => {
		for (const d of ROUND_BASES_MM) expect(unitSchema.safeParse({ ...base, footprint: { shape: 'round', diameterMm: d } }).success).toBe(true);
		for (const [l, w] of OVAL_BASES_MM) expect(unitSchema.safeParse({ ...base, footprint: { shape: 'oval', lengthMm: l, widthMm: w } }).success).toBe(true);
	});

	it('an allowance of 0 in is allowed (a fixed emplacement), -0.01 in is not', () => {
		expect(unitSchema.safeParse({ ...base, allowanceIn: 0 }).success).toBe(true);
		expect(unitSchema.safeParse({ ...base, allowanceIn: -0.01 }).error?.issues[0].message).toBe('The move allowance cannot be negative');
	});

	it('fills flier and objective value defaults, and totals points with joined leaders', () => {
		const r = rosterSchema.parse({ name: ' Mine ', units: [{ ...base, points: 100, leader: { ...base, name: 'L', points: 45 } }, { ...base, name: 'V', points: 30 }] });
		expect(r.name).toBe('Mine');
		expect(r.force).toBe('');
		expect(r.units[0]).toMatchObject({ flies: false, value: 0 });
		expect(rosterPoints(r.units)).toBe(175);
	});

	it('unit names are unique regardless of case and spaces', () => {
		const r = rosterSchema.safeParse({ name: 'R', units: [base, { ...base, name: ' u ' }] });
		expect(r.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['units.1.name', 'Another unit is already called "u"']]);
	});

	it('a support ring needs both a radius above 0 and a label', () => {
		expect(unitSchema.safeParse({ ...base, ring: { radiusIn: 0, label: 'x' } }).error?.issues[0].message).toBe('The support ring radius must be more than 0 in');
		expect(unitSchema.safeParse({ ...base, ring: { radiusIn: 6, label: ' ' } }).error?.issues[0].message).toBe('The support ring needs a label');
	});
});
