// Reference move check: the rules of rules-engine.md and the JSON contract of referee-api.md,
// written plainly on JSTS (every pair measured with DistanceOp, no index) as a second opinion.
//
// It is deliberately slow and simple and shares no code with src/lib/referee: footprints are
// fine polygons, a path is swept as a list of polygons, and every piece is checked against
// every other piece and every terrain piece. Where the specification leaves a choice open the
// reading taken is written beside the rule, marked READING.
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
	ring?: { radius?: number };
	/** a leader joined to this unit: it moves and is spaced with it */
	leaderOf?: string;
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
	/** the terrain piece a terrain finding is about */
	terrain?: string;
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
// Settings of the "Table Standard" profile, from the docs. The first seven are the documented
// request settings; the rest are choices the docs call profile settings without a default,
// set here to the defaults the engine's author chose (recorded in the report of the bench).

export const DEFAULT_PROFILE: Profile = {
	keepOut: 1,
	spacing: 2,
	largeUnit: 7,
	largeUnitNeighbours: 2,
	tolerance: 0.005,
	objectiveRange: 3,
	markerMm: 40
};

const RING_RADIUS_IN = 6; // a ring without a radius: "6 in typical"
const PIECE_VALUE = 1; // a piece without a value
const FLIERS_PAY_CLIMB = true;
const FLIERS_CROSS_IMPASSABLE = true; // impassable is listed under the non-fliers' path rules
const RUIN_FLOOR_OVERHANG = true; // "any overhang of a block or of a ruin floor is illegal"

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

function outlineOf(g: Geom): Xy[] {
	const cs = g.getExteriorRing().getCoordinates();
	return cs.slice(0, -1).map((c: Geom) => [c.x, c.y] as Xy);
}

function rotate(p: Xy, deg: number): Xy {
	const t = (deg * Math.PI) / 180;
	const c = Math.cos(t);
	const s = Math.sin(t);
	return [p[0] * c - p[1] * s, p[0] * s + p[1] * c];
}

