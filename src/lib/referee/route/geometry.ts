// Plane primitives of the route finder: distances from points and segments to rounded convex
// sets, tangent segments between circles (signed radii give the four bitangents), arcs.
import { pointSegmentDistance, cross, signedDistancePointConvex } from '../convex';

export const TAU = 2 * Math.PI;

/** A convex set of configuration space: the convex polygon `pts` (CCW) grown by `R`, with its box. */
export interface CSet {
	pts: number[];
	R: number;
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
	/** for a ≥3-gon: unit outward normal, offset and length of each edge (nx, ny, c, len) */
	lines: Float64Array | null;
}

export function cset(pts: number[], R: number): CSet {
	let minX = Infinity;
	let minY = Infinity;
	let maxX = -Infinity;
	let maxY = -Infinity;
	for (let i = 0; i < pts.length; i += 2) {
		if (pts[i] < minX) minX = pts[i];
		if (pts[i] > maxX) maxX = pts[i];
		if (pts[i + 1] < minY) minY = pts[i + 1];
		if (pts[i + 1] > maxY) maxY = pts[i + 1];
	}
	let lines: Float64Array | null = null;
	const n = pts.length / 2;
	if (n >= 3) {
		lines = new Float64Array(4 * n);
		for (let i = 0; i < n; i++) {
			const k = (i + 1) % n;
			const ex = pts[2 * k] - pts[2 * i];
			const ey = pts[2 * k + 1] - pts[2 * i + 1];
			const l = Math.hypot(ex, ey) || 1;
			// CCW polygon: the outward normal is the right of the edge
			const nx = ey / l;
			const ny = -ex / l;
			lines[4 * i] = nx;
			lines[4 * i + 1] = ny;
			lines[4 * i + 2] = nx * pts[2 * i] + ny * pts[2 * i + 1];
			lines[4 * i + 3] = l;
		}
	}
	return { pts, R, minX: minX - R, minY: minY - R, maxX: maxX + R, maxY: maxY + R, lines };
}

/**
 * The point's clearance from the set when it is below `above`; otherwise some value ≥ `above`
 * (a lower bound, cheap: the largest signed distance to an edge line never exceeds the distance).
 */
export function clearanceBelow(px: number, py: number, s: CSet, above: number): number {
	const L = s.lines;
	if (!L) return pointPolyDist(px, py, s.pts) - s.R;
	const n = L.length / 4;
	let m = -Infinity;
	let im = 0;
	for (let i = 0; i < n; i++) {
		const v = L[4 * i] * px + L[4 * i + 1] * py - L[4 * i + 2];
		if (v > m) {
			m = v;
			im = i;
		}
	}
	// inside the polygon the depth is exactly the largest (negative) line distance
	if (m - s.R >= above || m <= 0) return m - s.R;
	return convexDistanceFrom(px, py, s, im) - s.R;
}

/**
 * Exact distance from an outside point to a convex CCW polygon, given the edge whose line is
 * farthest: that edge's nearest point when the foot falls on it, else the distance falls along
 * the boundary towards the nearest vertex and we walk there.
 */
function convexDistanceFrom(px: number, py: number, s: CSet, im: number): number {
	const L = s.lines!;
	const p = s.pts;
	const n = L.length / 4;
	const edgeDist = (i: number) => {
		const k = (i + 1) % n;
		return pointSegmentDistance(px, py, p[2 * i], p[2 * i + 1], p[2 * k], p[2 * k + 1]);
	};
	// foot of the perpendicular along the edge's direction (−ny, nx)
	const u = -L[4 * im + 1] * (px - p[2 * im]) + L[4 * im] * (py - p[2 * im + 1]);
	if (u >= 0 && u <= L[4 * im + 3]) return L[4 * im] * px + L[4 * im + 1] * py - L[4 * im + 2];
	const step = u < 0 ? n - 1 : 1;
	let best = edgeDist(im);
	let i = im;
	for (let k = 1; k < n; k++) {
		const j = (i + step) % n;
		const d = edgeDist(j);
		if (d >= best) break;
		best = d;
		i = j;
	}
	return best;
}

/** Signed distance from a point to the polygon part of a set (negative inside a ≥3-gon). */
export function pointPolyDist(px: number, py: number, pts: number[]): number {
	if (pts.length === 2) return Math.hypot(px - pts[0], py - pts[1]);
	if (pts.length === 4) return pointSegmentDistance(px, py, pts[0], pts[1], pts[2], pts[3]);
	return signedDistancePointConvex(px, py, pts);
}

/** How far the point is outside the set (negative inside). */
export function pointSetClearance(px: number, py: number, s: CSet): number {
	return clearanceBelow(px, py, s, Infinity);
}

function segmentsCross(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
	const d1 = cross(bx - ax, by - ay, cx - ax, cy - ay);
	const d2 = cross(bx - ax, by - ay, dx - ax, dy - ay);
	const d3 = cross(dx - cx, dy - cy, ax - cx, ay - cy);
	const d4 = cross(dx - cx, dy - cy, bx - cx, by - cy);
	return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

export function segSegDist(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): number {
	if (segmentsCross(ax, ay, bx, by, cx, cy, dx, dy)) return 0;
	return Math.min(
		pointSegmentDistance(ax, ay, cx, cy, dx, dy),
		pointSegmentDistance(bx, by, cx, cy, dx, dy),
		pointSegmentDistance(cx, cy, ax, ay, bx, by),
		pointSegmentDistance(dx, dy, ax, ay, bx, by)
	);
}

/** Least distance from the segment to the polygon part of a set (0 when they meet). */
export function segPolyDist(ax: number, ay: number, bx: number, by: number, pts: number[]): number {
	const n = pts.length / 2;
	if (n === 1) return pointSegmentDistance(pts[0], pts[1], ax, ay, bx, by);
	if (n === 2) return segSegDist(ax, ay, bx, by, pts[0], pts[1], pts[2], pts[3]);
	if (signedDistancePointConvex(ax, ay, pts) <= 0) return 0;
	let d = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const e = segSegDist(ax, ay, bx, by, pts[2 * k], pts[2 * k + 1], pts[2 * i], pts[2 * i + 1]);
		if (e < d) d = e;
		if (d === 0) return 0;
	}
	return d;
}

