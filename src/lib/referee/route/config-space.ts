// The configuration space of one piece's move: every obstacle grown by the piece's footprint (and
// by the keep-out distance where the rules ask for it), as rounded convex sets the reference point
// must stay out of; blocks a climber may cross, with their height; the end rules as sets too.
import type { CheckRequest, MoveKind, PieceIn, Profile } from '../../schemas/check';
import { convexHull, minkowskiSum, pointInPolygon, type Rounded } from '../convex';
import { localFootprint, OVAL_CHORD_ERROR_IN, place } from '../footprints';
import { mmToIn, resolveProfile } from '../profile';
import { prepareTerrain, type PreparedTerrain } from '../terrain';
import { clearanceBelow, cset, pointSetClearance, type CSet } from './geometry';

/** The table a route is planned on: a check request without the move. */
export type RouteTable = Omit<CheckRequest, 'move'>;

export interface RouteRequest {
	table: RouteTable;
	pieceId: string;
	kind: MoveKind;
	/** the die result, for a dash */
	die?: number;
	/** where unit-mates stand once their own moves are made (default: where they are) */
	placed?: Record<string, { x: number; y: number; facing?: number }>;
	/** search this far instead of the allowance (routes beyond the allowance are then reported too) */
	budgetIn?: number;
}

/** Clearance kept beyond every limit of the check, in inches: the finder's safety margin. */
export const MARGIN_IN = 0.002;
/** Vertices of the polygon circumscribed about an oval footprint (fixed facing). */
export const OVAL_SIDES = 24;
/** Largest angle of one circumscribed step when an arc becomes waypoints. */
export const ARC_STEP_RAD = (4 * Math.PI) / 180;
/** Relative excess of a circumscribed polyline over its arc: (step/2)²/3 bounds tan(x)/x − 1. */
export const ARC_EXCESS = (ARC_STEP_RAD / 2) ** 2 / 3 + 1e-6;

export type Status = 'ok' | 'hold' | 'locked' | 'start-blocked';

export interface SoftBlock {
	t: PreparedTerrain;
	/** outline edges grown by the piece's inner form: touching one means climbing */
	sets: CSet[];
	/**
	 * For a convex outline: outline ⊕ (−inner form), where the reference point is while the piece
	 * touches the block (closed-form touches). Null for a concave outline.
	 */
	cfg: CSet | null;
}

export interface ConfigSpace {
	status: Status;
	/** a sentence for a status other than 'ok' */
	reason?: string;
	piece: PieceIn;
	profile: Profile;
	kind: MoveKind;
	sx: number;
	sy: number;
	facingDeg: number;
	allowanceIn: number;
	/** the most the search spends, in inches (allowance + ε, or the requested budget) */
	budgetIn: number;
	/** path obstacles nobody crosses */
	hard: CSet[];
	/** blocks crossed at the climb cost */
	soft: SoftBlock[];
	/** circles of the tangent graph: vertices of hard and soft sets */
	circles: { x: number; y: number; R: number }[];
	/** end rules: the reference point must end outside each */
	endSets: CSet[];
	/** end rules: outlines whose inside is forbidden (impassable ground, blocks for non-climbers) */
	endRings: { ring: number[]; R: number; box: { minX: number; minY: number; maxX: number; maxY: number } }[];
	/** the reference point's rectangle that keeps the footprint on the board */
	rect: { x0: number; y0: number; x1: number; y1: number };
	/** the footprint's inner form at the piece's facing, placed at a point (climb touches) */
	innerAt: (x: number, y: number) => Rounded;
	/** a point of the footprint relative to the reference point (for inside-outline tests) */
	probeDx: number;
	probeDy: number;
	round: boolean;
}

/**
 * A piece's outer footprint at a facing, about the origin: round and hull exact, an oval by a
 * circumscribed polygon (few sides keep the tangent graph small; it contains the engine's oval).
 */
export function coarseOuter(p: PieceIn, eps: number, facing = p.at.facing ?? 0): Rounded {
	const fp = p.footprint;
	if (fp.shape === 'round') return { pts: [0, 0], r: mmToIn(fp.diameterMm) / 2 };
	if (fp.shape === 'oval') {
		const a = mmToIn(fp.lengthMm) / 2;
		const b = mmToIn(fp.widthMm) / 2;
		// the tangent lines at parameters t_i = 2πi/K meet at t_i + π/K, at scale 1/cos(π/K):
		// a polygon that contains the ellipse (affine image of a circumscribed K-gon)
		const k = 1 / Math.cos(Math.PI / OVAL_SIDES);
		const pts: number[] = [];
		for (let i = 0; i < OVAL_SIDES; i++) {
			const t = (2 * Math.PI * (i + 0.5)) / OVAL_SIDES;
			pts.push(a * k * Math.cos(t), b * k * Math.sin(t));
		}
		// the engine's oval is its inscribed polygon grown by half the chord error: cover that too
		return place({ pts: convexHull(pts), r: OVAL_CHORD_ERROR_IN }, 0, 0, facing);
	}
	const local = localFootprint(fp, eps);
	return place(local.outer, 0, 0, facing);
}

