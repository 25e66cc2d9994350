// Snapping: grid points at 1 in and 0.5 in (or off), angles to 15°; hand-worked values.
import { describe, expect, it } from 'vitest';
import { nextGrid, snapAngle, snapDelta, snapPoint, snapValue } from '../../../src/lib/board/editor/snap';

describe('grid snap', () => {
	it('rounds to the nearest inch, half inch, or leaves the value with snap off', () => {
		expect(snapPoint([3.4, 7.6], { gridIn: 1, angle: true })).toEqual([3, 8]);
		expect(snapPoint([3.4, 7.6], { gridIn: 0.5, angle: true })).toEqual([3.5, 7.5]);
		expect(snapPoint([3.4, 7.6], { gridIn: 0, angle: true })).toEqual([3.4, 7.6]);
		expect(snapValue(0.74, 0.5)).toBe(0.5);
		expect(snapValue(0.76, 0.5)).toBe(1);
		expect(snapValue(-1.26, 0.5)).toBe(-1.5);
	});

	it('snaps a move so the reference corner lands on the grid, wherever it started', () => {
		// the corner is at 2.3; moving by 1.1 would put it at 3.4, snapped to 3 → a move of 0.7
		const [dx, dy] = snapDelta([2.3, 5], 1.1, 0.4, { gridIn: 1, angle: false });
		expect(dx).toBeCloseTo(0.7, 9);
		expect(dy).toBe(0);
	});

	it('cycles 1 in → 0.5 in → off → 1 in', () => {
		expect(nextGrid(1)).toBe(0.5);
		expect(nextGrid(0.5)).toBe(0);
		expect(nextGrid(0)).toBe(1);
	});
});

describe('angle snap', () => {
	it('rounds to 15° steps when on and leaves the angle when off', () => {
		expect(snapAngle(22, { gridIn: 1, angle: true })).toBe(15);
		expect(snapAngle(23, { gridIn: 1, angle: true })).toBe(30);
		expect(snapAngle(-8, { gridIn: 1, angle: true })).toBe(-15);
		expect(snapAngle(7, { gridIn: 1, angle: true })).toBe(0);
		expect(Object.is(snapAngle(-7, { gridIn: 1, angle: true }), 0)).toBe(true);
		expect(snapAngle(22, { gridIn: 1, angle: false })).toBe(22);
	});
});
