// Reference move check: the rules of rules-engine.md and the JSON contract of referee-api.md,
// written plainly on JSTS (every pair measured with DistanceOp, no index) as a second opinion.
//
// It is deliberately slow and simple and shares no code with src/lib/referee: footprints are
// fine polygons, a path is swept as a list of polygons, and every piece is checked against
// every other piece and every terrain piece. Where the specification leaves a choice open the
// reading taken here is written beside the rule (see also READINGS below).
import 'jsts/org/locationtech/jts/monkey.js';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import Coordinate from 'jsts/org/locationtech/jts/geom/Coordinate.js';
import DistanceOp from 'jsts/org/locationtech/jts/operation/distance/DistanceOp.js';

// ---------------------------------------------------------------------------------------------
// The contract, typed here rather than imported so this file is a reading of the docs alone.

export type Side = string;
export type PieceClass = 'foot' | 'beast' | 'swarm' | 'mounted' | 'vehicle' | 'monster';
export type MoveKind = 'hold' | 'move' | 'dash' | 'withdraw';
export type Xy = [number, number];

export type Footprint =
	| { shape: 'round'; diameterMm: number }
	| { shape: 'oval'; lengthMm: number; widthMm: number }
	| { shape: 'hull'; points: Xy[] };

export interface Pose {
	x: number;
	y: number;
	facing?: number;
}

export interface PieceIn {
	id: string;
	side: Side;
	unit: string;
	class: PieceClass;
	flies?: boolean;
	allowance: number;
	footprint: Footprint;
	at: Pose;
	value?: number;
	ring?: { radius: number };
}

export type TerrainIn =
	| { id: string; kind: 'block'; outline: Xy[]; height: number }
	| { id: string; kind: 'ruin'; outline: Xy[]; walls?: Xy[][] }
	| { id: string; kind: 'impassable'; outline: Xy[] }
	| { id: string; kind: 'area'; outline: Xy[] };

export interface Profile {
	keepOut: number;
	spacing: number;
	largeUnit: number;
	largeUnitNeighbours: number;
	tolerance: number;
	objectiveRange: number;
	markerMm: number;
}

export interface RefRequest {
	profile?: Partial<Profile>;
	board: {
		width: number;
		depth: number;
		terrain?: TerrainIn[];
		objectives?: { id: string; x: number; y: number }[];
	};
	pieces: PieceIn[];
	move: {
		unit: string;
		kind: MoveKind;
		die?: number;
		paths?: Record<string, Pose[]>;
	};
}

export type FindingCode =
	| 'over-allowance'
	| 'locked'
	| 'not-in-contact'
	| 'through-enemy'
	| 'enters-keep-out'
	| 'bulky-through-bulky'
	| 'wall-blocked'
	| 'climb-blocked'
	| 'impassable'
	| 'off-board'
	| 'ends-overlapping'
	| 'ends-in-keep-out'
	| 'overhang'
	| 'spacing';

export interface Finding {
	code: FindingCode;
	severity: 'error' | 'warning';
	pieces: string[];
	measured: number;
	limit: number;
	message: string;
}

export interface RefReport {
	verdict: 'legal' | 'illegal';
	pieces: Record<string, { cost: number; allowance: number; findings: Finding[] }>;
	findings: Finding[];
	summaries: {
		objectives: { id: string; pieces: string[]; value: Record<string, number> }[];
		rings: { source: string; covers: string[]; lost: string[] }[];
	};
}

// ---------------------------------------------------------------------------------------------
// Settings of the "Table Standard" profile, copied from the docs rather than from the engine.

export const DEFAULT_PROFILE: Profile = {
	keepOut: 1,
	spacing: 2,
	largeUnit: 7,
	largeUnitNeighbours: 2,
	tolerance: 0.005,
	objectiveRange: 3,
	markerMm: 40
};

// Exact by definition of the international inch (NIST SP 811, appendix B).
export const MM_PER_IN = 25.4;

