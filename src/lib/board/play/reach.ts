// The play screen's side of the route finder, pure: the finder's request for one picked-up piece
// (built from the same table the live check sees), the reach map and the route as board overlays,
// the words of a route and of the nearest-legal offer, the live check's spacing breaks, and the
// submitted path of a piece whose route came from the finder (kept verbatim, never simplified).
import type { NearestResult, ReachMap, RouteRequest, RouteResult } from '../../referee/route';
import type { Finding, MoveKind, Profile, Waypoint } from '../../schemas/check';
import type { GamePiece } from '../../schemas/game';
import type { Layout } from '../../schemas/layout';
import type { Overlay, Tone } from '../types';
import { checkRequestFor } from './check-request';
import { simplifyTrace, type TracePoint } from './simplify';

/** "6" for a whole number of inches, else "6.50": allowances as players say them. */
export function limitText(v: number): string {
	return Number.isInteger(v) ? String(v) : v.toFixed(2);
}

export interface Pick {
	pieceId: string;
	kind: MoveKind;
	/** the dash's rolled die */
	die?: number;
	/** where unit-mates stand at the ends of their draft paths */
	placed?: Record<string, { x: number; y: number; facing?: number }>;
}

/** The route finder's question for one piece: the check's table without the move. */
export function routeRequestFor(layout: Layout, profile: Profile, pieces: readonly GamePiece[], pick: Pick): RouteRequest {
	const piece = pieces.find((p) => p.id === pick.pieceId);
	if (!piece) throw new Error(`no piece "${pick.pieceId}"`);
	const { profile: prof, board, pieces: enginePieces } = checkRequestFor(layout, profile, pieces, { unit: piece.unit, kind: pick.kind, die: pick.die });
	const req: RouteRequest = { table: { profile: prof, board, pieces: enginePieces }, pieceId: pick.pieceId, kind: pick.kind };
	if (pick.kind === 'dash') req.die = pick.die;
	if (pick.placed && Object.keys(pick.placed).length) req.placed = pick.placed;
	return req;
}

/**
 * What a reach map depends on, as a string: the piece, the move kind and die, where every piece
 * stands (a ruling or a move elsewhere changes the table) and where unit-mates are placed.
 */
export function pickKey(pieces: readonly GamePiece[], pick: Pick): string {
	const at = pieces.map((p) => (p.at ? `${p.id}@${p.at.x},${p.at.y},${p.at.facing ?? 0}` : p.id)).join(';');
	const placed = Object.entries(pick.placed ?? {})
		.sort(([a], [b]) => (a < b ? -1 : 1))
		.map(([id, q]) => `${id}@${q.x},${q.y},${q.facing ?? 0}`)
		.join(';');
	return `${pick.pieceId}|${pick.kind}|${pick.die ?? ''}|${placed}|${at}`;
}

/** Signed area of a flat ring [x0, y0, x1, y1, …] (positive counter-clockwise). */
export function ringArea(ring: readonly number[]): number {
	let a = 0;
	const n = ring.length / 2;
	for (let i = 0; i < n; i++) {
		const k = (i + 1) % n;
		a += ring[2 * i] * ring[2 * k + 1] - ring[2 * k] * ring[2 * i + 1];
	}
	return a / 2;
}

const ringPoints = (ring: readonly number[]) => {
	const out: { x: number; y: number }[] = [];
	for (let i = 0; i < ring.length; i += 2) out.push({ x: ring[i], y: ring[i + 1] });
	return out;
};

/**
 * A reach map as overlays. The picked piece's map is shaded (outer rings filled) with a dashed
 * edge; its holes (where the piece may not end, e.g. round an enemy) get a dashed signal edge,
 * since the overlay list fills each ring on its own and cannot cut them out. Other maps of the
 * unit are dashed outlines only, so several read at once.
 */
export function reachShading(map: ReachMap, opts: { shaded: boolean; tone?: Tone }): Overlay[] {
	const tone = opts.tone ?? 'ok';
	const out: Overlay[] = [];
	for (const ring of map.rings) {
		if (ring.length < 6) continue;
		const hole = ringArea(ring) < 0;
		out.push({ kind: 'path', points: ringPoints(ring), tone: hole ? 'signal' : tone, dashed: true, closed: true, fill: opts.shaded && !hole });
	}
	return out;
}