/** O ⊕ (−F) grown by `grow`: where the reference point may not be for O and F to stay `grow` apart. */
function grownSet(o: Rounded, f: Rounded, grow: number): CSet {
	const R = Math.max(0, o.r + f.r + grow);
	if (f.pts.length === 2 && f.pts[0] === 0 && f.pts[1] === 0) return cset(o.pts, R);
	return cset(minkowskiSum(o.pts, f.pts, true), R);
}

function boxOfPts(pts: number[], r: number) {
	let minX = Infinity,
		minY = Infinity,
		maxX = -Infinity,
		maxY = -Infinity;
	for (let i = 0; i < pts.length; i += 2) {
		minX = Math.min(minX, pts[i]);
		maxX = Math.max(maxX, pts[i]);
		minY = Math.min(minY, pts[i + 1]);
		maxY = Math.max(maxY, pts[i + 1]);
	}
	return { minX: minX - r, minY: minY - r, maxX: maxX + r, maxY: maxY + r };
}

export function buildConfigSpace(req: RouteRequest): ConfigSpace {
	const { table, kind } = req;
	const profile = resolveProfile(table.profile);
	const eps = profile.tolerance;
	const mu = MARGIN_IN;
	const piece = table.pieces.find((p) => p.id === req.pieceId);
	if (!piece) throw new Error(`no piece "${req.pieceId}" on the table`);
	const unit = piece.leaderOf ?? piece.unit;
	const flies = piece.flies === true;
	const bulky = new Set<string>(profile.bulky);
	const climbers = new Set<string>(profile.climbers);
	const wallPassers = new Set<string>(profile.wallPassers);
	const moverBulky = bulky.has(piece.class);
	const sx = piece.at.x;
	const sy = piece.at.y;
	const facingDeg = piece.at.facing ?? 0;
	const allowanceIn = kind === 'hold' ? 0 : kind === 'dash' ? piece.allowance + (req.die ?? 0) : piece.allowance;
	const budgetIn = req.budgetIn ?? allowanceIn + eps;
	const F = coarseOuter(piece, eps);
	const round = piece.footprint.shape === 'round';
	// terrain is met by the inner form (shrunk by ε); a round base gets that credit exactly, other
	// shapes are taken at their (circumscribed) outer form, which is the safe side
	const Fin: Rounded = round ? { pts: [0, 0], r: Math.max(0, F.r - eps) } : F;
	const localInner = localFootprint(piece.footprint, eps).inner;
	const innerAt = (x: number, y: number) => place(localInner, x, y, facingDeg);

	// The board edge by the footprint's box; for other shapes than round by the box of the circle
	// round its farthest point, because the check currently measures an end that way (the finder
	// must never be less strict than the check; see docs/route-finder.md, "Limits").
	const rMax = localFootprint(piece.footprint, eps).rMaxIn + (round ? 0 : OVAL_CHORD_ERROR_IN);
	const fb = round ? boxOfPts(F.pts, F.r) : { minX: -rMax, minY: -rMax, maxX: rMax, maxY: rMax };
	const rect = { x0: -fb.minX - eps + mu, y0: -fb.minY - eps + mu, x1: table.board.width - fb.maxX + eps - mu, y1: table.board.depth - fb.maxY + eps - mu };

	// Only what a path of at most the budget can reach matters.
	const reach = budgetIn + 1e-9;
	const near = (s: CSet) => s.minX <= sx + reach && s.maxX >= sx - reach && s.minY <= sy + reach && s.maxY >= sy - reach;
	const hard: CSet[] = [];
	const endSets: CSet[] = [];
	const endRings: ConfigSpace['endRings'] = [];
	const soft: SoftBlock[] = [];
	const keepOut = profile.keepOut;
	let locked = false;

	for (const o of table.pieces) {
		if (o.id === piece.id) continue;
		const ou = o.leaderOf ?? o.unit;
		const member = ou === unit;
		const pose = member && req.placed?.[o.id] ? req.placed[o.id] : o.at;
		const enemy = o.side !== piece.side;
		const far = Math.hypot(o.at.x - sx, o.at.y - sy) - boundRadius(o) - boundRadius(piece) > reach + keepOut + 1;
		if (far && !(member && req.placed?.[o.id])) continue;
		if (enemy && (kind === 'move' || kind === 'dash') && !far) {
			// the check's start rule, on the engine's footprints
			const placedO = place(localFootprint(o.footprint, eps).outer, o.at.x, o.at.y, o.at.facing ?? 0);
			const atStart = place(localFootprint(piece.footprint, eps).outer, sx, sy, facingDeg);
			if (roughDistance(atStart, placedO) <= keepOut + eps) locked = true;
		}
		const endLocal = coarseOuter(o, eps, pose.facing ?? 0);
		const placedEnd = place(endLocal, pose.x, pose.y, 0);
		const endSet = grownSet(placedEnd, F, enemy ? keepOut + eps + mu : -eps + mu);
		if (near(endSet)) endSets.push(endSet);
		if (flies || member) continue; // unit-mates never block the path; fliers pass over pieces
		const placedStart = place(coarseOuter(o, eps), o.at.x, o.at.y, 0);
		let grow: number | null = null;
		if (enemy) grow = kind === 'withdraw' ? -eps + mu : keepOut + eps + mu;
		else if (moverBulky && bulky.has(o.class)) grow = -eps + mu;
		if (grow === null) continue;
		const s = grownSet(placedStart, F, grow);
		if (near(s)) hard.push(s);
	}

	for (const raw of table.board.terrain ?? []) {
		const t = prepareTerrain(raw);
		const edgesGrown = () => {
			const out: CSet[] = [];
			const n = t.ring.length / 2;
			for (let i = 0; i < n; i++) {
				const k = (i + 1) % n;
				const e = cset([t.ring[2 * i], t.ring[2 * i + 1], t.ring[2 * k], t.ring[2 * k + 1]], 0);
				if (e.minX > sx + reach + 50 || e.maxX < sx - reach - 50 || e.minY > sy + reach + 50 || e.maxY < sy - reach - 50) continue;
				const g = grownSet({ pts: e.pts, r: 0 }, Fin, mu);
				if (near(g)) out.push(g);
			}
			return out;
		};
		const ringEntry = () => {
			const R = Math.max(0, Fin.r + mu);
			return { ring: t.ring, R, box: { minX: t.box.minX - R, minY: t.box.minY - R, maxX: t.box.maxX + R, maxY: t.box.maxY + R } };
		};
		if (t.kind === 'impassable') {
			const edges = edgesGrown();
			endSets.push(...edges);
			endRings.push(ringEntry());
			if (!flies || !profile.fliersCrossImpassable) hard.push(...edges);
		} else if (t.kind === 'block') {
			const edges = edgesGrown();
			const crosses = flies ? true : climbers.has(piece.class);
			endSets.push(...edges); // overhang: wholly on top or wholly off
			if (!crosses) {
				hard.push(...edges);
				endRings.push(ringEntry());
			} else if ((!flies || profile.fliersPayClimb) && t.heightIn > 0 && edges.length) {
				const ring = convexRing(t.ring);
				soft.push({ t, sets: edges, cfg: ring ? grownSet({ pts: ring, r: 0 }, Fin, 0) : null });
			}
		} else if (t.kind === 'ruin') {
			if (profile.ruinFloorOverhang) endSets.push(...edgesGrown());
			if (!flies && !wallPassers.has(piece.class)) {
				for (const w of t.walls) {
					const g = grownSet({ pts: w, r: 0 }, Fin, mu);
					if (near(g)) hard.push(g);
				}
			}
		}
	}

	const circles: ConfigSpace['circles'] = [];
	const seen = new Set<string>();
	for (const s of [...hard, ...soft.flatMap((b) => b.sets)]) {
		for (let i = 0; i < s.pts.length; i += 2) {
			const x = s.pts[i];
			const y = s.pts[i + 1];
			if (Math.hypot(x - sx, y - sy) - s.R > reach) continue;
			const key = `${x}|${y}|${s.R}`;
			if (seen.has(key)) continue;
			seen.add(key);
			circles.push({ x, y, R: s.R });
		}
	}

	const space: ConfigSpace = {
		status: 'ok',
		piece,
		profile,
		kind,
		sx,
		sy,
		facingDeg,
		allowanceIn,
		budgetIn,
		hard,
		soft,
		circles,
		endSets,
		endRings,
		rect,
		innerAt,
		probeDx: F.pts[0],
		probeDy: F.pts[1],
		round
	};
	if (kind === 'hold') {
		space.status = 'hold';
		space.reason = 'a holding piece stays where it is';
	} else if (locked) {
		space.status = 'locked';
		space.reason = `${piece.id} starts within ${keepOut} in of an enemy: it may only hold or withdraw`;
	} else if (hard.some((s) => pointSetClearance(sx, sy, s) < 0) || sx < rect.x0 || sx > rect.x1 || sy < rect.y0 || sy > rect.y1) {
		space.status = 'start-blocked';
		space.reason = `${piece.id} starts too close to something it may not pass for the finder to plan a safe route`;
	}
	return space;
}