// 256 vertices with the radius corrected (below) keeps a polygonised circle within
// r·(π/256)²/4 ≈ 4e-5·r of the true one, far inside the 0.001 in agreement we want.
const CURVE_VERTICES = 256;
// Buffers of a path segment: 64 segments per quarter circle (≈ 7.5e-5·r short of the arc).
const BUFFER_QUADRANT_SEGMENTS = 64;
// A pivot is swept as copies of the footprint every 1.5°; the gap between copies near the
// farthest point is r_max·(1 − cos 0.75°) ≈ 9e-5·r_max.
const PIVOT_STEP_DEG = 1.5;

const CLIMBERS = new Set<PieceClass>(['foot', 'beast', 'swarm']);
const WALL_WALKERS = new Set<PieceClass>(['foot', 'beast']);
const BULKY = new Set<PieceClass>(['vehicle', 'monster']);

// ---------------------------------------------------------------------------------------------
// Geometry on JSTS.

// JSTS ships no useful typings; its objects are handled as opaque values here.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Geom = any;

const gf = new GeometryFactory();

function coord(p: Xy): Geom {
	return new Coordinate(p[0], p[1]);
}

function polygon(points: Xy[]): Geom {
	const ring = [...points, points[0]].map(coord);
	return gf.createPolygon(gf.createLinearRing(ring));
}

function rotate(p: Xy, deg: number): Xy {
	const t = (deg * Math.PI) / 180;
	const c = Math.cos(t);
	const s = Math.sin(t);
	return [p[0] * c - p[1] * s, p[0] * s + p[1] * c];
}

/** Outline of a footprint in its own frame (inches, reference point at the origin). */
function localOutline(fp: Footprint): Xy[] {
	if (fp.shape === 'hull') return fp.points.map((p) => [p[0], p[1]] as Xy);
	const a = fp.shape === 'round' ? fp.diameterMm / 2 / MM_PER_IN : fp.lengthMm / 2 / MM_PER_IN;
	const b = fp.shape === 'round' ? a : fp.widthMm / 2 / MM_PER_IN;
	// Vertices slightly outside the curve so chord midpoints fall slightly inside: the polygon
	// then straddles the true curve instead of lying wholly inside it.
	const k = 2 / (1 + Math.cos(Math.PI / CURVE_VERTICES));
	const pts: Xy[] = [];
	for (let i = 0; i < CURVE_VERTICES; i++) {
		const t = (2 * Math.PI * i) / CURVE_VERTICES;
		pts.push([k * a * Math.cos(t), k * b * Math.sin(t)]);
	}
	return pts;
}

function placedOutline(fp: Footprint, x: number, y: number, facing: number): Xy[] {
	return localOutline(fp).map((p) => {
		const r = rotate(p, facing);
		return [r[0] + x, r[1] + y] as Xy;
	});
}

function footprintAt(fp: Footprint, x: number, y: number, facing: number): Geom {
	return polygon(placedOutline(fp, x, y, facing));
}

/** Radius of the farthest point of the footprint from its reference point, in inches. */
function farthestRadius(fp: Footprint): number {
	if (fp.shape === 'round') return fp.diameterMm / 2 / MM_PER_IN;
	if (fp.shape === 'oval') return Math.max(fp.lengthMm, fp.widthMm) / 2 / MM_PER_IN;
	return Math.max(...fp.points.map((p) => Math.hypot(p[0], p[1])));
}

