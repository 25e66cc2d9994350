// Terrain on the table: outlines as polygons, ruin walls as segments. Answers whether a (swept)
// footprint meets a region, crosses a wall, overhangs an outline, and over which part of a
// straight sweep it touches a block (for the climb cost).
import type { TerrainIn } from '../schemas/check';
import { boxOf, boxesMeet, lineRoundedConvex, minkowskiSum, pointInPolygon, signedDistance, signedDistancePointPolygon, type Box, type Rounded } from './convex';

export interface PreparedTerrain {
	id: string;
	kind: TerrainIn['kind'];
	/** outline as a flat ring */
	ring: number[];
	box: Box;
	heightIn: number;
	/** wall segments as [x0, y0, x1, y1] */
	walls: number[][];
	wallBox: Box | null;
}

export function prepareTerrain(t: TerrainIn): PreparedTerrain {
	const ring: number[] = [];
	for (const [x, y] of t.outline) ring.push(x, y);
	// a repeated closing point would add a zero-length edge; drop it
	if (ring.length >= 4 && ring[0] === ring[ring.length - 2] && ring[1] === ring[ring.length - 1]) ring.length -= 2;
	const walls: number[][] = [];
	if (t.kind === 'ruin') {
		for (const line of t.walls ?? []) {
			for (let i = 1; i < line.length; i++) walls.push([line[i - 1][0], line[i - 1][1], line[i][0], line[i][1]]);
		}
	}
	const wallPts = walls.flat();
	return {
		id: t.id,
		kind: t.kind,
		ring,
		box: boxOf(ring),
		heightIn: t.kind === 'block' ? t.height : 0,
		walls,
		wallBox: wallPts.length ? boxOf(wallPts) : null
	};
}

function edge(ring: number[], i: number): number[] {
	const n = ring.length / 2;
	const k = (i + 1) % n;
	return [ring[2 * i], ring[2 * i + 1], ring[2 * k], ring[2 * k + 1]];
}

function edgeBox(e: number[]): Box {
	return { minX: Math.min(e[0], e[2]), minY: Math.min(e[1], e[3]), maxX: Math.max(e[0], e[2]), maxY: Math.max(e[1], e[3]) };
}

/** Least distance from the set to the outline's boundary (no sign), or Infinity beyond `reach`. */
function distanceToOutline(s: Rounded, sBox: Box, ring: number[], reach: number): number {
	let d = Infinity;
	const n = ring.length / 2;
	for (let i = 0; i < n; i++) {
		const e = edge(ring, i);
		if (!boxesMeet(sBox, edgeBox(e), reach)) continue;
		const v = signedDistance(s, { pts: e, r: 0 });
		if (v < d) d = v;
	}
	return d;
}

/** Whether the set meets the closed region of the outline. */
export function meetsRegion(s: Rounded, t: PreparedTerrain, sBox = boxOf(s.pts, s.r)): boolean {
	if (!boxesMeet(sBox, t.box)) return false;
	if (distanceToOutline(s, sBox, t.ring, 0) <= 0) return true;
	// no boundary contact: either wholly inside or wholly apart
	return pointInPolygon(s.pts[0], s.pts[1], t.ring);
}

/** Edge-to-edge distance from the set to the region: 0 when they meet. */
export function distanceToRegion(s: Rounded, t: PreparedTerrain): number {
	if (meetsRegion(s, t)) return 0;
	return Math.max(0, distanceToOutline(s, boxOf(s.pts, s.r), t.ring, Infinity));
}

/** The first wall segment of a ruin that the set meets, or null. */
export function wallMet(s: Rounded, t: PreparedTerrain, sBox = boxOf(s.pts, s.r)): number[] | null {
	if (!t.wallBox || !boxesMeet(sBox, t.wallBox)) return null;
	for (const w of t.walls) {
		if (!boxesMeet(sBox, edgeBox(w))) continue;
		if (signedDistance(s, { pts: w, r: 0 }) <= 0) return w;
	}
	return null;
}

/**
 * How far a placed footprint reaches beyond the outline, given that its inner form meets the
 * region: 0 when it lies wholly within (up to ε). Exact for round bases and for hulls whose
 * farthest-out point is a vertex; ovals to their polygon's accuracy.
 */
export function overhangOf(inner: Rounded, outer: Rounded, t: PreparedTerrain): number {
	// the inner form touching the outline's boundary is what makes it an overhang beyond ε
	const innerBox = boxOf(inner.pts, inner.r);
	if (distanceToOutline(inner, innerBox, t.ring, 0) > 0) return 0;
	let worst = -Infinity;
	for (let i = 0; i < outer.pts.length; i += 2) {
		const v = signedDistancePointPolygon(outer.pts[i], outer.pts[i + 1], t.ring) + outer.r;
		if (v > worst) worst = v;
	}
	return Math.max(0, worst);
}

/**
 * The parameters t ∈ [0, 1] at which `s` translated by t·(dx, dy) meets the region, as sorted
 * disjoint closed intervals. Exact: each outline edge is met over one interval (line against the
 * convex set edge ⊕ −s), and between those the set is wholly inside or wholly outside.
 */
export function touchIntervals(s: Rounded, dx: number, dy: number, t: PreparedTerrain): [number, number][] {
	if (dx === 0 && dy === 0) return meetsRegion(s, t) ? [[0, 1]] : [];
	const sweepBox = boxOf(s.pts.concat(s.pts.map((v, i) => v + (i % 2 ? dy : dx))), s.r);
	if (!boxesMeet(sweepBox, t.box)) return [];
	const raw: [number, number][] = [];
	const n = t.ring.length / 2;
	for (let i = 0; i < n; i++) {
		const e = edge(t.ring, i);
		if (!boxesMeet(sweepBox, edgeBox(e))) continue;
		const k = minkowskiSum(e, s.pts, true);
		const iv = lineRoundedConvex(dx, dy, k, s.r);
		if (!iv) continue;
		const lo = Math.max(0, iv[0]);
		const hi = Math.min(1, iv[1]);
		if (lo <= hi) raw.push([lo, hi]);
	}
	raw.sort((a, b) => a[0] - b[0]);
	const merged: [number, number][] = [];
	for (const iv of raw) {
		const last = merged[merged.length - 1];
		if (last && iv[0] <= last[1]) last[1] = Math.max(last[1], iv[1]);
		else merged.push([iv[0], iv[1]]);
	}
	// fill the gaps (and the ends) where the set is wholly inside the outline
	const out: [number, number][] = [];
	let cursor = 0;
	const inside = (a: number, b: number) => {
		const m = (a + b) / 2;
		return pointInPolygon(s.pts[0] + m * dx, s.pts[1] + m * dy, t.ring);
	};
	for (const iv of merged) {
		if (iv[0] > cursor && inside(cursor, iv[0])) pushJoin(out, cursor, iv[0]);
		pushJoin(out, iv[0], iv[1]);
		cursor = iv[1];
	}
	if (cursor < 1 && inside(cursor, 1)) pushJoin(out, cursor, 1);
	return out;
}

function pushJoin(out: [number, number][], a: number, b: number): void {
	const last = out[out.length - 1];
	if (last && a <= last[1]) last[1] = Math.max(last[1], b);
	else out.push([a, b]);
}