/** The ring as a CCW polygon if it is convex (no reflex corner), else null. */
function convexRing(ring: number[]): number[] | null {
	const n = ring.length / 2;
	if (n < 3) return null;
	let sign = 0;
	for (let i = 0; i < n; i++) {
		const a = (i + 1) % n;
		const b = (i + 2) % n;
		const c = (ring[2 * a] - ring[2 * i]) * (ring[2 * b + 1] - ring[2 * a + 1]) - (ring[2 * a + 1] - ring[2 * i + 1]) * (ring[2 * b] - ring[2 * a]);
		if (c === 0) continue;
		const s = Math.sign(c);
		if (sign === 0) sign = s;
		else if (s !== sign) return null;
	}
	if (sign > 0) return ring.slice();
	const out: number[] = [];
	for (let i = n - 1; i >= 0; i--) out.push(ring[2 * i], ring[2 * i + 1]);
	return out;
}

/** Distance from the reference point to the farthest point of the footprint, in inches. */
function boundRadius(p: PieceIn): number {
	const fp = p.footprint;
	if (fp.shape === 'round') return mmToIn(fp.diameterMm) / 2;
	if (fp.shape === 'oval') return mmToIn(Math.max(fp.lengthMm, fp.widthMm)) / 2 + 0.1;
	return Math.max(...fp.points.map(([x, y]) => Math.hypot(x, y)));
}