/** "5.84 in of 6" for a route within reach; otherwise why there is none, in words. */
export function routeWords(route: RouteResult): string {
	const w = routeParts(route);
	return `${w.cost ?? ''}${w.rest}`;
}

/** The same words as the cost (null when there is none) and what follows it, for a screen that sets the figure apart. */
export function routeParts(route: RouteResult): { cost: string | null; rest: string } {
	if (route.reachable) return { cost: route.costIn.toFixed(2), rest: ` in of ${limitText(route.allowanceIn)}` };
	if (route.costIn < Infinity && route.endLegal) return { cost: route.costIn.toFixed(2), rest: ` in of ${limitText(route.allowanceIn)} — too far` };
	return { cost: null, rest: route.reason ?? 'no legal route ends here' };
}

/**
 * The route from the piece's start to the finger as overlays: the line (dashed signal when it is
 * not a legal route) and, unless `label` is false (the dragged path's own label says the same), its cost.
 */
export function routeShading(start: { x: number; y: number }, route: RouteResult, opts: { label?: boolean } = {}): Overlay[] {
	if (!route.waypoints.length) return [];
	const points = [{ x: start.x, y: start.y }, ...route.waypoints.map((w) => ({ x: w.x, y: w.y }))];
	const end = points[points.length - 1];
	const out: Overlay[] = [{ kind: 'path', points, tone: route.reachable ? 'ink' : 'signal', dashed: !route.reachable, arrow: true }];
	if (opts.label ?? true) out.push({ kind: 'label', x: end.x, y: end.y + 1.2, text: `route ${routeWords(route)}`, tone: route.reachable ? 'ink' : 'signal' });
	return out;
}

export type Offer =
	| { piece: string; kind: 'spot'; at: { x: number; y: number }; distanceIn: number; waypoints: Waypoint[] }
	| { piece: string; kind: 'none' };

/** What to offer after a drop: nothing when the drop is in reach, the nearest legal end otherwise. */
export function offerFor(piece: string, nearest: NearestResult, toleranceIn = 1e-6): Offer | null {
	if (!nearest.at || !nearest.route || !nearest.route.reachable) return { piece, kind: 'none' };
	if (nearest.distanceIn <= toleranceIn) return null;
	return { piece, kind: 'spot', at: nearest.at, distanceIn: nearest.distanceIn, waypoints: nearest.route.waypoints.map((w) => ({ x: w.x, y: w.y })) };
}

/** The button's words: "Move to nearest legal spot (1.23 in away)". */
export function offerWords(o: Offer): string {
	return o.kind === 'spot' ? `Move to nearest legal spot (${o.distanceIn.toFixed(2)} in away)` : `No legal end for ${o.piece} within its allowance`;
}

/**
 * The path a piece is submitted with: its first `fixed` trace points after the start are the
 * finder's route, kept verbatim (simplifying could cut a corner round an obstacle); whatever was
 * dragged or turned after them is simplified as usual.
 */
export function pathWith(trace: readonly TracePoint[], fixed = 0): Waypoint[] {
	if (trace.length < 2) return [];
	const k = Math.min(fixed, trace.length - 1);
	if (k <= 0) return simplifyTrace([...trace]);
	const head = trace.slice(1, k + 1).map((t) => ({ ...t }));
	const rest = trace.slice(k);
	return rest.length > 1 ? [...head, ...simplifyTrace(rest)] : head;
}

export interface SpacingBreak {
	piece: string;
	measuredIn: number;
	limitIn: number;
	message: string;
}

/**
 * The live check's spacing findings, one per piece they name (the engine's verdict, not ours):
 * a piece short of unit-mates in range names itself; a group cut off names all its pieces.
 */
export function spacingBreaks(findings: readonly Finding[]): SpacingBreak[] {
	const out: SpacingBreak[] = [];
	for (const f of findings) {
		if (f.code !== 'spacing' || f.severity === 'warning') continue;
		for (const piece of f.pieces) if (!out.some((b) => b.piece === piece)) out.push({ piece, measuredIn: f.measured, limitIn: f.limit, message: f.message });
	}
	return out;
}
