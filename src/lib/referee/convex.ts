// Planar primitives on flat point arrays [x0, y0, x1, y1, …] in inches: convex hulls, Minkowski
// sums, exact signed distances between rounded convex sets, and line–set intervals for sweeps.

/** A rounded convex set: the convex polygon `pts` (CCW, ≥1 point) grown by a disk of radius `r`. */
export interface Rounded {
	pts: number[];
	r: number;
}

export function cross(ax: number, ay: number, bx: number, by: number): number {
	return ax * by - ay * bx;
}

/** Distance from (px, py) to the segment (ax, ay)–(bx, by). */
export function pointSegmentDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
	const dx = bx - ax;
	const dy = by - ay;
	const len2 = dx * dx + dy * dy;
	let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
	if (t < 0) t = 0;
	else if (t > 1) t = 1;
	return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/** Andrew's monotone chain: CCW hull without collinear points; 1 or 2 points when degenerate. */
export function convexHull(flat: number[]): number[] {
	const n = flat.length / 2;
	const idx: number[] = [];
	for (let i = 0; i < n; i++) idx.push(i);
	idx.sort((i, j) => flat[2 * i] - flat[2 * j] || flat[2 * i + 1] - flat[2 * j + 1]);
	return monotoneChain(flat, idx);
}

/** The hull's two chains over points already in (x, y) order (ties in index order). */
function monotoneChain(flat: number[], idx: number[]): number[] {
	const n = flat.length / 2;
	const hull: number[] = [];
	const turn = (o: number, a: number, b: number) =>
		cross(flat[2 * a] - flat[2 * o], flat[2 * a + 1] - flat[2 * o + 1], flat[2 * b] - flat[2 * o], flat[2 * b + 1] - flat[2 * o + 1]);
	for (const i of idx) {
		while (hull.length >= 2 && turn(hull[hull.length - 2], hull[hull.length - 1], i) <= 0) hull.pop();
		hull.push(i);
	}
	const lowerLen = hull.length + 1;
	for (let k = idx.length - 2; k >= 0; k--) {
		const i = idx[k];
		while (hull.length >= lowerLen && turn(hull[hull.length - 2], hull[hull.length - 1], i) <= 0) hull.pop();
		hull.push(i);
	}
	hull.pop();
	const out: number[] = [];
	for (const i of hull) out.push(flat[2 * i], flat[2 * i + 1]);
	if (out.length === 0 && n > 0) out.push(flat[0], flat[1]);
	// All points equal: the chain keeps two copies of one point.
	if (out.length === 4 && out[0] === out[2] && out[1] === out[3]) out.length = 2;
	return out;
}

/**
 * The hull of two convex CCW polygons, exactly convexHull(a.concat(b)): each polygon's vertices
 * come in (x, y) order by merging its two chains, and the two lists merge in O(n), instead of a
 * sort. If rounding left a polygon not quite convex the order check fails and the sort decides.
 */
export function convexHullOfTwo(a: number[], b: number[]): number[] {
	const flat = a.concat(b);
	const n = flat.length / 2;
	const before = (i: number, j: number) => {
		const d = flat[2 * i] - flat[2 * j] || flat[2 * i + 1] - flat[2 * j + 1];
		return d < 0 || (d === 0 && i < j);
	};
	const merged = mergeOrders(chainOrder(flat, 0, a.length / 2), chainOrder(flat, a.length / 2, n), before);
	for (let k = 1; k < merged.length; k++) {
		if (!before(merged[k - 1], merged[k])) return convexHull(flat);
	}
	if (merged.length !== n) return convexHull(flat);
	return monotoneChain(flat, merged);
}