/** Signed distance between two placed footprints (closed form for two round bases). */
function roughDistance(a: Rounded, b: Rounded): number {
	if (a.pts.length === 2 && b.pts.length === 2) return Math.hypot(a.pts[0] - b.pts[0], a.pts[1] - b.pts[1]) - a.r - b.r;
	const m = minkowskiSum(a.pts, b.pts, true);
	return pointSetClearance(0, 0, cset(m, a.r + b.r));
}

/**
 * The signed margin by which an end position keeps every end rule (≥ 0: legal). Beyond a
 * violation of `cap` the exact figure is not needed: the search stops at the first rule broken by more.
 */
export function endClearance(cs: ConfigSpace, x: number, y: number, cap = Infinity): number {
	let g = Math.min(x - cs.rect.x0, cs.rect.x1 - x, y - cs.rect.y0, cs.rect.y1 - y);
	for (const s of cs.endSets) {
		// the set lies in its box: the gap to the box bounds the clearance from below
		const gap = Math.max(s.minX - x, x - s.maxX, s.minY - y, y - s.maxY);
		if (gap >= g) continue;
		const c = clearanceBelow(x, y, s, g);
		if (c < g) {
			g = c;
			if (g <= -cap) return g;
		}
	}
	const px = x + cs.probeDx;
	const py = y + cs.probeDy;
	for (const r of cs.endRings) {
		if (px < r.box.minX || px > r.box.maxX || py < r.box.minY || py > r.box.maxY) continue;
		if (pointInPolygon(px, py, r.ring)) {
			const c = -r.R - ringDistance(px, py, r.ring);
			if (c < g) g = c;
		}
	}
	return g;
}

function ringDistance(px: number, py: number, ring: number[]): number {
	let d = Infinity;
	const n = ring.length / 2;
	for (let i = 0, k = n - 1; i < n; k = i++) {
		const x0 = ring[2 * k];
		const y0 = ring[2 * k + 1];
		const dx = ring[2 * i] - x0;
		const dy = ring[2 * i + 1] - y0;
		const l2 = dx * dx + dy * dy;
		let t = l2 > 0 ? ((px - x0) * dx + (py - y0) * dy) / l2 : 0;
		t = Math.max(0, Math.min(1, t));
		d = Math.min(d, Math.hypot(px - x0 - t * dx, py - y0 - t * dy));
	}
	return d;
}
