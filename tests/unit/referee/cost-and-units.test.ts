// Path cost (horizontal, pivots, climbs), units and summaries, with hand-worked values.
// 25.4 mm per inch: NIST SP 811 (2008), appendix B. Trade facts (3 in from a 40 mm marker, 6 in
// support ring, the climb example 1 + 2 + 2 + 2 = 7 in > 6 in): common practice, no published source.
import { signedDistancePointConvex } from '../../../src/lib/referee/convex';
import { describe, expect, it } from 'vitest';
import {
	angleDeltaDeg,
	checkMove,
	climbIn,
	localFootprint,
	mmToIn,
	MM_PER_IN,
	ovalVertexCount,
	pathSteps,
	pivotIn,
	TABLE_STANDARD
} from '../../../src/lib/referee';
import { profileSchema } from '../../../src/lib/schemas/check';
import { codes, EPS, NUDGE, piece, rect, request } from './helpers';

describe('units and profile', () => {
	it('converts at exactly 25.4 mm per inch (NIST SP 811, appendix B)', () => {
		expect(MM_PER_IN).toBe(25.4);
		expect(mmToIn(25.4)).toBe(1);
		expect(mmToIn(127)).toBe(5);
		expect(localFootprint({ shape: 'round', diameterMm: 32 }, EPS).outer.r).toBe(16 / 25.4);
	});
	it('the engine defaults equal the schema defaults (one "Table Standard" profile)', () => {
		expect(profileSchema.parse({})).toEqual({ ...TABLE_STANDARD });
		expect(TABLE_STANDARD.tolerance).toBe(0.005);
		expect(TABLE_STANDARD.keepOut).toBe(1); // common practice, no published source
		expect(TABLE_STANDARD.spacing).toBe(2); // common practice, no published source
		expect(TABLE_STANDARD.largeUnit).toBe(7); // common practice, no published source
		expect(TABLE_STANDARD.objectiveRange).toBe(3); // common practice, no published source
		expect(TABLE_STANDARD.markerMm).toBe(40); // common practice, no published source
	});
	it('an oval polygon stays within 0.0002 in of the curve', () => {
		for (const lengthMm of [60, 90, 170, 500]) {
			const a = lengthMm / 25.4 / 2;
			const n = ovalVertexCount(a);
			expect(a * (1 - Math.cos(Math.PI / n)) / 2).toBeLessThanOrEqual(0.0002 + 1e-12);
		}
	});
	it('an oval wider than long is as close to its curve as any (the count follows the larger axis)', () => {
		for (const [lengthMm, widthMm] of [[35, 60], [60, 35], [42, 75]]) {
			const fp = localFootprint({ shape: 'oval', lengthMm, widthMm }, 0.005);
			const a = lengthMm / 25.4 / 2;
			const b = widthMm / 25.4 / 2;
			let worst = 0;
			for (let i = 0; i < 4000; i++) {
				const t = (2 * Math.PI * i) / 4000;
				// distance of a point of the true ellipse from the rounded polygon's edge
				const d = signedDistancePointConvex(a * Math.cos(t), b * Math.sin(t), fp.outer.pts) - fp.outer.r;
				worst = Math.max(worst, Math.abs(d));
			}
			expect(worst).toBeLessThanOrEqual(0.0002 + 1e-9);
		}
	});
});

describe('pivot cost', () => {
	const hull: [number, number][] = [
		[-3, -1],
		[3, -1],
		[3, 1],
		[-3, 1]
	];
	it('a non-round footprint pays r_max × |Δθ| (radians) at each waypoint where it turns', () => {
		const steps = pathSteps({ x: 0, y: 0, facing: 0 }, [{ x: 0, y: 0, facing: 90 }, { x: 4, y: 0, facing: 45 }]);
		const rMax = Math.hypot(3, 1);
		expect(pivotIn(steps, rMax, false, { pivot: 'arc', pivotFixedIn: 1 })).toBeCloseTo(rMax * (Math.PI / 2 + Math.PI / 4), 12);
		expect(pivotIn(steps, rMax, false, { pivot: 'fixed', pivotFixedIn: 1.5 })).toBe(3);
		expect(pivotIn(steps, rMax, true, { pivot: 'arc', pivotFixedIn: 1 })).toBe(0);
	});
	it('turns the shorter way', () => {
		expect(angleDeltaDeg(10, 350)).toBe(-20);
		expect(angleDeltaDeg(350, 10)).toBe(20);
		expect(angleDeltaDeg(0, 720 + 90)).toBe(90);
	});
	it('is part of the checked cost; round bases turn for free', () => {
		const v = piece('v1', 'red', 'u1', 10, 10, { class: 'vehicle', allowance: 10, footprint: { shape: 'hull', points: hull } });
		const turned = checkMove(request([v], { unit: 'u1', kind: 'move', paths: { v1: [{ x: 12, y: 10, facing: 90 }] } }));
		expect(turned.pieces.v1.cost).toBeCloseTo(2 + (Math.hypot(3, 1) * Math.PI) / 2, 12);
		const roundTurn = checkMove(request([piece('a1', 'red', 'u1', 10, 10)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 12, y: 10, facing: 90 }] } }));
		expect(roundTurn.pieces.a1.cost).toBe(2);
	});
});

