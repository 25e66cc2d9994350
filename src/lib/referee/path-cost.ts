// The cost of a path: horizontal length of the reference point's polyline, plus pivots (the arc
// travelled by the farthest point, or a fixed cost per pivot), plus every inch climbed up and down.
import type { Profile } from '../schemas/check';

export interface PoseDeg {
	x: number;
	y: number;
	facingDeg: number;
}

/** One leg of a path: a straight translation at fixed facing, or a turn on the spot. */
export type PathStep =
	| { kind: 'move'; from: PoseDeg; dx: number; dy: number; lengthIn: number }
	| { kind: 'pivot'; from: PoseDeg; deltaDeg: number };

/** The signed shorter turn from one facing to another, in (−180, 180] degrees. */
export function angleDeltaDeg(fromDeg: number, toDeg: number): number {
	let d = (toDeg - fromDeg) % 360;
	if (d > 180) d -= 360;
	else if (d <= -180) d += 360;
	return d;
}

/**
 * The legs of a path from `start` through the waypoints: the piece travels to each waypoint at
 * its current facing, then turns there to the waypoint's facing if one is given.
 */
export function pathSteps(start: { x: number; y: number; facing?: number }, waypoints: { x: number; y: number; facing?: number }[]): PathStep[] {
	const steps: PathStep[] = [];
	let cur: PoseDeg = { x: start.x, y: start.y, facingDeg: start.facing ?? 0 };
	for (const w of waypoints) {
		const dx = w.x - cur.x;
		const dy = w.y - cur.y;
		if (dx !== 0 || dy !== 0) {
			steps.push({ kind: 'move', from: cur, dx, dy, lengthIn: Math.hypot(dx, dy) });
			cur = { x: w.x, y: w.y, facingDeg: cur.facingDeg };
		}
		if (w.facing !== undefined) {
			const delta = angleDeltaDeg(cur.facingDeg, w.facing);
			if (delta !== 0) steps.push({ kind: 'pivot', from: cur, deltaDeg: delta });
			cur = { x: cur.x, y: cur.y, facingDeg: w.facing };
		}
	}
	return steps;
}

/** Where the path leaves the piece. */
export function endPose(start: { x: number; y: number; facing?: number }, waypoints: { x: number; y: number; facing?: number }[]): PoseDeg {
	let f = start.facing ?? 0;
	for (const w of waypoints) if (w.facing !== undefined) f = w.facing;
	const last = waypoints[waypoints.length - 1];
	return last ? { x: last.x, y: last.y, facingDeg: f } : { x: start.x, y: start.y, facingDeg: f };
}

export function horizontalIn(steps: PathStep[]): number {
	let s = 0;
	for (const st of steps) if (st.kind === 'move') s += st.lengthIn;
	return s;
}

/** Pivot cost: free for round bases; r_max × |Δθ| in radians, or the profile's fixed cost. */
export function pivotIn(steps: PathStep[], rMaxIn: number, round: boolean, profile: Pick<Profile, 'pivot' | 'pivotFixedIn'>): number {
	if (round) return 0;
	let s = 0;
	for (const st of steps) {
		if (st.kind !== 'pivot') continue;
		s += profile.pivot === 'fixed' ? profile.pivotFixedIn : (rMaxIn * Math.abs(st.deltaDeg) * Math.PI) / 180;
	}
	return s;
}

/** A stretch of the path's timeline (step index + fraction) during which a block is touched. */
export interface Touch {
	from: number;
	to: number;
	heightIn: number;
}

/**
 * Inches climbed up and down: the piece stands at the height of the tallest block its footprint
 * touches, so the cost is the total variation of that level over the path. A path that starts
 * on a block pays nothing to be there; one that ends on a block pays only the way up.
 */
export function climbIn(touches: Touch[], endTime: number): number {
	if (touches.length === 0) return 0;
	const times = new Set<number>([0, endTime]);
	for (const t of touches) {
		times.add(t.from);
		times.add(t.to);
	}
	const sorted = [...times].filter((t) => t >= 0 && t <= endTime).sort((a, b) => a - b);
	const level = (time: number) => {
		let h = 0;
		for (const t of touches) if (t.from <= time && time <= t.to && t.heightIn > h) h = t.heightIn;
		return h;
	};
	let total = 0;
	let prev = level(sorted[0]);
	for (let i = 1; i < sorted.length; i++) {
		const mid = level((sorted[i - 1] + sorted[i]) / 2);
		const at = level(sorted[i]);
		total += Math.abs(mid - prev) + Math.abs(at - mid);
		prev = at;
	}
	return total;
}