/** Vertex indices [from, to) of a convex CCW polygon inside `flat`, in (x, y) order if it is convex. */
function chainOrder(flat: number[], from: number, to: number): number[] {
	const m = to - from;
	if (m <= 2) {
		const out: number[] = [];
		for (let i = from; i < to; i++) out.push(i);
		return out;
	}
	let lo = from;
	let hi = from;
	for (let i = from + 1; i < to; i++) {
		const dx = flat[2 * i] - flat[2 * lo] || flat[2 * i + 1] - flat[2 * lo + 1];
		if (dx < 0) lo = i;
		const dh = flat[2 * i] - flat[2 * hi] || flat[2 * i + 1] - flat[2 * hi + 1];
		if (dh > 0) hi = i;
	}
	// lower chain: counter-clockwise from the least to the greatest; upper: clockwise
	const lower: number[] = [];
	for (let i = lo; ; i = i + 1 === to ? from : i + 1) {
		lower.push(i);
		if (i === hi) break;
	}
	const upper: number[] = [];
	for (let i = lo === from ? to - 1 : lo - 1; i !== hi; i = i === from ? to - 1 : i - 1) upper.push(i);
	return mergeOrders(lower, upper, (i, j) => {
		const d = flat[2 * i] - flat[2 * j] || flat[2 * i + 1] - flat[2 * j + 1];
		return d < 0 || (d === 0 && i < j);
	});
}

function mergeOrders(x: number[], y: number[], before: (i: number, j: number) => boolean): number[] {
	const out: number[] = [];
	let i = 0;
	let j = 0;
	while (i < x.length && j < y.length) out.push(before(y[j], x[i]) ? y[j++] : x[i++]);
	while (i < x.length) out.push(x[i++]);
	while (j < y.length) out.push(y[j++]);
	return out;
}

/** Index of the lowest (then leftmost) vertex: the start the edge merge needs. */
function bottomIndex(p: number[]): number {
	let best = 0;
	for (let i = 1; i < p.length / 2; i++) {
		const y = p[2 * i + 1];
		const by = p[2 * best + 1];
		if (y < by || (y === by && p[2 * i] < p[2 * best])) best = i;
	}
	return best;
}

/**
 * Minkowski sum of two convex CCW polygons (each may be a point or a segment) by merging their
 * edges in angular order: O(n + m). `negB` sums with −B instead, giving the difference A ⊖ B
 * whose distance from the origin is the distance between A and B.
 */
export function minkowskiSum(a: number[], b: number[], negB = false): number[] {
	const n = a.length / 2;
	const m = b.length / 2;
	const sb = negB ? -1 : 1;
	const ia = bottomIndex(a);
	const ib = negB ? topIndex(b) : bottomIndex(b); // −B's lowest point is B's highest
	const out: number[] = [];
	let i = 0;
	let j = 0;
	let pa = ia;
	let pb = ib;
	while (i < n || j < m) {
		const qa = pa + 1 === n ? 0 : pa + 1;
		const qb = pb + 1 === m ? 0 : pb + 1;
		const ax0 = a[2 * pa];
		const ay0 = a[2 * pa + 1];
		const bx0 = sb * b[2 * pb];
		const by0 = sb * b[2 * pb + 1];
		out.push(ax0 + bx0, ay0 + by0);
		const c = cross(a[2 * qa] - ax0, a[2 * qa + 1] - ay0, sb * b[2 * qb] - bx0, sb * b[2 * qb + 1] - by0);
		let stepA = c >= 0 && i < n;
		let stepB = c <= 0 && j < m;
		if (!stepA && !stepB) {
			// one polygon is exhausted; walk the other
			if (i < n) stepA = true;
			else stepB = true;
		}
		if (stepA) {
			i++;
			pa = qa;
		}
		if (stepB) {
			j++;
			pb = qb;
		}
	}
	return out;
}

/** Index of the highest (then rightmost) vertex: the lowest, leftmost one of the mirrored set. */
function topIndex(p: number[]): number {
	let best = 0;
	for (let i = 1; i < p.length / 2; i++) {
		const y = p[2 * i + 1];
		const by = p[2 * best + 1];
		if (y > by || (y === by && p[2 * i] > p[2 * best])) best = i;
	}
	return best;
}