/** A footprint around its reference point at facing 0, as JSTS will draw it. */
interface Shape {
	pts: Xy[];
	convex: boolean;
	/** set for round bases, whose sweeps are buffers of the path */
	radius?: number;
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

function outerShape(fp: Footprint): Shape {
	if (fp.shape === 'hull') {
		const pts = fp.points.map((p) => [p[0], p[1]] as Xy);
		return { pts, convex: isConvex(pts) };
	}
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
	return fp.shape === 'round' ? { pts, convex: true, radius: a } : { pts, convex: true };
}

/**
 * The footprint shrunk by ε: terrain is met only when a piece reaches more than the tolerance
 * into it, the same "within X + ε" allowance the distance rules give, seen from the other side.
 */
function innerShape(outer: Shape, eps: number): Shape {
	if (outer.radius !== undefined) {
		const r = outer.radius - eps;
		return { pts: outer.pts.map(([x, y]) => [(x * r) / outer.radius!, (y * r) / outer.radius!] as Xy), convex: true, radius: r };
	}
	const shrunk = polygon(outer.pts).buffer(-eps, 16);
	return { pts: outlineOf(shrunk), convex: outer.convex };
}

function placed(shape: Shape, x: number, y: number, facing: number): Xy[] {
	return shape.pts.map((p) => {
		const r = rotate(p, facing);
		return [r[0] + x, r[1] + y] as Xy;
	});
}

function shapeAt(shape: Shape, x: number, y: number, facing: number): Geom {
	return polygon(placed(shape, x, y, facing));
}

/** Radius of the farthest point of the footprint from its reference point, in inches. */
function farthestRadius(fp: Footprint): number {
	if (fp.shape === 'round') return fp.diameterMm / 2 / MM_PER_IN;
	if (fp.shape === 'oval') return Math.max(fp.lengthMm, fp.widthMm) / 2 / MM_PER_IN;
	return Math.max(...fp.points.map((p) => Math.hypot(p[0], p[1])));
}

function convexHullOf(points: Xy[]): Geom {
	return gf.createMultiPointFromCoords(points.map(coord)).convexHull();
}

/**
 * The region a footprint covers while translated from one point to another at a fixed facing,
 * as a list of polygons whose union is that region.
 */
function sweepTranslation(shape: Shape, from: Xy, to: Xy, facing: number): Geom[] {
	if (shape.radius !== undefined) {
		return [gf.createLineString([coord(from), coord(to)]).buffer(shape.radius, BUFFER_QUADRANT_SEGMENTS)];
	}
	const a = placed(shape, from[0], from[1], facing);
	const b = placed(shape, to[0], to[1], facing);
	// A convex outline sweeps exactly the convex hull of its two ends.
	if (shape.convex) return [convexHullOf([...a, ...b])];
	// A concave hull: both ends plus the strip each edge sweeps.
	const parts: Geom[] = [polygon(a), polygon(b)];
	for (let i = 0; i < a.length; i++) {
		const j = (i + 1) % a.length;
		parts.push(convexHullOf([a[i], a[j], b[i], b[j]]));
	}
	return parts;
}

/** The region covered while pivoting in place, as copies every PIVOT_STEP_DEG degrees. */
function sweepPivot(shape: Shape, at: Xy, fromDeg: number, turnDeg: number): Geom[] {
	const steps = Math.max(1, Math.ceil(Math.abs(turnDeg) / PIVOT_STEP_DEG));
	const parts: Geom[] = [];
	for (let i = 0; i <= steps; i++) parts.push(shapeAt(shape, at[0], at[1], fromDeg + (turnDeg * i) / steps));
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

const interiorsMeet = (a: Geom, b: Geom) => DistanceOp.isWithinDistance(a, b, 0) && a.relate(b, 'T********');

/**
 * Two footprints overlap by more than ε: some part still reaches into the other after being
 * shrunk by ε. Touching, or overlapping within the tolerance, is not an overlap.
 */
function overlapsBeyond(parts: Geom[], other: Geom, eps: number): boolean {
	for (const p of parts) {
		if (interiorsMeet(p, other) && interiorsMeet(p.buffer(-eps, 16), other)) return true;
	}
	return false;
}

/** Any contact with a region or a line, touching included. */
function meets(parts: Geom[], other: Geom): boolean {
	for (const p of parts) if (DistanceOp.isWithinDistance(p, other, 0)) return true;
	return false;
}

// ---------------------------------------------------------------------------------------------
// Path: the stages a piece goes through and what they cost.

interface Stage {
	kind: 'move' | 'pivot';
	from: Required<Pose>;
	to: Required<Pose>;
	outer: Geom[]; // region the footprint covers during the stage
	inner: Geom[]; // the same for the footprint shrunk by ε (terrain)
	cost: number;
}

interface PathPlan {
	stages: Stage[];
	end: Required<Pose>;
	flatCost: number; // horizontal + pivots
	horizontal: number;
	pivots: number;
}

function shortestTurn(fromDeg: number, toDeg: number): number {
	let d = (toDeg - fromDeg) % 360;
	if (d > 180) d -= 360;
	if (d <= -180) d += 360;
	return d;
}

/**
 * A piece travels each leg at the facing it had, then pivots at the waypoint to the waypoint's
 * facing (a waypoint without a facing keeps the current one). The spec prices a pivot "at a
 * waypoint"; the engine documents the same order.
 */
function planPath(piece: PieceIn, outer: Shape, inner: Shape, path: Pose[]): PathPlan {
	const fp = piece.footprint;
	let x = piece.at.x;
	let y = piece.at.y;
	let facing = piece.at.facing ?? 0;
	const stages: Stage[] = [];
	let horizontal = 0;
	let pivots = 0;
	const rMax = farthestRadius(fp);
	for (const wp of path) {
		const length = Math.hypot(wp.x - x, wp.y - y);
		if (length > 0) {
			stages.push({
				kind: 'move',
				from: { x, y, facing },
				to: { x: wp.x, y: wp.y, facing },
				outer: sweepTranslation(outer, [x, y], [wp.x, wp.y], facing),
				inner: sweepTranslation(inner, [x, y], [wp.x, wp.y], facing),
				cost: length
			});
			horizontal += length;
		}
		x = wp.x;
		y = wp.y;
		if (wp.facing !== undefined) {
			const turn = shortestTurn(facing, wp.facing);
			// Round bases turn for free and sweep nothing new.
			if (fp.shape !== 'round' && turn !== 0) {
				const cost = (rMax * Math.abs(turn) * Math.PI) / 180;
				stages.push({
					kind: 'pivot',
					from: { x, y, facing },
					to: { x, y, facing: wp.facing },
					outer: sweepPivot(outer, [x, y], facing, turn),
					inner: sweepPivot(inner, [x, y], facing, turn),
					cost
				});
				pivots += cost;
			}
			facing = wp.facing;
		}
	}
	return { stages, end: { x, y, facing }, flatCost: horizontal + pivots, horizontal, pivots };
}

/**
 * The part of a straight leg, as fractions [a, b] of it, during which the shrunk footprint meets
 * a block, found by searching on DistanceOp: for a convex footprint and a convex block the
 * distance is convex along the leg, so its minimum is found by ternary search and the edges of
 * contact by bisection. (The reference assumes convex blocks; the bench's blocks are rectangles.)
 */
function contactSpan(inner: Shape, stage: Stage, block: Geom): [number, number] | null {
	if (!meets(stage.inner, block)) return null;
	const { from, to } = stage;
	const at = (t: number) =>
		shapeAt(inner, from.x + (to.x - from.x) * t, from.y + (to.y - from.y) * t, from.facing);
	const gap = (t: number) => DistanceOp.distance(at(t), block);
	let lo = 0;
	let hi = 1;
	for (let i = 0; i < 60 && hi - lo > 1e-9; i++) {
		const m1 = lo + (hi - lo) / 3;
		const m2 = hi - (hi - lo) / 3;
		if (gap(m1) <= gap(m2)) hi = m2;
		else lo = m1;
	}
	const touch = (lo + hi) / 2;
	if (gap(touch) > 0) return [touch, touch]; // a graze the search cannot split: one instant
	const edge = (inside: number, outside: number) => {
		if (gap(outside) <= 0) return outside;
		for (let i = 0; i < 50; i++) {
			const m = (inside + outside) / 2;
			if (gap(m) <= 0) inside = m;
			else outside = m;
		}
		return inside;
	};
	return [edge(touch, 0), edge(touch, 1)];
}

/**
 * Inches of climbing: the piece stands at the height of the tallest block its footprint meets,
 * and pays every inch that level rises or falls along the path (so up and down over a block,
 * only up when it ends on top). Meeting two blocks at once is not charged twice; this follows
 * the engine's documented reading, since the spec speaks of one block at a time. A pivot that
 * meets a block counts as on it for the whole turn (also the engine's reading).
 */
function climbInches(inner: Shape, plan: PathPlan, blocks: { t: { height: number }; g: Geom }[]): number {
	const spans: { from: number; to: number; h: number }[] = [];
	plan.stages.forEach((s, i) => {
		for (const b of blocks) {
			if (s.kind === 'move') {
				const span = contactSpan(inner, s, b.g);
				if (span) spans.push({ from: i + span[0], to: i + span[1], h: b.t.height });
			} else if (meets(s.inner, b.g)) {
				spans.push({ from: i, to: i + 1, h: b.t.height });
			}
		}
	});
	if (spans.length === 0) return 0;
	const level = (time: number) => spans.reduce((h, s) => (s.from <= time && time <= s.to ? Math.max(h, s.h) : h), 0);
	const marks = [...new Set([0, plan.stages.length, ...spans.flatMap((s) => [s.from, s.to])])].sort((a, b) => a - b);
	let total = 0;
	let prev = level(marks[0]);
	for (let i = 1; i < marks.length; i++) {
		const mid = level((marks[i - 1] + marks[i]) / 2);
		const here = level(marks[i]);
		total += Math.abs(mid - prev) + Math.abs(here - mid);
		prev = here;
	}
	return total;
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
	let over = -Infinity;
	for (const p of parts) {
		const e = p.getEnvelopeInternal();
		over = Math.max(over, -e.getMinX(), -e.getMinY(), e.getMaxX() - width, e.getMaxY() - depth);
	}
	return over;
}

interface Placed {
	piece: PieceIn;
	unit: string;
	member: boolean;
	outer: Shape;
	inner: Shape;
	start: Geom;
	end: Geom; // after the move: a mover at its end, everything else where it stands
	endInner: Geom; // members only: the footprint shrunk by ε where it ends
	plan: PathPlan | null;
}

export function referenceCheck(req: RefRequest): RefReport {
	const profile: Profile = { ...DEFAULT_PROFILE, ...(req.profile ?? {}) };
	const eps = profile.tolerance;
	const keepOutWithin = profile.keepOut + eps;
	const { move, board } = req;
	const kind = move.kind;

	// Footprints repeat across a table; their local outlines are worked out once per check.
	const shapes = new Map<string, { outer: Shape; inner: Shape }>();
	const shapesOf = (fp: Footprint) => {
		const key = JSON.stringify(fp);
		let s = shapes.get(key);
		if (!s) {
			const outer = outerShape(fp);
			s = { outer, inner: innerShape(outer, eps) };
			shapes.set(key, s);
		}
		return s;
	};
	const all: Placed[] = req.pieces.map((piece) => {
		const { outer, inner } = shapesOf(piece.footprint);
		const unit = piece.leaderOf ?? piece.unit;
		const member = unit === move.unit;
		const path = member ? move.paths?.[piece.id] : undefined;
		const plan = path && path.length > 0 ? planPath(piece, outer, inner, path) : null;
		const f = piece.at.facing ?? 0;
		const start = shapeAt(outer, piece.at.x, piece.at.y, f);
		const endPose = plan ? plan.end : { x: piece.at.x, y: piece.at.y, facing: f };
		const end = plan ? shapeAt(outer, endPose.x, endPose.y, endPose.facing) : start;
		const endInner = member ? shapeAt(inner, endPose.x, endPose.y, endPose.facing) : null;
		return { piece, unit, member, outer, inner, start, end, endInner, plan };
	});
	const members = all.filter((p) => p.member);
	const terrain = board.terrain ?? [];
	const blocks = terrain
		.filter((t): t is TerrainIn & { kind: 'block' } => t.kind === 'block')
		.map((t) => ({ t, g: polygon(t.outline) }));
	const floors = terrain
		.filter((t) => t.kind === 'block' || (t.kind === 'ruin' && RUIN_FLOOR_OVERHANG))
		.map((t) => ({ t, g: polygon(t.outline) }));
	const ruins = terrain
		.filter((t): t is TerrainIn & { kind: 'ruin' } => t.kind === 'ruin')
		.map((t) => ({ t, walls: (t.walls ?? []).map((w) => gf.createLineString(w.map(coord))) }));
	const impassable = terrain.filter((t) => t.kind === 'impassable').map((t) => ({ t, g: polygon(t.outline) }));

	const unitFindings: Finding[] = [];
	const perPiece: RefReport['pieces'] = {};

	// ---- Start. READING (the engine's, the spec names no pieces): a locked finding names the
	// closest member and enemy; a not-in-contact warning names the nearest pair.
	const pairsWithin = (limit: number) => {
		const out: { a: Placed; b: Placed; d: number }[] = [];
		for (const a of members) {
			for (const b of all) {
				if (b.piece.side === a.piece.side) continue;
				const d = distanceIfWithin([a.start], b.start, limit);
				if (d <= limit) out.push({ a, b, d });
			}
		}
		return out;
	};
	const closest = (pairs: { a: Placed; b: Placed; d: number }[]) =>
		pairs.reduce<{ a: Placed; b: Placed; d: number } | null>((best, p) => (!best || p.d < best.d ? p : best), null);
	const contact = closest(pairsWithin(keepOutWithin));
	if (contact && (kind === 'move' || kind === 'dash')) {
		unitFindings.push(
			finding(
				'locked',
				[contact.a.piece.id, contact.b.piece.id],
				contact.d,
				profile.keepOut,
				`${contact.a.piece.id} starts ${fmt(contact.d)} in from enemy ${contact.b.piece.id}; the unit may only hold or withdraw`
			)
		);
	}
	if (!contact && kind === 'withdraw') {
		// The nearest pair: candidates in order of a lower bound (centre distance less both
		// farthest radii), measured exactly until the bound passes the best found.
		let nearest: { a: Placed; b: Placed; d: number } | null = null;
		const candidates = members
			.flatMap((a) => all.filter((b) => b.piece.side !== a.piece.side).map((b) => ({ a, b })))
			.map((c) => ({
				...c,
				bound:
					Math.hypot(c.a.piece.at.x - c.b.piece.at.x, c.a.piece.at.y - c.b.piece.at.y) -
					farthestRadius(c.a.piece.footprint) -
					farthestRadius(c.b.piece.footprint)
			}))
			.sort((x, y) => x.bound - y.bound);
		for (const c of candidates) {
			if (nearest && c.bound > nearest.d) break;
			const d = DistanceOp.distance(c.a.start, c.b.start);
			if (!nearest || d < nearest.d) nearest = { a: c.a, b: c.b, d };
		}
		unitFindings.push(
			finding(
				'not-in-contact',
				nearest ? [nearest.a.piece.id, nearest.b.piece.id] : [members[0].piece.id],
				nearest ? nearest.d : Number.MAX_VALUE,
				profile.keepOut,
				`unit ${move.unit} is not within ${profile.keepOut} in of an enemy; withdrawing gives nothing up`,
				'warning'
			)
		);
	}

	for (const m of members) {
		const p = m.piece;
		const allowance = kind === 'hold' ? 0 : kind === 'dash' ? p.allowance + (move.die ?? 0) : p.allowance;
		const own: Finding[] = [];
		const plan = m.plan;
		const flier = p.flies === true;
		const climbs = !flier || FLIERS_PAY_CLIMB;
		const cost = plan ? plan.flatCost + (climbs ? climbInches(m.inner, plan, blocks) : 0) : 0;
		if (cost > allowance + eps) {
			own.push(finding('over-allowance', [p.id], cost, allowance, `${p.id} needs ${fmt(cost)} in; it may move ${fmt(allowance)} in`));
		}
		perPiece[p.id] = { cost, allowance, findings: own };
		// READING (the engine's): a hold is judged on its cost alone; nothing else can change.
		if (kind === 'hold') continue;
		if (plan) own.push(...pathFindings(m, plan, all, { kind, profile, ruins, blocks, impassable, board }));
		// Impassable ground already crossed on the way is not reported again at the end.
		const crossed = new Set(own.filter((f) => f.code === 'impassable').map((f) => f.terrain!));
		own.push(...endFindings(m, all, { profile, floors, impassable, board, crossed }));
	}

	// Spacing, for every piece of the unit whether it moved or not (not for a hold, above).
	if (kind !== 'hold') unitFindings.push(...spacingFindings(members, profile));

	// Report order: start findings, each piece's own, then spacing (not compared, but readable).
	const findings = [
		...unitFindings.filter((f) => f.code !== 'spacing'),
		...members.flatMap((m) => perPiece[m.piece.id].findings),
		...unitFindings.filter((f) => f.code === 'spacing')
	];
	return {
		verdict: findings.some((f) => f.severity === 'error') ? 'illegal' : 'legal',
		pieces: perPiece,
		findings,
		summaries: { objectives: objectiveSummary(all, profile, board), rings: ringSummary(all, profile) }
	};
}


interface PathContext {
	kind: MoveKind;
	profile: Profile;
	ruins: { t: TerrainIn; walls: Geom[] }[];
	blocks: { t: TerrainIn & { kind: 'block' }; g: Geom }[];
	impassable: { t: TerrainIn; g: Geom }[];
	board: RefRequest['board'];
}

function pathFindings(m: Placed, plan: PathPlan, all: Placed[], ctx: PathContext): Finding[] {
	const { profile, kind } = ctx;
	const eps = profile.tolerance;
	const keepOutWithin = profile.keepOut + eps;
	const p = m.piece;
	const out: Finding[] = [];
	const outer = plan.stages.flatMap((s) => s.outer);
	const inner = plan.stages.flatMap((s) => s.inner);
	if (outer.length === 0) return out;
	const flier = p.flies === true;

	// Fliers pass over pieces and walls as if they were not there.
	if (!flier) {
		for (const q of all) {
			if (q === m) continue;
			// READING: unit-mates that move are moving too, so they are not in the way; a mate
			// that stays put is a piece like any other ("friend or foe").
			if (q.member && q.plan) continue;
			const enemy = q.piece.side !== p.side;
			if (enemy && overlapsBeyond(outer, q.start, eps)) {
				out.push(finding('through-enemy', [p.id, q.piece.id], 0, 0, `${p.id} passes through enemy ${q.piece.id}`));
			}
			if (enemy && (kind === 'move' || kind === 'dash')) {
				const d = distanceIfWithin(outer, q.start, keepOutWithin);
				if (d <= keepOutWithin) {
					out.push(
						finding(
							'enters-keep-out',
							[p.id, q.piece.id],
							d,
							profile.keepOut,
							`${p.id} passes ${fmt(d)} in from enemy ${q.piece.id}; it must stay more than ${profile.keepOut} in away`
						)
					);
				}
			}
			if (BULKY.has(p.class) && BULKY.has(q.piece.class) && overlapsBeyond(outer, q.start, eps)) {
				out.push(finding('bulky-through-bulky', [p.id, q.piece.id], 0, 0, `${p.id} cannot pass through ${q.piece.id}: both are bulky`));
			}
		}
		if (!WALL_WALKERS.has(p.class)) {
			for (const r of ctx.ruins) {
				if (r.walls.some((w: Geom) => meets(inner, w))) {
					out.push(finding('wall-blocked', [p.id], 0, 0, `${p.id} cannot pass the walls of ${r.t.id}`));
				}
			}
		}
		// Fliers of any class cross blocks (paying the climb); on foot only climbing classes do.
		if (!CLIMBERS.has(p.class)) {
			for (const b of ctx.blocks) {
				if (meets(inner, b.g)) out.push(finding('climb-blocked', [p.id], 0, 0, `${p.id} is not able to climb ${b.t.id}`));
			}
		}
	}
	if (!flier || !FLIERS_CROSS_IMPASSABLE) {
		for (const t of ctx.impassable) {
			if (meets(inner, t.g)) out.push({ ...finding('impassable', [p.id], 0, 0, `${p.id} crosses impassable ${t.t.id}`), terrain: t.t.id });
		}
	}
	return out;
}

interface EndContext {
	profile: Profile;
	floors: { t: TerrainIn; g: Geom }[];
	impassable: { t: TerrainIn; g: Geom }[];
	board: RefRequest['board'];
	crossed: Set<string>;
}

/**
 * Where a piece of the moving unit ends up, moved or not. READING (the engine's): every piece
 * of the unit must stand legally after the move, so one left behind is judged where it stands.
 */
function endFindings(m: Placed, all: Placed[], ctx: EndContext): Finding[] {
	const { profile, board } = ctx;
	const eps = profile.tolerance;
	const keepOutWithin = profile.keepOut + eps;
	const p = m.piece;
	const out: Finding[] = [];
	const parts = m.plan ? [...m.plan.stages.flatMap((s) => s.outer), m.end] : [m.end];
	const over = boardOverrun(parts, board.width, board.depth);
	if (over > eps) out.push(finding('off-board', [p.id], over, 0, `${p.id} goes ${fmt(over)} in off the board`));
	for (const q of all) {
		if (q === m) continue;
		// A pair of the unit's own pieces is reported once; which of the two reports it does
		// not change the pieces named.
		const reportHere = !q.member || all.indexOf(m) < all.indexOf(q);
		if (reportHere && overlapsBeyond([m.end], q.end, eps)) {
			out.push(finding('ends-overlapping', [p.id, q.piece.id], 0, 0, `${p.id} ends overlapping ${q.piece.id}`));
		}
		if (q.piece.side !== p.side) {
			const d = distanceIfWithin([m.end], q.end, keepOutWithin);
			if (d <= keepOutWithin) {
				out.push(
					finding(
						'ends-in-keep-out',
						[p.id, q.piece.id],
						d,
						profile.keepOut,
						`${p.id} ends ${fmt(d)} in from enemy ${q.piece.id}; it must end more than ${profile.keepOut} in away`
					)
				);
			}
		}
	}
	for (const f of ctx.floors) {
		// On it at all (beyond ε) but not wholly within it (beyond ε).
		if (meets([m.endInner], f.g) && !f.g.covers(m.endInner)) {
			out.push(finding('overhang', [p.id], 0, 0, `${p.id} ends hanging over the edge of ${f.t.id}`));
		}
	}
	for (const t of ctx.impassable) {
		if (!ctx.crossed.has(t.t.id) && meets([m.endInner], t.g)) {
			out.push({ ...finding('impassable', [p.id], 0, 0, `${p.id} ends on impassable ${t.t.id}`), terrain: t.t.id });
		}
	}
	return out;
}

/** Each piece of the unit after the move needs k unit-mates within the spacing distance. */
function spacingFindings(members: Placed[], profile: Profile): Finding[] {
	const eps = profile.tolerance;
	const n = members.length;
	if (n < 2) return []; // units of one piece are exempt
	const k = Math.min(n - 1, n >= profile.largeUnit ? profile.largeUnitNeighbours : 1);
	const out: Finding[] = [];
	for (const m of members) {
		const mates = members.filter((q) => q !== m).map((q) => q.end);
		const close = mates.filter((g) => DistanceOp.isWithinDistance(m.end, g, profile.spacing + eps)).length;
		if (close >= k) continue;
		// Only a piece that fails needs its full distances, for the figure in the finding.
		const kth = mates.map((g) => DistanceOp.distance(m.end, g)).sort((a, b) => a - b)[k - 1];
		const whom = k === 1 ? 'its nearest unit-mate' : `its ${k} nearest unit-mates`;
		out.push(
			finding(
				'spacing',
				[m.piece.id],
				kth,
				profile.spacing,
				`${m.piece.id} is ${fmt(kth)} in from ${whom}; it must be within ${profile.spacing} in of ${k === 1 ? 'one' : k}`
			)
		);
	}
	return out;
}

function objectiveSummary(all: Placed[], profile: Profile, board: RefRequest['board']): RefReport['summaries']['objectives'] {
	const limit = profile.objectiveRange + profile.tolerance;
	const sides = [...new Set(all.map((p) => p.piece.side))];
	const markerShape = outerShape({ shape: 'round', diameterMm: profile.markerMm });
	return (board.objectives ?? []).map((o) => {
		const marker = shapeAt(markerShape, o.x, o.y, 0);
		const holders = all.filter((p) => within([p.end], marker, limit));
		const value: Record<string, number> = Object.fromEntries(sides.map((s) => [s, 0]));
		for (const p of holders) value[p.piece.side] += p.piece.value ?? PIECE_VALUE;
		return { id: o.id, pieces: holders.map((p) => p.piece.id), value };
	});
}

function ringSummary(all: Placed[], profile: Profile): RefReport['summaries']['rings'] {
	const covered = (src: Placed, after: boolean): string[] => {
		const limit = (src.piece.ring!.radius ?? RING_RADIUS_IN) + profile.tolerance;
		const units: string[] = [];
		for (const q of all) {
			if (q.piece.side !== src.piece.side || units.includes(q.unit)) continue;
			if (within([after ? src.end : src.start], after ? q.end : q.start, limit)) units.push(q.unit);
		}
		return units;
	};
	return all
		.filter((p) => p.piece.ring)
		.map((src) => {
			const before = covered(src, false);
			const after = covered(src, true);
			return { source: src.piece.id, covers: after, lost: before.filter((u) => !after.includes(u)) };
		});
}
