// The route finder's public face for one piece: least cost to a point, the route there as
// waypoints the check accepts, the reach map (the allowance level set of the cost field, cut by
// the end rules, traced as polygons) with an exact point test, and the nearest legal end.
import { climbIn, type Touch } from '../path-cost';
import { touchIntervals } from '../terrain';
import { ARC_EXCESS, ARC_STEP_RAD, buildConfigSpace, endClearance, MARGIN_IN, type ConfigSpace, type RouteRequest, type Status } from './config-space';
import { clearanceBelow, ringArea } from './geometry';
import { TangentGraph } from './tangent-graph';

export interface RoutePoint {
	x: number;
	y: number;
}

export interface RouteResult {
	/** the finder found a legal route ending here within the allowance */
	reachable: boolean;
	status: Status;
	/** why not, in a sentence (unset when reachable) */
	reason?: string;
	/** the path for the check: from the start (excluded) to the end, no facings (fixed facing) */
	waypoints: RoutePoint[];
	/** the check's cost of those waypoints, in inches (Infinity when there is no route) */
	costIn: number;
	horizontalIn: number;
	climbIn: number;
	allowanceIn: number;
	/** the end keeps every end rule */
	endLegal: boolean;
}

export interface ReachMap {
	status: Status;
	reason?: string;
	allowanceIn: number;
	/** closed rings, flat [x0, y0, x1, y1, …] in inches; outer rings CCW (positive area), holes CW */
	rings: number[][];
	/** area of the region, in square inches */
	areaIn2: number;
	/** the lattice spacing the rings were traced on, in inches */
	cellIn: number;
	/** where the piece starts */
	start: RoutePoint;
}

export interface NearestResult {
	/** the legal end found nearest to the proposed one, or null when the piece can go nowhere */
	at: RoutePoint | null;
	/** how far it is from the proposed end, in inches */
	distanceIn: number;
	route: RouteResult | null;
}

export interface ReachOptions {
	/** lattice spacing for tracing, in inches (default: budget / 60, within 0.04–0.25) */
	cellIn?: number;
}

export class RoutePlanner {
	readonly space: ConfigSpace;
	readonly graph: TangentGraph;
	/** allowance + ε: the check's limit on cost */
	readonly limitIn: number;
	private map: ReachMap | null = null;

	constructor(req: RouteRequest) {
		this.space = buildConfigSpace(req);
		this.graph = new TangentGraph(this.space);
		this.limitIn = this.space.allowanceIn + this.space.profile.tolerance;
	}

	get status(): Status {
		return this.space.status;
	}

	/** The least cost found to end at the point (an upper bound of the check's cost), or Infinity. */
	costTo(x: number, y: number): number {
		return this.graph.evaluate(x, y).costIn;
	}

	/** Signed margin by which an end at the point keeps the end rules (≥ 0: legal). */
	endClearanceAt(x: number, y: number): number {
		return endClearance(this.space, x, y);
	}

	/** The exact point test of the reach map: a legal end that the finder reaches in the allowance. */
	inReach(x: number, y: number): boolean {
		if (this.space.status !== 'ok') return false;
		if (endClearance(this.space, x, y) < 0) return false;
		const bound = this.limitIn / (1 + ARC_EXCESS);
		if (Math.hypot(x - this.space.sx, y - this.space.sy) > bound) return false;
		return this.graph.evaluate(x, y, bound + 1e-12).costIn <= bound;
	}

	/** The shortest route the finder knows to end at (x, y), as waypoints for the check. */
	findRoute(x: number, y: number): RouteResult {
		const cs = this.space;
		const base: RouteResult = {
			reachable: false,
			status: cs.status,
			waypoints: [],
			costIn: Infinity,
			horizontalIn: 0,
			climbIn: 0,
			allowanceIn: cs.allowanceIn,
			endLegal: false
		};
		if (cs.status !== 'ok') return { ...base, reason: cs.reason };
		base.endLegal = endClearance(cs, x, y) >= 0;
		const ev = this.graph.evaluate(x, y);
		if (ev.costIn === Infinity) {
			const why = cs.budgetIn > this.limitIn ? `within ${fmt(cs.budgetIn)} in` : `within the allowance of ${fmt(cs.allowanceIn)} in`;
			return { ...base, reason: `no route for ${cs.piece.id} ${why} ends there` };
		}
		const waypoints = this.graph.routeTo(ev, x, y, ARC_STEP_RAD, MARGIN_IN / 2);
		const cost = routeCost(cs, waypoints);
		const within = ev.costIn * (1 + ARC_EXCESS) <= this.limitIn && cost.total <= this.limitIn;
		const out: RouteResult = {
			...base,
			waypoints,
			costIn: cost.total,
			horizontalIn: cost.horizontal,
			climbIn: cost.climb,
			reachable: within && base.endLegal
		};
		if (!base.endLegal) out.reason = `${cs.piece.id} may not end there: too close to a piece, terrain or the edge`;
		else if (!within) out.reason = `the route costs ${fmt(cost.total)} in; ${cs.piece.id} may move ${fmt(cs.allowanceIn)} in`;
		return out;
	}