describe('climb cost', () => {
	it('is the total rise and fall of the tallest block touched', () => {
		expect(climbIn([{ from: 0.2, to: 0.6, heightIn: 2 }], 1)).toBe(4);
		// stepping from a 2 in block onto an adjoining 3 in one: up 2, up 1, down 3
		expect(climbIn([{ from: 0.2, to: 0.5, heightIn: 2 }, { from: 0.5, to: 0.8, heightIn: 3 }], 1)).toBe(6);
		// starting on a block: only the way down
		expect(climbIn([{ from: 0, to: 0.5, heightIn: 2 }], 1)).toBe(2);
	});

	// The worked example (common practice, no published source): a piece with a 6 in allowance,
	// 1 in from a block 2 in high and 2 in across, needs at least 1 + 2 + 2 + 2 = 7 in to cross.
	const block = { id: 'crate-1', kind: 'block' as const, outline: rect(10, 0, 12, 20), height: 2 };
	const cross = (clearIn: number) =>
		checkMove(
			request([piece('a1', 'red', 'u1', 8.5, 10)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 12.5 + clearIn, y: 10 }] } }, { terrain: [block] })
		);
	it('the worked example: 1 + 2 + 2 + 2 = 7 in > 6, and the base adds its width', () => {
		const r = cross(0.01);
		// reference point travels 1 (gap) + 2 (across) + 1 (the base's own width) + 0.01 clear
		expect(r.pieces.a1.cost).toBeCloseTo(4.01 + 2 + 2, 12);
		expect(r.pieces.a1.cost).toBeGreaterThan(7);
		expect(codes(r)).toEqual(['over-allowance']);
	});
	it('a base still within ε of the far edge has not come down: it overhangs', () => {
		const r = cross(-EPS - NUDGE);
		expect(codes(r)).toContain('overhang');
		expect(r.pieces.a1.cost).toBeCloseTo(4 - EPS - NUDGE + 2, 12);
		expect(cross(-EPS + NUDGE).pieces.a1.cost).toBeCloseTo(4 - EPS + NUDGE + 4, 12);
	});
	it('going round costs only the way round', () => {
		const round = checkMove(
			request([piece('a1', 'red', 'u1', 8.5, 10, { allowance: 30 })], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8.5, y: 21 }, { x: 13, y: 21 }, { x: 13, y: 10 }] } }, { terrain: [block] })
		);
		expect(round.pieces.a1.cost).toBeCloseTo(11 + 4.5 + 11, 12);
		expect(round.verdict).toBe('legal');
	});
	it('a flier pays the climb over a block (profile setting)', () => {
		const fly = (fliersPayClimb: boolean) =>
			checkMove(
				request([piece('a1', 'red', 'u1', 8.5, 10, { flies: true, allowance: 12 })], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 14, y: 10 }] } }, { terrain: [block] }, { fliersPayClimb })
			);
		expect(fly(true).pieces.a1.cost).toBeCloseTo(5.5 + 4, 12);
		expect(fly(false).pieces.a1.cost).toBeCloseTo(5.5, 12);
	});
});

describe('summaries', () => {
	it('a piece holds an objective within 3 in of the 40 mm marker edge, + ε (common practice, no published source)', () => {
		const reach = 3 + 20 / 25.4 + 0.5 + EPS;
		const hold = (d: number) =>
			checkMove(
				request([piece('a1', 'red', 'u1', 5, 5, { value: 2 }), piece('c1', 'blue', 'u2', 40, 50)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 22 - d, y: 30 }] } }, {
					objectives: [{ id: 'obj-1', x: 22, y: 30 }]
				}, { keepOut: 1 })
			).summaries.objectives[0];
		expect(hold(reach - NUDGE)).toEqual({ id: 'obj-1', pieces: ['a1'], units: ['u1'], value: { red: 2, blue: 0 } });
		expect(hold(reach + NUDGE)).toEqual({ id: 'obj-1', pieces: [], units: [], value: { red: 0, blue: 0 } });
	});
	it('a support ring covers friendly units within its radius and reports those the move took out (6 in: common practice, no published source)', () => {
		const pieces = [
			piece('s1', 'red', 'u1', 10, 10, { ring: { radius: 6 } }),
			piece('f1', 'red', 'u2', 17 + EPS - NUDGE, 10),
			piece('e1', 'blue', 'u3', 10, 17.5)
		];
		const stay = checkMove(request(pieces, { unit: 'u1', kind: 'hold' }));
		expect(stay.summaries.rings).toEqual([{ source: 's1', covers: ['u1', 'u2'], lost: [] }]);
		const away = checkMove(request(pieces, { unit: 'u1', kind: 'move', paths: { s1: [{ x: 10, y: 5 }] } }));
		expect(away.summaries.rings).toEqual([{ source: 's1', covers: ['u1'], lost: ['u2'] }]);
		const ringDefault = checkMove(request([piece('s1', 'red', 'u1', 10, 10, { ring: {} }), piece('f1', 'red', 'u2', 17 + EPS + NUDGE, 10)], { unit: 'u1', kind: 'hold' }));
		expect(ringDefault.summaries.rings[0].covers).toEqual(['u1']);
	});
});