/** Twice the signed area (positive for CCW). */
export function doubleArea(p: number[]): number {
	const n = p.length / 2;
	let s = 0;
	for (let i = 0, k = n - 1; i < n; k = i++) s += p[2 * k] * p[2 * i + 1] - p[2 * i] * p[2 * k + 1];
	return s;
}

/**
 * Squared distance from (px, py) to the segment, by the very steps pointSegmentDistance takes
 * (so the two agree on which of several segments is nearest, to rounding).
 */
function pointSegmentDistanceSq(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
	const dx = bx - ax;
	const dy = by - ay;
	const len2 = dx * dx + dy * dy;
	let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
	if (t < 0) t = 0;
	else if (t > 1) t = 1;
	const qx = px - (ax + t * dx);
	const qy = py - (ay + t * dy);
	return qx * qx + qy * qy;
}

/**
 * Squared figures within this relative margin of the least are re-measured with Math.hypot:
 * far above the few ulps by which a square and a hypot can disagree on order, so the least
 * hypot over all candidates is always among them (bit for bit what measuring all would give).
 */
const SQ_MARGIN = 1e-9;

/** Reused scratch for squared edge distances (the engine is synchronous and not re-entrant). */
let scratch = new Float64Array(1024);
function scratchOf(n: number): Float64Array {
	if (scratch.length < n) scratch = new Float64Array(Math.max(n, 2 * scratch.length));
	return scratch;
}

/** Signed distance from the point to the convex CCW polygon: negative inside (depth to the edge). */
export function signedDistancePointConvex(px: number, py: number, p: number[]): number {
	const n = p.length / 2;
	if (n === 1) return Math.hypot(px - p[0], py - p[1]);
	let inside = true;
	// squares pick the nearest edges cheaply; only those near the least are measured by hypot
	const sq = scratchOf(n);
	let least = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const x0 = p[2 * k];
		const y0 = p[2 * k + 1];
		const x1 = p[2 * i];
		const y1 = p[2 * i + 1];
		if (cross(x1 - x0, y1 - y0, px - x0, py - y0) < 0) inside = false;
		const e = pointSegmentDistanceSq(px, py, x0, y0, x1, y1);
		sq[i] = e;
		if (e < least) least = e;
	}
	const cut = least * (1 + SQ_MARGIN) + 1e-300;
	let d = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		if (!(sq[i] <= cut)) continue;
		const e = pointSegmentDistance(px, py, p[2 * k], p[2 * k + 1], p[2 * i], p[2 * i + 1]);
		if (e < d) d = e;
	}
	// A flat (zero-area) set has no inside: a point on its line is at distance d, not −d.
	if (inside && n >= 3 && doubleArea(p) > 1e-18) return -d;
	return d;
}