	/** The region of legal ends within the allowance, as rings (memoised per planner). */
	reachMap(opts: ReachOptions = {}): ReachMap {
		if (this.map && (opts.cellIn === undefined || opts.cellIn === this.map.cellIn)) return this.map;
		const cs = this.space;
		const start = { x: cs.sx, y: cs.sy };
		const cellDefault = Math.min(0.25, Math.max(0.04, this.limitIn / 60));
		const h = opts.cellIn ?? cellDefault;
		if (cs.status !== 'ok') {
			this.map = { status: cs.status, reason: cs.reason, allowanceIn: cs.allowanceIn, rings: [], areaIn2: 0, cellIn: h, start };
			return this.map;
		}
		const rings = this.trace(h);
		let area = 0;
		for (const r of rings) area += ringArea(r);
		this.map = { status: cs.status, allowanceIn: cs.allowanceIn, rings, areaIn2: area, cellIn: h, start };
		return this.map;
	}

	/** The legal end within reach nearest to (x, y): the point itself when it is one. */
	nearestLegal(x: number, y: number): NearestResult {
		if (this.inReach(x, y)) return { at: { x, y }, distanceIn: 0, route: this.findRoute(x, y) };
		const map = this.reachMap();
		const h = map.cellIn;
		type Cand = { d: number; qx: number; qy: number; nx: number; ny: number };
		const cands: Cand[] = [];
		for (const ring of map.rings) {
			const n = ring.length / 2;
			for (let i = 0; i < n; i++) {
				const k = (i + 1) % n;
				const ax = ring[2 * i];
				const ay = ring[2 * i + 1];
				const dx = ring[2 * k] - ax;
				const dy = ring[2 * k + 1] - ay;
				const l2 = dx * dx + dy * dy;
				if (l2 === 0) continue;
				const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / l2));
				const qx = ax + t * dx;
				const qy = ay + t * dy;
				const l = Math.sqrt(l2);
				// the region lies to the left of every ring edge
				cands.push({ d: Math.hypot(qx - x, qy - y), qx, qy, nx: -dy / l, ny: dx / l });
			}
		}
		cands.sort((a, b) => a.d - b.d);
		let best: { x: number; y: number; d: number } | null = null;
		for (const c of cands.slice(0, 40)) {
			if (best && c.d >= best.d) break;
			for (const step of [0, 0.25, 0.5, 1, 2, 3]) {
				const qx = c.qx + c.nx * step * h;
				const qy = c.qy + c.ny * step * h;
				if (!this.inReach(qx, qy)) continue;
				// walk back towards the proposed end while the point stays legal
				let lo = 0;
				let hi = 1;
				for (let it = 0; it < 14; it++) {
					const m = (lo + hi) / 2;
					if (this.inReach(qx + (x - qx) * m, qy + (y - qy) * m)) lo = m;
					else hi = m;
				}
				const px = qx + (x - qx) * lo;
				const py = qy + (y - qy) * lo;
				const d = Math.hypot(px - x, py - y);
				if (!best || d < best.d) best = { x: px, y: py, d };
				break;
			}
		}
		if (!best) return { at: null, distanceIn: Infinity, route: null };
		return { at: { x: best.x, y: best.y }, distanceIn: best.d, route: this.findRoute(best.x, best.y) };
	}

	// ---- tracing

	/**
	 * The field whose zero level is the reach map's edge: positive outside. It is the largest of
	 * (cost − limit), the end rules' violation and the hard obstacles' violation (which keeps it
	 * continuous across walls), capped at ±cap so that a jump (the climb onto a block) moves the
	 * traced edge by less than a cell.
	 */
	private field(x: number, y: number, cap: number): number {
		const cs = this.space;
		const k = 1 + ARC_EXCESS;
		const direct = Math.hypot(x - cs.sx, y - cs.sy) * k - this.limitIn;
		if (direct >= cap) return cap;
		const g = endClearance(cs, x, y, cap);
		if (-g >= cap) return cap;
		let hc = Infinity;
		for (const s of cs.hard) {
			if (x < s.minX - cap || x > s.maxX + cap || y < s.minY - cap || y > s.maxY + cap) continue;
			const c = clearanceBelow(x, y, s, Math.min(hc, cap));
			if (c < hc) hc = c;
		}
		if (-hc >= cap) return cap;
		let f = Math.max(direct, -g, -hc);
		if (f < cap && hc >= 0) {
			const c = this.graph.evaluate(x, y, (this.limitIn + cap) / k).costIn;
			f = c === Infinity ? cap : Math.max(f, c * k - this.limitIn);
		}
		return Math.max(-cap, Math.min(cap, f));
	}

	/**
	 * Marching squares over a lattice of spacing h, with a border of "outside" so rings close.
	 * The field is 1-Lipschitz away from jumps (which lie where it is positive anyway), so it is
	 * first sampled every 4 cells and only blocks where it comes near zero are sampled finely.
	 */
	private trace(h: number): number[][] {
		const cs = this.space;
		const reach = this.limitIn + h;
		const x0 = Math.max(cs.rect.x0, cs.sx - reach) - h;
		const y0 = Math.max(cs.rect.y0, cs.sy - reach) - h;
		const x1 = Math.min(cs.rect.x1, cs.sx + reach) + h;
		const y1 = Math.min(cs.rect.y1, cs.sy + reach) + h;
		const B = 4;
		const bx = Math.max(1, Math.ceil((x1 - x0) / (h * B)));
		const by = Math.max(1, Math.ceil((y1 - y0) / (h * B)));
		const nx = bx * B + 1;
		const ny = by * B + 1;
		const cap = 2 * h;
		const H = h * B;
		const F = new Float64Array(nx * ny).fill(NaN);
		const at = (i: number, j: number) => {
			const v = j * nx + i;
			let f = F[v];
			if (Number.isNaN(f)) {
				const border = i === 0 || j === 0 || i === nx - 1 || j === ny - 1;
				f = border ? cap : this.field(x0 + i * h, y0 + j * h, cap);
				F[v] = f;
			}
			return f;
		};
		// coarse pass: a block whose corners are all farther than its diagonal from zero keeps one sign
		const coarse = new Float64Array((bx + 1) * (by + 1));
		for (let J = 0; J <= by; J++) {
			for (let I = 0; I <= bx; I++) {
				const i = I * B;
				const j = J * B;
				const border = i === 0 || j === 0 || i === nx - 1 || j === ny - 1;
				coarse[J * (bx + 1) + I] = border ? 2 * H : this.field(x0 + i * h, y0 + j * h, 2 * H);
			}
		}
		const reachSure = H * Math.SQRT2 * (1 + ARC_EXCESS) + 1e-9;
		for (let J = 0; J < by; J++) {
			for (let I = 0; I < bx; I++) {
				const c = [coarse[J * (bx + 1) + I], coarse[J * (bx + 1) + I + 1], coarse[(J + 1) * (bx + 1) + I], coarse[(J + 1) * (bx + 1) + I + 1]];
				const allOut = c.every((v) => v > reachSure);
				const allIn = c.every((v) => v < -reachSure);
				if (!allOut && !allIn) continue;
				const fill = allOut ? cap : -cap;
				for (let j = J * B; j <= (J + 1) * B; j++) {
					for (let i = I * B; i <= (I + 1) * B; i++) {
						const v = j * nx + i;
						if (Number.isNaN(F[v])) F[v] = fill;
					}
				}
			}
		}
		const inside = (i: number, j: number) => at(i, j) <= 0;
		// crossing point of an edge: horizontal edge (i, j)–(i+1, j) has id 2(j·nx+i), vertical +1
		const pointOf = (id: number): [number, number] => {
			const v = id >> 1;
			const i = v % nx;
			const j = (v - i) / nx;
			const fa = F[v];
			const fb = id & 1 ? F[v + nx] : F[v + 1];
			const t = fa / (fa - fb);
			return id & 1 ? [x0 + i * h, y0 + (j + t) * h] : [x0 + (i + t) * h, y0 + j * h];
		};
		const next = new Int32Array(2 * nx * ny).fill(-1);
		const starts: number[] = [];
		const edges = [0, 0, 0, 0];
		const ins = [false, false, false, false];
		for (let j = 0; j < ny - 1; j++) {
			for (let i = 0; i < nx - 1; i++) {
				// corners counter-clockwise, and the edge from each corner to the next
				ins[0] = inside(i, j);
				ins[1] = inside(i + 1, j);
				ins[2] = inside(i + 1, j + 1);
				ins[3] = inside(i, j + 1);
				if (ins[0] === ins[1] && ins[1] === ins[2] && ins[2] === ins[3]) continue;
				edges[0] = 2 * (j * nx + i);
				edges[1] = 2 * (j * nx + i + 1) + 1;
				edges[2] = 2 * ((j + 1) * nx + i);
				edges[3] = 2 * (j * nx + i) + 1;
				let exits = 0;
				for (let e = 0; e < 4; e++) if (ins[e] && !ins[(e + 1) % 4]) exits++;
				const connected = exits === 2 && this.field(x0 + (i + 0.5) * h, y0 + (j + 0.5) * h, cap) <= 0;
				for (let e = 0; e < 4; e++) {
					if (!(ins[e] && !ins[(e + 1) % 4])) continue;
					// the entry met next going round counter-clockwise (inside joined through the
					// centre) or going back clockwise (inside corners kept apart)
					for (let s = 1; s < 4; s++) {
						const cand = connected ? (e + s) % 4 : (e - s + 4) % 4;
						if (!ins[cand] && ins[(cand + 1) % 4]) {
							next[edges[e]] = edges[cand];
							starts.push(edges[e]);
							break;
						}
					}
				}
			}
		}
		const rings: number[][] = [];
		const done = new Uint8Array(2 * nx * ny);
		for (const startId of starts) {
			if (done[startId]) continue;
			const ring: number[] = [];
			let id = startId;
			while (id >= 0 && !done[id]) {
				done[id] = 1;
				const [px, py] = pointOf(id);
				ring.push(px, py);
				id = next[id];
			}
			if (ring.length >= 6) rings.push(simplify(ring, h * 1e-3));
		}
		return rings;
	}
}