function isConvex(points: Xy[]): boolean {
	let sign = 0;
	for (let i = 0; i < points.length; i++) {
		const a = points[i];
		const b = points[(i + 1) % points.length];
		const c = points[(i + 2) % points.length];
		const cross = (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
		if (Math.abs(cross) < 1e-12) continue;
		if (sign === 0) sign = Math.sign(cross);
		else if (Math.sign(cross) !== sign) return false;
	}
	return true;
}

function convexHullOf(points: Xy[]): Geom {
	return gf.createMultiPointFromCoords(points.map(coord)).convexHull();
}

/**
 * The region a footprint covers while translated from one point to another at a fixed facing,
 * as a list of polygons whose union is that region.
 */
function sweepTranslation(fp: Footprint, from: Xy, to: Xy, facing: number): Geom[] {
	if (fp.shape === 'round') {
		const r = fp.diameterMm / 2 / MM_PER_IN;
		if (from[0] === to[0] && from[1] === to[1]) return [footprintAt(fp, from[0], from[1], 0)];
		return [gf.createLineString([coord(from), coord(to)]).buffer(r, BUFFER_QUADRANT_SEGMENTS)];
	}
	const a = placedOutline(fp, from[0], from[1], facing);
	const b = placedOutline(fp, to[0], to[1], facing);
	// A convex outline sweeps exactly the convex hull of its two ends.
	if (fp.shape === 'oval' || isConvex(fp.points)) return [convexHullOf([...a, ...b])];
	// A concave hull: both ends plus the strip each edge sweeps.
	const parts: Geom[] = [polygon(a), polygon(b)];
	for (let i = 0; i < a.length; i++) {
		const j = (i + 1) % a.length;
		parts.push(convexHullOf([a[i], a[j], b[i], b[j]]));
	}
	return parts;
}

/** The region covered while pivoting in place, as copies every PIVOT_STEP_DEG degrees. */
function sweepPivot(fp: Footprint, at: Xy, fromDeg: number, turnDeg: number): Geom[] {
	const steps = Math.max(1, Math.ceil(Math.abs(turnDeg) / PIVOT_STEP_DEG));
	const parts: Geom[] = [];
	for (let i = 0; i <= steps; i++) {
		parts.push(footprintAt(fp, at[0], at[1], fromDeg + (turnDeg * i) / steps));
	}
	return parts;
}

/** Some part comes within `limit` (DistanceOp stops as soon as it knows). */
function within(parts: Geom[], other: Geom, limit: number): boolean {
	for (const p of parts) if (DistanceOp.isWithinDistance(p, other, limit)) return true;
	return false;
}

/** Least distance, or Infinity when no part comes within `limit` (lets DistanceOp stop early). */
function distanceIfWithin(parts: Geom[], other: Geom, limit: number): number {
	let best = Infinity;
	for (const p of parts) {
		if (DistanceOp.isWithinDistance(p, other, limit)) best = Math.min(best, DistanceOp.distance(p, other));
	}
	return best;
}

/** Interiors intersect: touching along an edge or at a point is not an overlap. */
function overlaps(parts: Geom[], other: Geom): boolean {
	for (const p of parts) {
		if (DistanceOp.isWithinDistance(p, other, 0) && p.relate(other, 'T********')) return true;
	}
	return false;
}

/** Any contact, touching included (for walls, which are lines, that is the only kind). */
function touches(parts: Geom[], other: Geom): boolean {
	for (const p of parts) if (p.intersects(other)) return true;
	return false;
}

// ---------------------------------------------------------------------------------------------
// Path: the stages a piece goes through and what they cost.

interface Stage {
	parts: Geom[]; // region covered during the stage
	startGeom: Geom; // footprint at the start of the stage
	endGeom: Geom; // footprint at the end of the stage
	horizontal: number;
	pivot: number;
}

interface PathPlan {
	stages: Stage[];
	startGeom: Geom;
	endGeom: Geom;
	end: Required<Pose>;
	flatCost: number; // horizontal + pivots
}

function shortestTurn(fromDeg: number, toDeg: number): number {
	let d = (toDeg - fromDeg) % 360;
	if (d > 180) d -= 360;
	if (d < -180) d += 360;
	return d;
}

/**
 * READING: a piece travels each leg at the facing it had, then pivots at the waypoint to the
 * waypoint's facing (a waypoint without a facing keeps the current one).
 */
function planPath(piece: PieceIn, path: Pose[]): PathPlan {
	const fp = piece.footprint;
	let x = piece.at.x;
	let y = piece.at.y;
	let facing = piece.at.facing ?? 0;
	const startGeom = footprintAt(fp, x, y, facing);
	const stages: Stage[] = [];
	let flatCost = 0;
	let current = startGeom;
	const rMax = farthestRadius(fp);
	for (const wp of path) {
		const horizontal = Math.hypot(wp.x - x, wp.y - y);
		if (horizontal > 0) {
			const after = footprintAt(fp, wp.x, wp.y, facing);
			stages.push({
				parts: sweepTranslation(fp, [x, y], [wp.x, wp.y], facing),
				startGeom: current,
				endGeom: after,
				horizontal,
				pivot: 0
			});
			current = after;
			flatCost += horizontal;
		}
		x = wp.x;
		y = wp.y;
		if (wp.facing !== undefined) {
			const turn = shortestTurn(facing, wp.facing);
			// Round bases turn for free and sweep nothing new.
			if (fp.shape !== 'round' && turn !== 0) {
				const pivot = (rMax * Math.abs(turn) * Math.PI) / 180;
				const after = footprintAt(fp, x, y, wp.facing);
				stages.push({
					parts: sweepPivot(fp, [x, y], facing, turn),
					startGeom: current,
					endGeom: after,
					horizontal: 0,
					pivot
				});
				current = after;
				flatCost += pivot;
			}
			facing = wp.facing;
		}
	}
	return { stages, startGeom, endGeom: current, end: { x, y, facing }, flatCost };
}

/**
 * Vertical travel over one block: up when the footprint first touches the outline, down once
 * it is clear again. Convex footprints and convex blocks meet in one interval per stage, so a
 * stage that touches the block with neither end touching is one climb up and one down.
 */
function climbCrossings(plan: PathPlan, block: Geom): { up: number; down: number } {
	let on = plan.startGeom.intersects(block);
	let up = 0;
	let down = 0;
	for (const s of plan.stages) {
		if (!touches(s.parts, block)) continue;
		const endOn = s.endGeom.intersects(block);
		if (!on) up++;
		if (!endOn) down++;
		on = endOn;
	}
	return { up, down };
}

// ---------------------------------------------------------------------------------------------
// Findings.

const fmt = (v: number) => v.toFixed(2);

function finding(
	code: FindingCode,
	pieces: string[],
	measured: number,
	limit: number,
	message: string,
	severity: 'error' | 'warning' = 'error'
): Finding {
	return { code, severity, pieces, measured, limit, message };
}

function boardOverrun(parts: Geom[], width: number, depth: number): number {
	let over = 0;
	for (const p of parts) {
		const e = p.getEnvelopeInternal();
		over = Math.max(over, -e.getMinX(), -e.getMinY(), e.getMaxX() - width, e.getMaxY() - depth);
	}
	return over;
}

/** The checked move, pieces and terrain in JSTS form, shared by the rule functions. */
interface Table {
	profile: Profile;
	req: RefRequest;
	byId: Map<string, PieceIn>;
	startGeom: Map<string, Geom>;
	endGeom: Map<string, Geom>; // after the move: movers at their end, the rest where they are
	unitPieces: PieceIn[];
	plans: Map<string, PathPlan>;
	blocks: { t: TerrainIn & { kind: 'block' }; g: Geom }[];
	ruins: { t: TerrainIn & { kind: 'ruin' }; walls: Geom[] }[];
	impassable: { t: TerrainIn; g: Geom }[];
}

export function referenceCheck(req: RefRequest): RefReport {
	const profile: Profile = { ...DEFAULT_PROFILE, ...(req.profile ?? {}) };
	const eps = profile.tolerance;
	const move = req.move;
	const byId = new Map(req.pieces.map((p) => [p.id, p]));
	const startGeom = new Map<string, Geom>();
	for (const p of req.pieces) startGeom.set(p.id, footprintAt(p.footprint, p.at.x, p.at.y, p.at.facing ?? 0));
	const unitPieces = req.pieces.filter((p) => p.unit === move.unit);

	const plans = new Map<string, PathPlan>();
	for (const p of unitPieces) {
		const path = move.paths?.[p.id];
		if (path && path.length > 0) plans.set(p.id, planPath(p, path));
	}
	const endGeom = new Map(startGeom);
	for (const [id, plan] of plans) endGeom.set(id, plan.endGeom);

	const terrain = req.board.terrain ?? [];
	const table: Table = {
		profile,
		req,
		byId,
		startGeom,
		endGeom,
		unitPieces,
		plans,
		blocks: terrain
			.filter((t): t is TerrainIn & { kind: 'block' } => t.kind === 'block')
			.map((t) => ({ t, g: polygon(t.outline) })),
		ruins: terrain
			.filter((t): t is TerrainIn & { kind: 'ruin' } => t.kind === 'ruin')
			.map((t) => ({ t, walls: (t.walls ?? []).map((w) => gf.createLineString(w.map(coord))) })),
		impassable: terrain.filter((t) => t.kind === 'impassable').map((t) => ({ t, g: polygon(t.outline) }))
	};

	const findings: Finding[] = [];
	const perPiece: RefReport['pieces'] = {};

	// Start: is the unit in contact?
	const contact: { id: string; enemy: string; d: number }[] = [];
	for (const p of unitPieces) {
		for (const q of req.pieces) {
			if (q.side === p.side) continue;
			const d = distanceIfWithin([startGeom.get(p.id)], startGeom.get(q.id), profile.keepOut + eps);
			if (d <= profile.keepOut + eps) contact.push({ id: p.id, enemy: q.id, d });
		}
	}
	if (contact.length > 0 && (move.kind === 'move' || move.kind === 'dash')) {
		const ids = [...new Set(contact.map((c) => c.id))];
		const nearest = contact.reduce((a, b) => (b.d < a.d ? b : a));
		findings.push(
			finding(
				'locked',
				ids,
				nearest.d,
				profile.keepOut,
				`unit ${move.unit} starts ${fmt(nearest.d)} in from enemy ${nearest.enemy}; it may only hold or withdraw`
			)
		);
	}
	if (contact.length === 0 && move.kind === 'withdraw') {
		findings.push(
			finding(
				'not-in-contact',
				unitPieces.map((p) => p.id),
				Infinity,
				profile.keepOut,
				`unit ${move.unit} is not within ${profile.keepOut} in of an enemy; withdrawing gives nothing up`,
				'warning'
			)
		);
	}

	for (const p of unitPieces) {
		const plan = plans.get(p.id);
		const allowance =
			move.kind === 'hold' ? 0 : move.kind === 'dash' ? p.allowance + (move.die ?? 0) : p.allowance;
		const own: Finding[] = [];
		let cost = 0;
		if (plan) {
			cost = plan.flatCost + climbCost(table, p, plan);
			own.push(...pathFindings(table, p, plan));
			own.push(...endFindings(table, p, plan));
			if (cost > allowance + eps) {
				own.push(
					finding(
						'over-allowance',
						[p.id],
						cost,
						allowance,
						`${p.id} needs ${fmt(cost)} in; it may move ${fmt(allowance)} in`
					)
				);
			}
		}
		perPiece[p.id] = { cost, allowance, findings: own };
		findings.push(...own);
	}

	findings.push(...spacingFindings(table));

	return {
		verdict: findings.some((f) => f.severity === 'error') ? 'illegal' : 'legal',
		pieces: perPiece,
		findings,
		summaries: { objectives: objectiveSummary(table), rings: ringSummary(table) }
	};
}

/** Vertical inches over every block: READING each block counted on its own, up and down. */
function climbCost(table: Table, p: PieceIn, plan: PathPlan): number {
	let vertical = 0;
	for (const { t, g } of table.blocks) {
		const { up, down } = climbCrossings(plan, g);
		vertical += (up + down) * t.height;
	}
	return vertical;
}

function pathFindings(table: Table, p: PieceIn, plan: PathPlan): Finding[] {
	const { profile, req } = table;
	const eps = profile.tolerance;
	const kind = req.move.kind;
	const out: Finding[] = [];
	const parts = plan.stages.flatMap((s) => s.parts);
	if (parts.length === 0) return out;
	const flier = p.flies === true;

	if (!flier) {
		for (const q of req.pieces) {
			if (q.id === p.id) continue;
			const g = table.startGeom.get(q.id);
			const enemy = q.side !== p.side;
			if (enemy && overlaps(parts, g)) {
				out.push(finding('through-enemy', [p.id, q.id], 0, 0, `${p.id} passes through enemy ${q.id}`));
			}
			if (enemy && (kind === 'move' || kind === 'dash')) {
				const d = distanceIfWithin(parts, g, profile.keepOut + eps);
				if (d <= profile.keepOut + eps) {
					out.push(
						finding(
							'enters-keep-out',
							[p.id, q.id],
							d,
							profile.keepOut,
							`${p.id} passes ${fmt(d)} in from enemy ${q.id}; it must stay more than ${profile.keepOut} in away`
						)
					);
				}
			}
			// READING: moving unit-mates are moving too, so only pieces that stay are in the way.
			const stays = q.unit !== p.unit || !table.plans.has(q.id);
			if (BULKY.has(p.class) && BULKY.has(q.class) && stays && overlaps(parts, g)) {
				out.push(
					finding('bulky-through-bulky', [p.id, q.id], 0, 0, `${p.id} cannot pass through ${q.id}: both are bulky`)
				);
			}
		}
		if (!WALL_WALKERS.has(p.class)) {
			for (const r of table.ruins) {
				if (r.walls.some((w: Geom) => touches(parts, w))) {
					out.push(finding('wall-blocked', [p.id], 0, 0, `${p.id} cannot pass the walls of ${r.t.id}`));
				}
			}
		}
	}
	// READING: fliers still pay for blocks, so any class that flies may cross them.
	if (!flier && !CLIMBERS.has(p.class)) {
		for (const b of table.blocks) {
			if (overlaps(parts, b.g)) {
				out.push(
					finding('climb-blocked', [p.id], b.t.height, 0, `${p.id} is not able to climb ${b.t.id}`)
				);
			}
		}
	}
	// READING: "nobody" crosses impassable ground, fliers included; they must stay on the board too.
	for (const t of table.impassable) {
		if (overlaps(parts, t.g)) out.push(finding('impassable', [p.id], 0, 0, `${p.id} cannot cross ${t.t.id}`));
	}
	const over = boardOverrun(parts, req.board.width, req.board.depth);
	if (over > eps) {
		out.push(finding('off-board', [p.id], over, 0, `${p.id} leaves the board by ${fmt(over)} in on its way`));
	}
	return out;
}

function endFindings(table: Table, p: PieceIn, plan: PathPlan): Finding[] {
	const { profile, req } = table;
	const eps = profile.tolerance;
	const out: Finding[] = [];
	const end = plan.endGeom;
	for (const q of req.pieces) {
		if (q.id === p.id) continue;
		const g = table.endGeom.get(q.id);
		// A pair of movers is reported once, by the first of them in request order.
		const otherMoves = table.plans.has(q.id);
		const reportHere = !otherMoves || req.pieces.indexOf(p) < req.pieces.indexOf(q);
		if (reportHere && overlaps([end], g)) {
			out.push(finding('ends-overlapping', [p.id, q.id], 0, 0, `${p.id} ends overlapping ${q.id}`));
		}
		if (q.side !== p.side) {
			const d = distanceIfWithin([end], g, profile.keepOut + eps);
			if (d <= profile.keepOut + eps) {
				out.push(
					finding(
						'ends-in-keep-out',
						[p.id, q.id],
						d,
						profile.keepOut,
						`${p.id} ends ${fmt(d)} in from enemy ${q.id}; it must end more than ${profile.keepOut} in away`
					)
				);
			}
		}
	}
	for (const b of table.blocks) {
		if (overlaps([end], b.g) && !b.g.covers(end)) {
			out.push(finding('overhang', [p.id], 0, 0, `${p.id} ends hanging over the edge of ${b.t.id}`));
		}
	}
	const over = boardOverrun([end], req.board.width, req.board.depth);
	if (over > eps) out.push(finding('off-board', [p.id], over, 0, `${p.id} ends ${fmt(over)} in off the board`));
	return out;
}

/** Spacing after the move, for every piece of the unit whether it moved or not. */
function spacingFindings(table: Table): Finding[] {
	const { profile, unitPieces } = table;
	const eps = profile.tolerance;
	const n = unitPieces.length;
	if (n < 2) return [];
	const k = n >= profile.largeUnit ? profile.largeUnitNeighbours : 1;
	const out: Finding[] = [];
	for (const p of unitPieces) {
		const g = table.endGeom.get(p.id);
		const mates = unitPieces.filter((q) => q.id !== p.id).map((q) => table.endGeom.get(q.id));
		const close = mates.filter((m) => DistanceOp.isWithinDistance(g, m, profile.spacing + eps)).length;
		if (close >= k) continue;
		// Only a piece that fails needs its full distances, for the figure in the finding.
		const kth = mates.map((m) => DistanceOp.distance(g, m)).sort((a, b) => a - b)[k - 1];
		const whom = k === 1 ? 'its nearest unit-mate' : `its ${k} nearest unit-mates`;
		out.push(
			finding(
				'spacing',
				[p.id],
				kth,
				profile.spacing,
				`${p.id} is ${fmt(kth)} in from ${whom}; it must be within ${profile.spacing} in of ${k === 1 ? 'one' : k}`
			)
		);
	}
	return out;
}

function objectiveSummary(table: Table): RefReport['summaries']['objectives'] {
	const { profile, req } = table;
	const eps = profile.tolerance;
	const sides = [...new Set(req.pieces.map((p) => p.side))];
	return (req.board.objectives ?? []).map((o) => {
		const marker = footprintAt({ shape: 'round', diameterMm: profile.markerMm }, o.x, o.y, 0);
		const holders = req.pieces.filter((p) =>
			within([table.endGeom.get(p.id)], marker, profile.objectiveRange + eps)
		);
		const value: Record<string, number> = Object.fromEntries(sides.map((s) => [s, 0]));
		// READING: a piece without a value is worth 1.
		for (const p of holders) value[p.side] += p.value ?? 1;
		return { id: o.id, pieces: holders.map((p) => p.id), value };
	});
}

function ringSummary(table: Table): RefReport['summaries']['rings'] {
	const { profile, req } = table;
	const eps = profile.tolerance;
	const covered = (src: PieceIn, geoms: Map<string, Geom>): string[] => {
		const radius = src.ring!.radius;
		const units = new Set<string>();
		for (const q of req.pieces) {
			if (q.side !== src.side || units.has(q.unit)) continue;
			if (within([geoms.get(src.id)], geoms.get(q.id), radius + eps)) units.add(q.unit);
		}
		return [...units].sort();
	};
	return req.pieces
		.filter((p) => p.ring)
		.map((src) => {
			const before = covered(src, table.startGeom);
			const after = covered(src, table.endGeom);
			return { source: src.id, covers: after, lost: before.filter((u) => !after.includes(u)) };
		});
}