function segmentsCross(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
	const d1 = cross(bx - ax, by - ay, cx - ax, cy - ay);
	const d2 = cross(bx - ax, by - ay, dx - ax, dy - ay);
	const d3 = cross(dx - cx, dy - cy, ax - cx, ay - cy);
	const d4 = cross(dx - cx, dy - cy, bx - cx, by - cy);
	return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

/**
 * Exact signed distance between two rounded convex sets: the edge-to-edge gap when apart, 0 when
 * touching, minus the penetration depth (least translation that separates them) when overlapping.
 */
export function signedDistance(a: Rounded, b: Rounded): number {
	const na = a.pts.length;
	const nb = b.pts.length;
	const rr = a.r + b.r;
	// Closed forms for the common cases (round bases, their sweeps): no allocation.
	if (na === 2 && nb === 2) return Math.hypot(a.pts[0] - b.pts[0], a.pts[1] - b.pts[1]) - rr;
	if (na === 2 && nb === 4) return pointSegmentDistance(a.pts[0], a.pts[1], b.pts[0], b.pts[1], b.pts[2], b.pts[3]) - rr;
	if (na === 4 && nb === 2) return pointSegmentDistance(b.pts[0], b.pts[1], a.pts[0], a.pts[1], a.pts[2], a.pts[3]) - rr;
	if (na === 4 && nb === 4) {
		const [ax, ay, bx, by] = a.pts;
		const [cx, cy, dx, dy] = b.pts;
		if (!segmentsCross(ax, ay, bx, by, cx, cy, dx, dy)) {
			return (
				Math.min(
					pointSegmentDistance(ax, ay, cx, cy, dx, dy),
					pointSegmentDistance(bx, by, cx, cy, dx, dy),
					pointSegmentDistance(cx, cy, ax, ay, bx, by),
					pointSegmentDistance(dx, dy, ax, ay, bx, by)
				) - rr
			);
		}
	}
	// A point against a polygon (a round base against an oval or hull): no Minkowski sum needed.
	if (na === 2) return signedDistancePointConvex(a.pts[0], a.pts[1], b.pts) - rr;
	if (nb === 2) return signedDistancePointConvex(b.pts[0], b.pts[1], a.pts) - rr;
	// A segment against a polygon that it does not meet: the least vertex–edge distance.
	if (na === 4 && nb >= 6) {
		const d = segmentPolygonGap(a.pts, b.pts);
		if (d > 0) return d - rr;
	} else if (nb === 4 && na >= 6) {
		const d = segmentPolygonGap(b.pts, a.pts);
		if (d > 0) return d - rr;
	}
	const m = minkowskiSum(a.pts, b.pts, true);
	return signedDistancePointConvex(0, 0, m) - rr;
}

/** Distance between a segment and a convex CCW polygon, or 0 when they meet. */
function segmentPolygonGap(seg: number[], p: number[]): number {
	const [ax, ay, bx, by] = seg;
	const n = p.length / 2;
	let insideA = true;
	// as in signedDistancePointConvex: squares first, hypot only for those near the least
	const sq = scratchOf(3 * n);
	let least = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const x0 = p[2 * k];
		const y0 = p[2 * k + 1];
		const x1 = p[2 * i];
		const y1 = p[2 * i + 1];
		if (cross(x1 - x0, y1 - y0, ax - x0, ay - y0) < 0) insideA = false;
		if (segmentsCross(ax, ay, bx, by, x0, y0, x1, y1)) return 0;
		const e0 = pointSegmentDistanceSq(ax, ay, x0, y0, x1, y1);
		const e1 = pointSegmentDistanceSq(bx, by, x0, y0, x1, y1);
		const e2 = pointSegmentDistanceSq(x1, y1, ax, ay, bx, by);
		sq[3 * i] = e0;
		sq[3 * i + 1] = e1;
		sq[3 * i + 2] = e2;
		if (e0 < least) least = e0;
		if (e1 < least) least = e1;
		if (e2 < least) least = e2;
	}
	if (insideA && doubleArea(p) > 1e-18) return 0;
	const cut = least * (1 + SQ_MARGIN) + 1e-300;
	let d = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const x0 = p[2 * k];
		const y0 = p[2 * k + 1];
		const x1 = p[2 * i];
		const y1 = p[2 * i + 1];
		let e = Infinity;
		if (sq[3 * i] <= cut) e = Math.min(e, pointSegmentDistance(ax, ay, x0, y0, x1, y1));
		if (sq[3 * i + 1] <= cut) e = Math.min(e, pointSegmentDistance(bx, by, x0, y0, x1, y1));
		if (sq[3 * i + 2] <= cut) e = Math.min(e, pointSegmentDistance(x1, y1, ax, ay, bx, by));
		if (e < d) d = e;
	}
	return d;
}

/** Even–odd point in polygon (outline as a flat ring, closing edge implied). */
export function pointInPolygon(px: number, py: number, ring: number[]): boolean {
	const n = ring.length / 2;
	let inside = false;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const xi = ring[2 * i];
		const yi = ring[2 * i + 1];
		const xk = ring[2 * k];
		const yk = ring[2 * k + 1];
		if (yi > py !== yk > py && px < ((xk - xi) * (py - yi)) / (yk - yi) + xi) inside = !inside;
	}
	return inside;
}