/** Drops vertices that lie within `tol` of the line through their neighbours. */
function simplify(ring: number[], tol: number): number[] {
	const n = ring.length / 2;
	if (n <= 4) return ring;
	const out: number[] = [];
	for (let i = 0; i < n; i++) {
		const p = (i - 1 + n) % n;
		const q = (i + 1) % n;
		const ax = ring[2 * p];
		const ay = ring[2 * p + 1];
		const bx = ring[2 * q];
		const by = ring[2 * q + 1];
		const l = Math.hypot(bx - ax, by - ay);
		const d = l > 0 ? Math.abs((bx - ax) * (ring[2 * i + 1] - ay) - (by - ay) * (ring[2 * i] - ax)) / l : 0;
		if (d > tol) out.push(ring[2 * i], ring[2 * i + 1]);
	}
	return out.length >= 6 ? out : ring;
}

/** The check's cost of waypoints from the start: horizontal length plus climbing (fixed facing). */
export function routeCost(cs: ConfigSpace, waypoints: RoutePoint[]): { total: number; horizontal: number; climb: number } {
	let horizontal = 0;
	const touches: Touch[] = [];
	let px = cs.sx;
	let py = cs.sy;
	let legs = 0;
	for (const w of waypoints) {
		const dx = w.x - px;
		const dy = w.y - py;
		if (dx === 0 && dy === 0) continue;
		horizontal += Math.hypot(dx, dy);
		for (const b of cs.soft) {
			for (const [lo, hi] of touchIntervals(cs.innerAt(px, py), dx, dy, b.t)) touches.push({ from: legs + lo, to: legs + hi, heightIn: b.t.heightIn });
		}
		legs++;
		px = w.x;
		py = w.y;
	}
	const climb = climbIn(touches, legs);
	return { total: horizontal + climb, horizontal, climb };
}

function fmt(v: number): string {
	return v.toFixed(2);
}

/** One-shot helpers (a planner is cheaper when asking several questions of the same move). */
export function findRoute(req: RouteRequest, x: number, y: number): RouteResult {
	return new RoutePlanner(req).findRoute(x, y);
}

export function reachMap(req: RouteRequest, opts?: ReachOptions): ReachMap {
	return new RoutePlanner(req).reachMap(opts);
}

export function nearestLegal(req: RouteRequest, x: number, y: number): NearestResult {
	return new RoutePlanner(req).nearestLegal(x, y);
}
