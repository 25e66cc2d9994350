// The inches ↔ pixels transform: fitting, zooming about a point, panning and pinching.
import { describe, expect, it } from 'vitest';
import { fitView, lengthIn, lengthPx, panBy, pinchStep, toIn, toPx, zoomAt, MAX_SCALE } from '../../../src/lib/board/view';

describe('view', () => {
	it('fits a 44 × 60 in table in a 768 × 1024 px canvas by its depth, centred, with ruler room', () => {
		const v = fitView({ width: 44, depth: 60 }, { width: 768, height: 1024 }, 28);
		// (1024 − 56) / 60 = 16.1333 px/in is smaller than (768 − 56) / 44 = 16.18
		expect(v.scale).toBeCloseTo(968 / 60, 9);
		expect(v.offsetY).toBeCloseTo(28, 9);
		expect(v.offsetX).toBeCloseTo((768 - 44 * v.scale) / 2, 9);
	});

	it('converts there and back, and lengths by the scale', () => {
		const v = { scale: 12, offsetX: 30, offsetY: -10 };
		expect(toPx(v, { x: 2, y: 3 })).toEqual({ x: 54, y: 26 });
		expect(toIn(v, toPx(v, { x: 7.25, y: 41.5 }))).toEqual({ x: 7.25, y: 41.5 });
		expect(lengthPx(v, 3)).toBe(36);
		expect(lengthIn(v, 44)).toBeCloseTo(44 / 12, 12);
	});

	it('zooming keeps the board point under the pointer in place, within the limits', () => {
		const v = { scale: 10, offsetX: 20, offsetY: 40 };
		const anchor = { x: 300, y: 200 };
		const before = toIn(v, anchor);
		const z = zoomAt(v, anchor, 2.5);
		expect(z.scale).toBe(25);
		const after = toIn(z, anchor);
		expect(after.x).toBeCloseTo(before.x, 9);
		expect(after.y).toBeCloseTo(before.y, 9);
		expect(zoomAt(v, anchor, 1e6).scale).toBe(MAX_SCALE);
	});

	it('a pinch follows both fingers: spreading them 2× about a fixed midpoint doubles the scale there', () => {
		const v = { scale: 10, offsetX: 0, offsetY: 0 };
		const p = pinchStep(v, [{ x: 90, y: 100 }, { x: 110, y: 100 }], [{ x: 80, y: 100 }, { x: 120, y: 100 }]);
		expect(p.scale).toBeCloseTo(20, 9);
		expect(toIn(p, { x: 100, y: 100 }).x).toBeCloseTo(10, 9);
		// moving both fingers by (15, −5) without spreading is a pure pan
		const q = pinchStep(v, [{ x: 0, y: 0 }, { x: 10, y: 0 }], [{ x: 15, y: -5 }, { x: 25, y: -5 }]);
		expect(q).toEqual(panBy(v, 15, -5));
	});
});
