// A dragged path to the waypoints a move is checked and logged with: Ramer–Douglas–Peucker
// within 0.1 in, keeping every point where the player added a turn (a facing change).
// Pure, shared by the play screen and the tests.

export interface TracePoint {
	x: number;
	y: number;
	/** set where the player turned the piece: the facing after the turn, degrees */
	facing?: number;
}

/** How far (in) a simplified path may stray from what was dragged. */
export const SIMPLIFY_TOLERANCE_IN = 0.1;

function segmentDistance(p: TracePoint, a: TracePoint, b: TracePoint): number {
	const dx = b.x - a.x;
	const dy = b.y - a.y;
	const len2 = dx * dx + dy * dy;
	let t = len2 > 0 ? ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2 : 0;
	t = Math.max(0, Math.min(1, t));
	return Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

/** Ramer–Douglas–Peucker on one stretch (first and last kept), iterative so long drags cannot overflow the stack. */
export function rdp(points: TracePoint[], toleranceIn = SIMPLIFY_TOLERANCE_IN): TracePoint[] {
	if (points.length <= 2) return points.slice();
	const keep = new Uint8Array(points.length);
	keep[0] = 1;
	keep[points.length - 1] = 1;
	const stack: [number, number][] = [[0, points.length - 1]];
	while (stack.length) {
		const [i, j] = stack.pop()!;
		let worst = -1;
		let worstD = toleranceIn;
		for (let k = i + 1; k < j; k++) {
			const d = segmentDistance(points[k], points[i], points[j]);
			if (d > worstD) {
				worstD = d;
				worst = k;
			}
		}
		if (worst > 0) {
			keep[worst] = 1;
			stack.push([i, worst], [worst, j]);
		}
	}
	return points.filter((_, k) => keep[k] === 1);
}

/**
 * The waypoints of a move from a trace that starts at the piece's position: the start itself
 * is dropped (a path begins at the piece), turn points always stay, repeated points go.
 */
export function simplifyTrace(trace: TracePoint[], toleranceIn = SIMPLIFY_TOLERANCE_IN): TracePoint[] {
	if (trace.length === 0) return [];
	const out: TracePoint[] = [];
	let from = 0;
	for (let k = 1; k < trace.length; k++) {
		if (trace[k].facing !== undefined || k === trace.length - 1) {
			const part = rdp(trace.slice(from, k + 1), toleranceIn);
			out.push(...(out.length ? part.slice(1) : part));
			from = k;
		}
	}
	if (out.length === 0) out.push(trace[0]);
	// Drop the start (unless the piece turned on the spot first) and any point that repeats the
	// one before it without turning.
	const result: TracePoint[] = out[0].facing !== undefined ? [out[0]] : [];
	let prev = out[0];
	for (let k = 1; k < out.length; k++) {
		const p = out[k];
		const same = Math.hypot(p.x - prev.x, p.y - prev.y) < 1e-9;
		if (!same || p.facing !== undefined) result.push(p);
		prev = p;
	}
	// A piece put back where it stood still names its end, so the engine sees a path.
	if (result.length === 0) result.push({ x: trace[trace.length - 1].x, y: trace[trace.length - 1].y });
	return result;
}
