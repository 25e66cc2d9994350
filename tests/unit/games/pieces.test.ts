// A roster's units expand into game pieces with stable ids and the unit's profile on each.
import { describe, expect, it } from 'vitest';
import { enginePieces, expandRoster, unitsOf } from '$lib/board/play/pieces';
import { UNITS_A, UNITS_B } from './fixtures';

describe('piece expansion from a roster', () => {
	it('gives every figure its own piece, numbered per unit: a-u1-p1 … a-u2-p1', () => {
		const pieces = expandRoster('a', UNITS_A);
		expect(pieces.map((p) => p.id)).toEqual(['a-u1-p1', 'a-u1-p2', 'a-u1-p3', 'a-u2-p1']);
		expect(pieces.every((p) => p.side === 'a' && p.at === null)).toBe(true);
		expect(pieces[0]).toMatchObject({ unit: 'a-u1', unitName: 'Lantern Guard', class: 'foot', flies: false, allowance: 6, value: 1, footprint: { shape: 'round', diameterMm: 32 } });
		expect(pieces[0].ring).toBeUndefined();
	});

	it('copies a support ring (radius in inches) and the objective value', () => {
		const [crew] = expandRoster('a', UNITS_A).filter((p) => p.unit === 'a-u2');
		expect(crew.ring).toEqual({ radius: 6, label: 'Steady' });
		expect(crew.value).toBe(1);
	});

	it("puts a joined leader's pieces in its unit, with the leader's own profile", () => {
		const pieces = expandRoster('b', UNITS_B);
		const wardens = pieces.filter((p) => p.unit === 'b-u2');
		expect(wardens.map((p) => p.id)).toEqual(['b-u2-p1', 'b-u2-p2', 'b-u2-l1']);
		const captain = wardens[2];
		expect(captain).toMatchObject({ leader: true, value: 2, footprint: { shape: 'round', diameterMm: 32 } });
		expect(pieces.find((p) => p.id === 'b-u1-p1')!.footprint).toEqual({ shape: 'oval', lengthMm: 60, widthMm: 35 });
	});

	it('hands the engine only the pieces on the table', () => {
		const pieces = expandRoster('a', UNITS_A);
		pieces[1].at = { x: 5, y: 5, facing: 90 };
		const forEngine = enginePieces(pieces);
		expect(forEngine).toHaveLength(1);
		expect(forEngine[0]).toMatchObject({ id: 'a-u1-p2', side: 'a', unit: 'a-u1', allowance: 6, at: { x: 5, y: 5, facing: 90 } });
		expect(unitsOf(pieces).map((u) => [u.unit, u.pieces.length, u.deployed, u.hasRing])).toEqual([
			['a-u1', 3, 1, false],
			['a-u2', 1, 0, true]
		]);
	});
});
