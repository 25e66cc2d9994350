// Where a piece may be put down at deployment: wholly inside one of its side's deployment zones
// (or on the table when the layout gives that side none), and on nobody else's footprint.
import { footprintDistance, placedFootprint } from '../../referee/distance';
import type { FootprintIn } from '../../schemas/check';
import type { Pose } from '../../schemas/game';

type Ring = readonly (readonly [number, number])[];

function inside(px: number, py: number, ring: Ring): boolean {
	let hit = false;
	for (let i = 0, k = ring.length - 1; i < ring.length; k = i++) {
		const [xi, yi] = ring[i];
		const [xk, yk] = ring[k];
		if (yi > py !== yk > py && px < ((xk - xi) * (py - yi)) / (yk - yi) + xi) hit = !hit;
	}
	return hit;
}

function edgeDistance(px: number, py: number, ring: Ring): number {
	let d = Infinity;
	for (let i = 0, k = ring.length - 1; i < ring.length; k = i++) {
		const [ax, ay] = ring[k];
		const [bx, by] = ring[i];
		const dx = bx - ax;
		const dy = by - ay;
		const len2 = dx * dx + dy * dy;
		const t = len2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2)) : 0;
		d = Math.min(d, Math.hypot(px - (ax + t * dx), py - (ay + t * dy)));
	}
	return d;
}

/**
 * Whether the footprint lies wholly inside the outline (within the tolerance). The placed
 * footprint is a convex polygon grown by a radius, so every corner must sit at least that
 * radius inside: exact for convex zones, which is what deployment zones are drawn as.
 */
export function footprintInside(fp: FootprintIn, pose: Pose, ring: Ring, toleranceIn: number): boolean {
	const shape = placedFootprint(fp, pose, toleranceIn);
	for (let i = 0; i < shape.pts.length; i += 2) {
		const x = shape.pts[i];
		const y = shape.pts[i + 1];
		const d = edgeDistance(x, y, ring);
		const signed = inside(x, y, ring) ? -d : d; // negative inside
		if (signed > -shape.r + toleranceIn) return false;
	}
	return true;
}

export function boardRing(board: { width: number; depth: number }): [number, number][] {
	return [
		[0, 0],
		[board.width, 0],
		[board.width, board.depth],
		[0, board.depth]
	];
}

/** Whether two placed footprints overlap by more than the tolerance (touching is allowed). */
export function overlaps(a: FootprintIn, pa: Pose, b: FootprintIn, pb: Pose, toleranceIn: number): boolean {
	return footprintDistance(a, pa, b, pb) < -toleranceIn;
}
