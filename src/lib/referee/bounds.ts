// Cheap brackets on edge-to-edge distances, so most pairs are settled without an exact distance:
// how far a footprint reaches along a direction (its support, bounded from above, exact for the
// ellipse an oval's polygon is inscribed in) and how far it surely extends along a ray from its
// reference point (bounded from below). Bounds of the engine's own shapes, never approximations.
import type { LocalFootprint } from './footprints';
import type { PivotCover } from './sweep';

/**
 * Slack for floating-point rounding, in inches: a million times the rounding of figures on a
 * table, a million times below the tolerance ε. A bound is never tighter than it may be.
 */
const SLACK = 1e-9;

/** What the bounds need of a footprint, in its own frame (facing 0). */
export interface Reach {
	/** 0 round, 1 oval, 2 hull */
	kind: 0 | 1 | 2;
	/** the rounding radius of the engine's shape (round: the radius) */
	r: number;
	/** oval semi-axes along the local x (length) and y (width) */
	a: number;
	b: number;
	/** oval: scale of a copy of the ellipse surely inside the polygon, 0 when none is known */
	innerScale: number;
	/** hull: its vertices; the radius of a disk about the reference point inside it, or −Infinity */
	pts: number[];
	innerDisk: number;
}

/** A footprint's pose as its centre and the cosine and sine of its facing. */
export interface Frame {
	x: number;
	y: number;
	c: number;
	s: number;
}

export function frameOf(x: number, y: number, facingDeg: number): Frame {
	const th = (facingDeg * Math.PI) / 180;
	return { x, y, c: Math.cos(th), s: Math.sin(th) };
}

/**
 * The bounds' view of a footprint. An oval's polygon has its vertices on the ellipse and stays
 * within its chord gap g of it (g ≤ max(a, b)·(1 − cos(π/n)): the affine image of a circle's
 * sagitta); so it holds the ellipse shrunk by g, which holds the ellipse scaled by 1 − g/min(a, b)
 * while g is below the least radius of curvature min²/max.
 */
export function reachOfLocal(local: LocalFootprint, shape: 'round' | 'oval' | 'hull', a = 0, b = 0, innerDisk = -Infinity): Reach {
	const r = local.outer.r;
	if (shape === 'round') return { kind: 0, r, a: 0, b: 0, innerScale: 0, pts: [], innerDisk: r };
	if (shape === 'oval') {
		const n = local.outer.pts.length / 2;
		const lo = Math.min(a, b);
		const hi = Math.max(a, b);
		const gap = hi * (1 - Math.cos(Math.PI / n)) * (1 + 1e-6) + SLACK;
		const innerScale = gap < (0.5 * lo * lo) / hi ? 1 - gap / lo : 0;
		return { kind: 1, r, a, b, innerScale, pts: [], innerDisk: -Infinity };
	}
	return { kind: 2, r, a: 0, b: 0, innerScale: 0, pts: local.outer.pts, innerDisk };
}

/** Upper bound on how far the placed footprint reaches from its reference point along unit (ux, uy). */
export function support(R: Reach, f: Frame, ux: number, uy: number): number {
	if (R.kind === 0) return R.r + SLACK;
	// the direction in the footprint's own frame
	const lx = ux * f.c + uy * f.s;
	const ly = uy * f.c - ux * f.s;
	if (R.kind === 1) {
		// the polygon lies inside the ellipse; its rounding adds r
		const p = R.a * lx;
		const q = R.b * ly;
		return Math.sqrt(p * p + q * q) + R.r + SLACK;
	}
	const pts = R.pts;
	let h = -Infinity;
	for (let i = 0; i < pts.length; i += 2) {
		const v = pts[i] * lx + pts[i + 1] * ly;
		if (v > h) h = v;
	}
	return h + R.r + SLACK;
}

