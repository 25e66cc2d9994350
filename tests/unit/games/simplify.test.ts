// Dragged paths become waypoints: straight stretches collapse, bends over 0.1 in stay, turns
// always stay. Values are hand-worked.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { rdp, simplifyTrace, SIMPLIFY_TOLERANCE_IN } from '$lib/board/play/simplify';

function segDist(p: { x: number; y: number }, a: { x: number; y: number }, b: { x: number; y: number }) {
	const dx = b.x - a.x, dy = b.y - a.y;
	const l2 = dx * dx + dy * dy;
	const t = l2 ? Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / l2)) : 0;
	return Math.hypot(p.x - a.x - t * dx, p.y - a.y - t * dy);
}

describe('path simplification (Ramer–Douglas–Peucker at 0.1 in)', () => {
	it('collapses a straight drag of many frames to its end point', () => {
		const trace = Array.from({ length: 61 }, (_, i) => ({ x: 10 + i * 0.1, y: 20 }));
		expect(simplifyTrace(trace)).toEqual([{ x: 16, y: 20 }]);
	});

	it('keeps a corner and drops a wobble of 0.05 in', () => {
		const trace = [
			{ x: 0, y: 0 },
			{ x: 2, y: 0.05 },
			{ x: 4, y: 0 },
			{ x: 4, y: 2 },
			{ x: 4, y: 4 }
		];
		expect(simplifyTrace(trace)).toEqual([{ x: 4, y: 0 }, { x: 4, y: 4 }]);
	});

	it('keeps a bend of 0.15 in, which is more than the tolerance', () => {
		const out = rdp([{ x: 0, y: 0 }, { x: 2, y: 0.15 }, { x: 4, y: 0 }]);
		expect(out).toHaveLength(3);
		expect(SIMPLIFY_TOLERANCE_IN).toBe(0.1);
	});

	it('always keeps a turn, even on a straight line, and a turn before moving', () => {
		const trace = [
			{ x: 0, y: 0, facing: 90 },
			{ x: 1, y: 0 },
			{ x: 2, y: 0, facing: 45 },
			{ x: 3, y: 0 },
			{ x: 4, y: 0 }
		];
		expect(simplifyTrace(trace)).toEqual([{ x: 0, y: 0, facing: 90 }, { x: 2, y: 0, facing: 45 }, { x: 4, y: 0 }]);
	});

	it('names the end even when the piece is put back where it stood', () => {
		expect(simplifyTrace([{ x: 3, y: 3 }, { x: 3.02, y: 3 }, { x: 3, y: 3 }])).toEqual([{ x: 3, y: 3 }]);
	});

	it('never strays more than 0.1 in from any dragged point, and keeps both ends (property)', () => {
		const pt = fc.record({ x: fc.double({ min: 0, max: 44, noNaN: true }), y: fc.double({ min: 0, max: 60, noNaN: true }) });
		fc.assert(
			fc.property(fc.array(pt, { minLength: 2, maxLength: 60 }), (trace) => {
				const out = rdp(trace);
				expect(out[0]).toEqual(trace[0]);
				expect(out[out.length - 1]).toEqual(trace[trace.length - 1]);
				for (const p of trace) {
					let best = Infinity;
					for (let k = 1; k < out.length; k++) best = Math.min(best, segDist(p, out[k - 1], out[k]));
					if (out.length === 1) best = Math.hypot(p.x - out[0].x, p.y - out[0].y);
					expect(best).toBeLessThanOrEqual(SIMPLIFY_TOLERANCE_IN + 1e-9);
				}
			})
		);
	});
});