/** Signed distance from a point to a simple polygon's outline: negative inside. */
export function signedDistancePointPolygon(px: number, py: number, ring: number[]): number {
	const n = ring.length / 2;
	const sq = scratchOf(n);
	let least = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const e = pointSegmentDistanceSq(px, py, ring[2 * k], ring[2 * k + 1], ring[2 * i], ring[2 * i + 1]);
		sq[i] = e;
		if (e < least) least = e;
	}
	const cut = least * (1 + SQ_MARGIN) + 1e-300;
	let d = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		if (!(sq[i] <= cut)) continue;
		const e = pointSegmentDistance(px, py, ring[2 * k], ring[2 * k + 1], ring[2 * i], ring[2 * i + 1]);
		if (e < d) d = e;
	}
	return pointInPolygon(px, py, ring) ? -d : d;
}

/**
 * Shrinks a convex CCW polygon by `d` (its erosion by a disk), by clipping with every edge moved
 * inward. Returns the centroid when the polygon is thinner than 2d.
 */
export function erodeConvex(p: number[], d: number): number[] {
	const n = p.length / 2;
	if (n < 3 || d <= 0) return p.slice();
	let poly = p.slice();
	for (let i = 0; i < n && poly.length >= 2; i++) {
		const x0 = p[2 * i];
		const y0 = p[2 * i + 1];
		const x1 = p[(2 * i + 2) % (2 * n)];
		const y1 = p[(2 * i + 3) % (2 * n)];
		const len = Math.hypot(x1 - x0, y1 - y0);
		if (len === 0) continue;
		// inward normal of a CCW edge is its left side
		const nx = -(y1 - y0) / len;
		const ny = (x1 - x0) / len;
		const c = nx * x0 + ny * y0 + d; // keep points with n·q ≥ c
		const next: number[] = [];
		const m = poly.length / 2;
		for (let k = 0; k < m; k++) {
			const ax = poly[2 * k];
			const ay = poly[2 * k + 1];
			const bx = poly[(2 * k + 2) % (2 * m)];
			const by = poly[(2 * k + 3) % (2 * m)];
			const fa = nx * ax + ny * ay - c;
			const fb = nx * bx + ny * by - c;
			if (fa >= 0) next.push(ax, ay);
			if ((fa >= 0) !== (fb >= 0)) {
				const t = fa / (fa - fb);
				next.push(ax + t * (bx - ax), ay + t * (by - ay));
			}
		}
		poly = next;
	}
	if (poly.length < 2) {
		let cx = 0;
		let cy = 0;
		for (let i = 0; i < n; i++) {
			cx += p[2 * i];
			cy += p[2 * i + 1];
		}
		return [cx / n, cy / n];
	}
	return convexHull(poly);
}

/** [lo, hi] ∩= [a, b] helper for interval unions: returns the union's hull. */
function widen(iv: [number, number] | null, a: number, b: number): [number, number] | null {
	if (!(a <= b)) return iv;
	if (!iv) return [a, b];
	return [Math.min(iv[0], a), Math.max(iv[1], b)];
}

/** Parameters t where the point t·(vx, vy) lies in the disk of radius r at (cx, cy). */
function lineDisk(vx: number, vy: number, cx: number, cy: number, r: number): [number, number] | null {
	const a = vx * vx + vy * vy;
	const b = -2 * (vx * cx + vy * cy);
	const c = cx * cx + cy * cy - r * r;
	const disc = b * b - 4 * a * c;
	if (disc < 0) return null;
	const s = Math.sqrt(disc);
	return [(-b - s) / (2 * a), (-b + s) / (2 * a)];
}

/** Cyrus–Beck: parameters t where t·v lies in the convex CCW polygon p (≥3 points, area > 0). */
function lineConvex(vx: number, vy: number, p: number[]): [number, number] | null {
	const n = p.length / 2;
	let lo = -Infinity;
	let hi = Infinity;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const ex = p[2 * i] - p[2 * k];
		const ey = p[2 * i + 1] - p[2 * k + 1];
		if (ex === 0 && ey === 0) continue;
		// inside: cross(e, t·v − p_k) ≥ 0  ⇔  t·cross(e, v) ≥ cross(e, p_k)
		const num = cross(ex, ey, p[2 * k], p[2 * k + 1]);
		const den = cross(ex, ey, vx, vy);
		if (den === 0) {
			if (num > 0) return null;
		} else if (den > 0) lo = Math.max(lo, num / den);
		else hi = Math.min(hi, num / den);
		if (lo > hi) return null;
	}
	return [lo, hi];
}