/** Lower bound on how far the footprint surely extends from its reference point along (ux, uy); −Infinity when unknown. */
export function radial(R: Reach, f: Frame, ux: number, uy: number): number {
	if (R.kind === 0) return R.r - SLACK;
	if (R.kind === 2) return R.innerDisk - SLACK;
	if (R.innerScale <= 0) return -Infinity;
	const lx = ux * f.c + uy * f.s;
	const ly = uy * f.c - ux * f.s;
	const p = R.b * lx;
	const q = R.a * ly;
	return (R.innerScale * R.a * R.b) / Math.sqrt(p * p + q * q) - SLACK;
}

/**
 * Lower bound on the signed distance between two placed footprints: their separation along the
 * line of centres (for convex sets the signed distance is the largest separation along any
 * direction, overlaps included). −Infinity when the centres coincide.
 */
export function lowerGap(A: Reach, fa: Frame, B: Reach, fb: Frame): number {
	const dx = fb.x - fa.x;
	const dy = fb.y - fa.y;
	const L = Math.sqrt(dx * dx + dy * dy);
	if (!(L > 0)) return -Infinity;
	const ux = dx / L;
	const uy = dy / L;
	return L - support(A, fa, ux, uy) - support(B, fb, -ux, -uy);
}

/**
 * Upper bound on the signed distance between two placed footprints: the gap between the points
 * each surely reaches along the line of centres (0 when those reaches overlap: then the sets
 * meet). Infinity when unknown.
 */
export function upperGap(A: Reach, fa: Frame, B: Reach, fb: Frame): number {
	const dx = fb.x - fa.x;
	const dy = fb.y - fa.y;
	const L = Math.sqrt(dx * dx + dy * dy);
	if (!(L > 0)) return Infinity;
	const ux = dx / L;
	const uy = dy / L;
	const ra = radial(A, fa, ux, uy);
	const rb = radial(B, fb, -ux, -uy);
	if (!(ra >= 0 && rb >= 0)) return Infinity;
	return Math.max(0, L - ra - rb) + SLACK;
}

/**
 * Lower bound on the signed distance between A swept from frame fa along (dx, dy) and B still at
 * fb: separation along the direction from the nearest point of the sweep's path to B's centre
 * (the sweep reaches h_A(v) + max(0, v·d) along v).
 */
export function lowerSweepGap(A: Reach, fa: Frame, dx: number, dy: number, B: Reach, fb: Frame): number {
	const len2 = dx * dx + dy * dy;
	let t = len2 > 0 ? ((fb.x - fa.x) * dx + (fb.y - fa.y) * dy) / len2 : 0;
	if (t < 0) t = 0;
	else if (t > 1) t = 1;
	const wx = fb.x - (fa.x + t * dx);
	const wy = fb.y - (fa.y + t * dy);
	const L = Math.sqrt(wx * wx + wy * wy);
	if (!(L > 0)) return -Infinity;
	const ux = wx / L;
	const uy = wy / L;
	const along = ux * dx + uy * dy;
	return ux * (fb.x - fa.x) + uy * (fb.y - fa.y) - support(A, fa, ux, uy) - Math.max(0, along) - support(B, fb, -ux, -uy);
}

/**
 * Lower bound on the signed distance between piece i of a turn's cover (the hull of copies i and
 * i + 1 of A about the turn's centre, grown by the sagitta) and B still at fb: separation along
 * the line of centres, taking the farther-reaching of the two copies.
 */
export function lowerPivotGap(A: Reach, cover: PivotCover, i: number, B: Reach, fb: Frame): number {
	const f0 = frameOf(cover.x, cover.y, cover.facingOf(i));
	const dx = fb.x - f0.x;
	const dy = fb.y - f0.y;
	const L = Math.sqrt(dx * dx + dy * dy);
	if (!(L > 0)) return -Infinity;
	const ux = dx / L;
	const uy = dy / L;
	const f1 = frameOf(cover.x, cover.y, cover.facingOf(i + 1));
	return L - Math.max(support(A, f0, ux, uy), support(A, f1, ux, uy)) - cover.sagitta - support(B, fb, -ux, -uy);
}
