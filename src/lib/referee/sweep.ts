// Swept footprints: a translation along a segment is the Minkowski sum of the footprint with the
// segment (exact, convex); a pivot is covered by the hulls of closely spaced turned copies.
import { convexHull, minkowskiSum, signedDistance, type Rounded } from './convex';
import { place } from './footprints';

/** The region covered by `shape` translated by every t·(dx, dy), t ∈ [0, 1]. */
export function translationSweep(shape: Rounded, dx: number, dy: number): Rounded {
	if (dx === 0 && dy === 0) return shape;
	const p = shape.pts;
	if (p.length === 2) return { pts: [p[0], p[1], p[0] + dx, p[1] + dy], r: shape.r };
	return { pts: minkowskiSum(p, [0, 0, dx, dy]), r: shape.r };
}

/** Arc length the farthest point may travel between two turned copies of a pivot's cover. */
export const PIVOT_STEP_IN = 0.05;

/**
 * Convex pieces covering a footprint turning about (x, y) from fromDeg by deltaDeg. Each piece is
 * the hull of two copies a small angle apart, grown by the arc's sagitta so nothing is missed;
 * the cover exceeds the true swept area by at most that sagitta (well under 0.001 in).
 */
export function pivotSweep(local: Rounded, rMaxIn: number, x: number, y: number, fromDeg: number, deltaDeg: number): Rounded[] {
	const sweepRad = Math.abs((deltaDeg * Math.PI) / 180);
	const steps = Math.max(1, Math.ceil((rMaxIn * sweepRad) / PIVOT_STEP_IN));
	const stepRad = sweepRad / steps;
	const sagitta = rMaxIn * (1 - Math.cos(stepRad / 2));
	const out: Rounded[] = [];
	let prev = place(local, x, y, fromDeg);
	for (let i = 1; i <= steps; i++) {
		const next = place(local, x, y, fromDeg + (deltaDeg * i) / steps);
		const both = prev.pts.concat(next.pts);
		out.push({ pts: convexHull(both), r: local.r + sagitta });
		prev = next;
	}
	return out;
}

/** Least signed distance between a moving set's sweep and a still one (minus depth when crossing). */
export function sweptDistance(shape: Rounded, dx: number, dy: number, still: Rounded): number {
	return signedDistance(translationSweep(shape, dx, dy), still);
}