/** Parameters t where t·v lies within r of the segment (ax, ay)–(bx, by). */
function lineCapsule(vx: number, vy: number, ax: number, ay: number, bx: number, by: number, r: number): [number, number] | null {
	let iv = lineDisk(vx, vy, ax, ay, r);
	const d2 = lineDisk(vx, vy, bx, by, r);
	if (d2) iv = widen(iv, d2[0], d2[1]);
	const len = Math.hypot(bx - ax, by - ay);
	if (len > 0) {
		const ux = (bx - ax) / len;
		const uy = (by - ay) / len;
		const nx = -uy * r;
		const ny = ux * r;
		const rect = [ax - nx, ay - ny, bx - nx, by - ny, bx + nx, by + ny, ax + nx, ay + ny];
		const rc = lineConvex(vx, vy, rect);
		if (rc) iv = widen(iv, rc[0], rc[1]);
	}
	return iv;
}

/**
 * Parameters t (unclamped) where t·v lies in the rounded convex set K ⊕ disk(r). The set is
 * convex, so the answer is one interval: the hull of its pieces (polygon, edge capsules).
 */
export function lineRoundedConvex(vx: number, vy: number, k: number[], r: number): [number, number] | null {
	const n = k.length / 2;
	let iv: [number, number] | null = null;
	if (n >= 3 && doubleArea(k) > 1e-18) {
		const c = lineConvex(vx, vy, k);
		if (c) iv = widen(iv, c[0], c[1]);
	} else if (r === 0 && n >= 2) {
		// a flat set: the line meets it in a point (a crossing, which still matters) or along it
		const h = convexHull(k);
		if (h.length === 4) {
			const c = lineCapsule(vx, vy, h[0], h[1], h[2], h[3], 0);
			if (c) iv = widen(iv, c[0], c[1]);
			const ex = h[2] - h[0];
			const ey = h[3] - h[1];
			const den = cross(vx, vy, ex, ey);
			if (den !== 0) {
				const t = cross(h[0], h[1], ex, ey) / den;
				const u = cross(h[0], h[1], vx, vy) / den;
				if (u >= 0 && u <= 1) iv = widen(iv, t, t);
			}
		}
	}
	if (r > 0) {
		if (n === 1) {
			const d = lineDisk(vx, vy, k[0], k[1], r);
			if (d) iv = widen(iv, d[0], d[1]);
		}
		for (let i = 0, j = n - 1; n >= 2 && i < n; j = i++) {
			const c = lineCapsule(vx, vy, k[2 * j], k[2 * j + 1], k[2 * i], k[2 * i + 1], r);
			if (c) iv = widen(iv, c[0], c[1]);
			if (n === 2) break;
		}
	}
	return iv;
}

export interface Box {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

export function boxOf(pts: number[], r = 0): Box {
	let minX = Infinity;
	let minY = Infinity;
	let maxX = -Infinity;
	let maxY = -Infinity;
	for (let i = 0; i < pts.length; i += 2) {
		const x = pts[i];
		const y = pts[i + 1];
		if (x < minX) minX = x;
		if (x > maxX) maxX = x;
		if (y < minY) minY = y;
		if (y > maxY) maxY = y;
	}
	return { minX: minX - r, minY: minY - r, maxX: maxX + r, maxY: maxY + r };
}

export function boxesMeet(a: Box, b: Box, margin = 0): boolean {
	return a.minX - margin <= b.maxX && b.minX - margin <= a.maxX && a.minY - margin <= b.maxY && b.minY - margin <= a.maxY;
}