/**
 * The segment leaving a circle (centre 1, signed radius s1) and arriving at another (centre 2,
 * signed radius s2), tangent to both. A positive signed radius means the circle is on the left
 * of the direction of travel (the path goes round it counter-clockwise). Radius 0 is a point.
 * Null when no such tangent exists (one circle inside the other's reach).
 */
export function tangentSegment(
	c1x: number,
	c1y: number,
	s1: number,
	c2x: number,
	c2y: number,
	s2: number
): { ax: number; ay: number; bx: number; by: number; len: number; nx: number; ny: number } | null {
	const Dx = c2x - c1x;
	const Dy = c2y - c1y;
	const d = Math.hypot(Dx, Dy);
	if (d === 0) return null;
	const k = s2 - s1;
	if (Math.abs(k) > d) return null;
	const ex = Dx / d;
	const ey = Dy / d;
	// u = a·e + b·left(e); the left normal n of u satisfies n·D = k
	const b = -k / d;
	const a = Math.sqrt(Math.max(0, 1 - b * b));
	const ux = a * ex - b * ey;
	const uy = a * ey + b * ex;
	const nx = -uy;
	const ny = ux;
	return { ax: c1x - s1 * nx, ay: c1y - s1 * ny, bx: c2x - s2 * nx, by: c2y - s2 * ny, len: a * d, nx, ny };
}

/** Angle of a point on a circle, in [0, 2π). */
export function angleOf(cx: number, cy: number, px: number, py: number): number {
	const t = Math.atan2(py - cy, px - cx);
	return t < 0 ? t + TAU : t;
}

/** Angle travelled from `from` to `to` going round in orientation o (+1 CCW, −1 CW), in [0, 2π). */
export function arcDelta(from: number, to: number, o: number): number {
	let d = o > 0 ? to - from : from - to;
	d %= TAU;
	if (d < 0) d += TAU;
	return d;
}

/** Angles where two circles cross. */
export function circleCircle(ax: number, ay: number, ar: number, bx: number, by: number, br: number, out: number[]): void {
	const dx = bx - ax;
	const dy = by - ay;
	const d = Math.hypot(dx, dy);
	if (d === 0 || d > ar + br + 1e-12 || d < Math.abs(ar - br) - 1e-12) return;
	const base = Math.atan2(dy, dx);
	const c = (ar * ar + d * d - br * br) / (2 * ar * d);
	const h = Math.acos(Math.max(-1, Math.min(1, c)));
	out.push(base - h, base + h);
}

/** Angles where the circle crosses the segment. */
export function circleSegment(cx: number, cy: number, r: number, ax: number, ay: number, bx: number, by: number, out: number[]): void {
	const dx = bx - ax;
	const dy = by - ay;
	const fx = ax - cx;
	const fy = ay - cy;
	const a = dx * dx + dy * dy;
	if (a === 0) return;
	const b = 2 * (fx * dx + fy * dy);
	const c = fx * fx + fy * fy - r * r;
	let disc = b * b - 4 * a * c;
	// a segment tangent to the circle (an edge of the set the circle is a corner of) must give
	// its touching point even when rounding makes the discriminant a hair negative
	if (disc < 0) {
		if (disc < -4e-9 * a * r * r) return;
		disc = 0;
	}
	const sq = Math.sqrt(disc);
	for (const t of [(-b - sq) / (2 * a), (-b + sq) / (2 * a)]) {
		if (t >= -1e-6 && t <= 1 + 1e-6) out.push(Math.atan2(fy + t * dy, fx + t * dx));
	}
}

/** Angles where the circle meets the boundary of a rounded convex set (a superset is fine). */
export function circleSetCrossings(cx: number, cy: number, r: number, s: CSet, out: number[]): void {
	const p = s.pts;
	const n = p.length / 2;
	for (let i = 0; i < n; i++) {
		if (s.R > 0) circleCircle(cx, cy, r, p[2 * i], p[2 * i + 1], s.R, out);
		else if (n === 1) out.push(Math.atan2(p[1] - cy, p[0] - cx));
	}
	if (n < 2) return;
	const edges = n === 2 ? 1 : n;
	for (let i = 0; i < edges; i++) {
		const k = (i + 1) % n;
		const x0 = p[2 * i];
		const y0 = p[2 * i + 1];
		const x1 = p[2 * k];
		const y1 = p[2 * k + 1];
		const len = Math.hypot(x1 - x0, y1 - y0);
		if (len === 0) continue;
		const ox = (-(y1 - y0) / len) * s.R;
		const oy = ((x1 - x0) / len) * s.R;
		circleSegment(cx, cy, r, x0 + ox, y0 + oy, x1 + ox, y1 + oy, out);
		if (s.R > 0) circleSegment(cx, cy, r, x0 - ox, y0 - oy, x1 - ox, y1 - oy, out);
	}
}

/** Signed area of a flat ring (positive CCW). */
export function ringArea(ring: number[]): number {
	let s = 0;
	const n = ring.length / 2;
	for (let i = 0, k = n - 1; i < n; k = i++) s += ring[2 * k] * ring[2 * i + 1] - ring[2 * i] * ring[2 * k + 1];
	return s / 2;
}
