// Hull outline checks and footprint extents, with hand-worked values.
import { describe, expect, it } from 'vitest';
import { describeFootprint, footprintExtentMm, formatHullPoints, hullProblem, parseHullPoints, signedAreaIn2, MM_PER_IN } from '$lib/rosters/footprint';

describe('hull outlines', () => {
	it('a 5 × 3 in rectangle has 15 sq in and no problem (hand-worked)', () => {
		const rect: [number, number][] = [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]];
		expect(signedAreaIn2(rect)).toBeCloseTo(15, 10);
		expect(hullProblem(rect)).toBeNull();
		// Clockwise order is the same outline: only the sign changes.
		expect(signedAreaIn2([...rect].reverse())).toBeCloseTo(-15, 10);
		expect(hullProblem([...rect].reverse())).toBeNull();
	});

	it('a concave outline is a good hull', () => {
		expect(hullProblem([[0, 0], [4, 0], [4, 3], [2, 1], [0, 3]])).toBeNull();
	});

	it('refuses fewer than 3 points, repeated points, crossings, fold-backs and flat outlines', () => {
		expect(hullProblem([[0, 0], [1, 1]])).toBe('A hull needs at least 3 points (this one has 2)');
		expect(hullProblem([[0, 0], [1, 0], [1, 0], [0, 1]])).toBe('Hull points 2 and 3 are the same point');
		expect(hullProblem([[0, 0], [2, 2], [2, 0], [0, 2]])).toBe('The hull outline crosses itself (edges 1 and 3 meet)');
		expect(hullProblem([[0, 0], [2, 0], [1, 0], [1, 1]])).toBe('The hull outline doubles back on itself at point 2');
		expect(hullProblem([[0, 0], [1, 0], [2, 0]])).toBe('The hull outline doubles back on itself at point 3');
		// 0.0005 sq in: a sliver no model has (the limit is 0.01 sq in, common practice).
		expect(hullProblem([[0, 0], [1, 0], [0.5, 0.001]])).toBe('The hull outline encloses no area: its points lie on one line');
		// A vertex touching a far edge pinches the outline into two: refused as a crossing.
		expect(hullProblem([[0, 0], [4, 0], [4, 4], [2, 0], [0, 4]])).toMatch(/crosses itself/);
	});

	it('typed points read back as written, separated by ";" or new lines', () => {
		expect(parseHullPoints('-2.5 -1.5; 2.5 -1.5;2.5,1.5\n-2.5 1.5')).toEqual({ ok: true, points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] });
		expect(parseHullPoints(formatHullPoints([[0.125, -3], [1e-3, 2]]))).toEqual({ ok: true, points: [[0.125, -3], [0.001, 2]] });
		expect(parseHullPoints('1 2; 3')).toEqual({ ok: false, message: 'Hull point 2 ("3") is not two numbers "x y" in inches' });
		expect(parseHullPoints('1 2 3')).toMatchObject({ ok: false });
	});
});

describe('footprint extents for the preview', () => {
	it('a round base spans its diameter, an oval its length along x and width along y', () => {
		expect(footprintExtentMm({ shape: 'round', diameterMm: 32 })).toEqual({ minX: -16, minY: -16, maxX: 16, maxY: 16 });
		expect(footprintExtentMm({ shape: 'oval', lengthMm: 75, widthMm: 42 })).toEqual({ minX: -37.5, minY: -21, maxX: 37.5, maxY: 21 });
	});

	it('a hull in inches is converted at 25.4 mm per inch (NIST SP 811)', () => {
		const e = footprintExtentMm({ shape: 'hull', points: [[-1, -0.5], [2, -0.5], [2, 0.5]] });
		expect(MM_PER_IN).toBe(25.4);
		expect(e.minX).toBeCloseTo(-25.4, 10);
		expect(e.maxX).toBeCloseTo(50.8, 10);
		expect(e.maxY - e.minY).toBeCloseTo(25.4, 10);
		expect(describeFootprint({ shape: 'hull', points: [[-1, -0.5], [2, -0.5], [2, 0.5]] })).toBe('hull, 3 points, 3 × 1 in');
	});
});
