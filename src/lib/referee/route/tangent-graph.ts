// The tangent graph of a configuration space and Dijkstra over it: nodes are the points where
// straight legs touch the grown obstacles' circles (with the way round, clockwise or not), edges
// are free tangent segments and free arcs. Distances are exact arc lengths; segments are checked
// lazily, when Dijkstra first needs them, and the search stops at the budget.
import FlatQueue from 'flatqueue';
import { pointInPolygon } from '../convex';
import { meetsRegion, touchIntervals } from '../terrain';
import type { ConfigSpace } from './config-space';
import {
	angleOf,
	arcDelta,
	circleSegment,
	circleSetCrossings,
	clearanceBelow,
	pointPolyDist,
	segPolyDist,
	tangentSegment,
	TAU,
	type CSet
} from './geometry';

/** Slack of the exact tests, in inches and radians: contact (clearance 0) is not a crossing. */
const DELTA = 1e-9;
const ANG_TOL = 1e-9;

/** How a node was reached. */
const VIA_START = -1;

export interface Leg {
	/** the path as points, from the start (excluded) to the end */
	points: { x: number; y: number }[];
}

export interface Evaluation {
	/** least cost found to end here, in inches (Infinity when none within the budget) */
	costIn: number;
	/** how the last straight leg leaves: direct from the start, or from a node on a circle */
	node: number;
	circle: number;
	o: number;
	tx: number;
	ty: number;
}

export class TangentGraph {
	readonly cs: ConfigSpace;
	private readonly circles: ConfigSpace['circles'];
	private readonly arcSets: CSet[];
	/** free arcs per circle: [start, length] pairs (CCW), undefined until needed */
	private free: (Float64Array | null)[] = [];
	private freeDone: boolean[] = [];
	// nodes
	private nCircle: number[] = [];
	private nTheta: number[] = [];
	private nO: number[] = [];
	private nX: number[] = [];
	private nY: number[] = [];
	/** for a departure node: its arrival node; −1 otherwise */
	private nPartner: number[] = [];
	private nLen: number[] = [];
	/** start arrival nodes: length of the leg from the start */
	private nStartLen: number[] = [];
	private nPos: number[] = [];
	D: Float64Array = new Float64Array(0);
	private prev: Int32Array = new Int32Array(0);
	/** per circle and way round (index 2c for CCW, 2c+1 for CW): node indices sorted by angle */
	private lists: number[][] = [];
	private dmin: Float64Array = new Float64Array(0);
	/** counters for the bench */
	stats = { circles: 0, nodes: 0, segmentTests: 0, settled: 0 };

	constructor(cs: ConfigSpace) {
		this.cs = cs;
		this.circles = cs.circles;
		this.arcSets = [...cs.hard, ...cs.soft.flatMap((b) => b.sets)];
		this.stats.circles = cs.circles.length;
		this.build();
		this.search();
	}

	// ---- geometry tests

	/** Whether a point is inside an obstacle or off the rectangle (arcs and nodes may not be). */
	private pointBlocked(x: number, y: number): boolean {
		const r = this.cs.rect;
		if (x < r.x0 - DELTA || x > r.x1 + DELTA || y < r.y0 - DELTA || y > r.y1 + DELTA) return true;
		for (const s of this.arcSets) {
			if (x < s.minX || x > s.maxX || y < s.minY || y > s.maxY) continue;
			if (clearanceBelow(x, y, s, -DELTA) < -DELTA) return true;
		}
		return false;
	}

	/** Whether the straight leg crosses a hard obstacle (the rectangle is convex: ends suffice). */
	segmentBlocked(ax: number, ay: number, bx: number, by: number): boolean {
		this.stats.segmentTests++;
		const minX = Math.min(ax, bx);
		const maxX = Math.max(ax, bx);
		const minY = Math.min(ay, by);
		const maxY = Math.max(ay, by);
		for (const s of this.cs.hard) {
			if (s.minX > maxX || s.maxX < minX || s.minY > maxY || s.maxY < minY) continue;
			if (segPolyDist(ax, ay, bx, by, s.pts) < s.R - DELTA) return true;
		}
		return false;
	}

	/**
	 * Climb charged for a straight leg: up and down each block it touches, except the way up to
	 * where it starts (the first leg of a route starting on a block) and the way down from where
	 * it ends (the last leg of a route ending on top). An upper bound of the check's climb cost.
	 */
	climbCharge(ax: number, ay: number, bx: number, by: number, first: boolean, last: boolean): number {
		if (this.cs.soft.length === 0) return 0;
		let total = 0;
		const minX = Math.min(ax, bx);
		const maxX = Math.max(ax, bx);
		const minY = Math.min(ay, by);
		const maxY = Math.max(ay, by);
		let shape: ReturnType<ConfigSpace['innerAt']> | null = null;
		for (const b of this.cs.soft) {
			const bb = b.t.box;
			const rIn = b.sets[0].R;
			if (bb.minX - rIn > maxX || bb.maxX + rIn < minX || bb.minY - rIn > maxY || bb.maxY + rIn < minY) continue;
			if (b.cfg) {
				// the footprint swept along a line meets a convex outline over one interval: closed
				// form. Generous about meeting; the credit for starting or ending on top is taken only
				// where the check's own test agrees, so the charge never falls short of the check's.
				if (segPolyDist(ax, ay, bx, by, b.cfg.pts) > b.cfg.R + 1e-7) continue;
				total += 2 * b.t.heightIn;
				if (first && this.onBlock(ax, ay, b)) total -= b.t.heightIn;
				if (last && this.onBlock(bx, by, b)) total -= b.t.heightIn;
				continue;
			}
			// the inner form touches the block only if the leg comes within its edge sets, or
			// starts inside the outline (then it is on top all the way or meets an edge)
			let meets = pointInPolygon(ax, ay, b.t.ring);
			for (let i = 0; !meets && i < b.sets.length; i++) {
				const e = b.sets[i];
				if (e.minX > maxX || e.maxX < minX || e.minY > maxY || e.maxY < minY) continue;
				if (segPolyDist(ax, ay, bx, by, e.pts) < e.R) meets = true;
			}
			if (!meets) continue;
			shape ??= this.cs.innerAt(ax, ay);
			const ivs = touchIntervals(shape, bx - ax, by - ay, b.t);
			for (const [lo, hi] of ivs) {
				total += 2 * b.t.heightIn;
				if (first && lo <= 0) total -= b.t.heightIn;
				if (last && hi >= 1) total -= b.t.heightIn;
			}
		}
		return total;
	}

	/** Whether the check would see the piece at (x, y) touching the block (then it stands on it). */
	private onBlock(x: number, y: number, b: ConfigSpace['soft'][number]): boolean {
		if (this.cs.round) return pointPolyDist(x, y, b.cfg!.pts) < b.cfg!.R - 1e-7;
		return meetsRegion(this.cs.innerAt(x, y), b.t);
	}

	/** Free arcs of a circle, computed when first needed. */
	private freeOf(c: number): Float64Array | null {
		if (this.freeDone[c]) return this.free[c];
		this.freeDone[c] = true;
		const { x, y, R } = this.circles[c];
		if (R <= 0) {
			this.free[c] = this.pointBlocked(x, y) ? new Float64Array(0) : null;
			return this.free[c];
		}
		const angles: number[] = [];
		for (const s of this.arcSets) {
			if (s.minX > x + R || s.maxX < x - R || s.minY > y + R || s.maxY < y - R) continue;
			circleSetCrossings(x, y, R, s, angles);
		}
		const r = this.cs.rect;
		circleSegment(x, y, R, r.x0, r.y0, r.x1, r.y0, angles);
		circleSegment(x, y, R, r.x1, r.y0, r.x1, r.y1, angles);
		circleSegment(x, y, R, r.x1, r.y1, r.x0, r.y1, angles);
		circleSegment(x, y, R, r.x0, r.y1, r.x0, r.y0, angles);
		const at = (t: number) => this.pointBlocked(x + R * Math.cos(t), y + R * Math.sin(t));
		if (angles.length === 0) {
			this.free[c] = at(0) ? new Float64Array(0) : null;
			return this.free[c];
		}
		const norm = angles.map((t) => ((t % TAU) + TAU) % TAU).sort((a, b) => a - b);
		const cuts: number[] = [];
		for (const t of norm) if (cuts.length === 0 || t - cuts[cuts.length - 1] > 1e-12) cuts.push(t);
		const m = cuts.length;
		const freeArcs: [number, number][] = [];
		for (let i = 0; i < m; i++) {
			const a = cuts[i];
			const b = i + 1 < m ? cuts[i + 1] : cuts[0] + TAU;
			if (!at((a + b) / 2)) freeArcs.push([a, b - a]);
		}
		if (freeArcs.length === m) {
			this.free[c] = null; // every piece free: the whole circle
			return null;
		}
		// join neighbours (including across the cut at the first angle)
		const joined: [number, number][] = [];
		for (const [a, len] of freeArcs) {
			const last = joined[joined.length - 1];
			if (last && Math.abs(last[0] + last[1] - a) < 1e-12) last[1] += len;
			else joined.push([a, len]);
		}
		if (joined.length > 1) {
			const first = joined[0];
			const last = joined[joined.length - 1];
			if (Math.abs(last[0] + last[1] - (first[0] + TAU)) < 1e-12) {
				last[1] += first[1];
				joined.shift();
			}
		}
		const out = new Float64Array(joined.length * 2);
		joined.forEach(([a, len], i) => {
			out[2 * i] = a;
			out[2 * i + 1] = len;
		});
		this.free[c] = out;
		return out;
	}

	/** Which free arc holds the angle (−1: none), and the angle's place along it. */
	private intervalOf(c: number, t: number): { k: number; pos: number } {
		const f = this.freeOf(c);
		if (f === null) return { k: 0, pos: 0 };
		for (let k = 0; k < f.length; k += 2) {
			let pos = (((t - f[k]) % TAU) + TAU) % TAU;
			if (pos > TAU - ANG_TOL) pos -= TAU;
			if (pos >= -ANG_TOL && pos <= f[k + 1] + ANG_TOL) return { k, pos };
		}
		return { k: -1, pos: 0 };
	}

	/** Whether going round circle c in orientation o from angle a to angle b stays on free arc. */
	arcFree(c: number, a: number, b: number, o: number): boolean {
		const f = this.freeOf(c);
		if (f === null) return true;
		if (this.circles[c].R <= 0) return f.length > 0;
		const ia = this.intervalOf(c, a);
		if (ia.k < 0) return false;
		const ib = this.intervalOf(c, b);
		if (ib.k !== ia.k) return false;
		return o > 0 ? ib.pos >= ia.pos - ANG_TOL : ib.pos <= ia.pos + ANG_TOL;
	}

	private nodeFree(c: number, t: number): boolean {
		const f = this.freeOf(c);
		if (f === null) return true;
		if (this.circles[c].R <= 0) return f.length > 0;
		return this.intervalOf(c, t).k >= 0;
	}

	// ---- building

	private addNode(c: number, x: number, y: number, o: number): number {
		const { x: cx, y: cy } = this.circles[c];
		const i = this.nCircle.length;
		this.nCircle.push(c);
		this.nTheta.push(this.circles[c].R > 0 ? angleOf(cx, cy, x, y) : 0);
		this.nO.push(o);
		this.nX.push(x);
		this.nY.push(y);
		this.nPartner.push(-1);
		this.nLen.push(0);
		this.nStartLen.push(Infinity);
		this.nPos.push(0);
		return i;
	}

	private build(): void {
		const { sx, sy, budgetIn } = this.cs;
		const C = this.circles;
		const n = C.length;
		if (this.cs.status !== 'ok') {
			this.finishLists();
			return;
		}
		for (let c = 0; c < n; c++) {
			for (const o of [1, -1]) {
				const t = tangentSegment(sx, sy, 0, C[c].x, C[c].y, o * C[c].R);
				if (!t || t.len > budgetIn) continue;
				const theta = C[c].R > 0 ? angleOf(C[c].x, C[c].y, t.bx, t.by) : 0;
				if (!this.nodeFree(c, theta)) continue;
				const k = this.addNode(c, t.bx, t.by, o);
				this.nStartLen[k] = t.len;
			}
		}
		for (let i = 0; i < n; i++) {
			const ci = C[i];
			for (let j = i + 1; j < n; j++) {
				const cj = C[j];
				const gap = Math.hypot(ci.x - cj.x, ci.y - cj.y) - ci.R - cj.R;
				if (gap > budgetIn) continue;
				for (const oi of [1, -1]) {
					for (const oj of [1, -1]) {
						const t = tangentSegment(ci.x, ci.y, oi * ci.R, cj.x, cj.y, oj * cj.R);
						if (!t || t.len > budgetIn) continue;
						const ti = ci.R > 0 ? angleOf(ci.x, ci.y, t.ax, t.ay) : 0;
						if (!this.nodeFree(i, ti)) continue;
						const tj = cj.R > 0 ? angleOf(cj.x, cj.y, t.bx, t.by) : 0;
						if (!this.nodeFree(j, tj)) continue;
						// i → j, and the same segment the other way round
						const d1 = this.addNode(i, t.ax, t.ay, oi);
						const a1 = this.addNode(j, t.bx, t.by, oj);
						this.nPartner[d1] = a1;
						this.nLen[d1] = t.len;
						const d2 = this.addNode(j, t.bx, t.by, -oj);
						const a2 = this.addNode(i, t.ax, t.ay, -oi);
						this.nPartner[d2] = a2;
						this.nLen[d2] = t.len;
					}
				}
			}
		}
		this.finishLists();
	}

	private finishLists(): void {
		const n = this.circles.length;
		this.lists = Array.from({ length: 2 * n }, () => []);
		for (let k = 0; k < this.nCircle.length; k++) this.lists[2 * this.nCircle[k] + (this.nO[k] > 0 ? 0 : 1)].push(k);
		for (const list of this.lists) {
			list.sort((a, b) => this.nTheta[a] - this.nTheta[b]);
			list.forEach((k, i) => (this.nPos[k] = i));
		}
		this.stats.nodes = this.nCircle.length;
		this.D = new Float64Array(this.nCircle.length).fill(Infinity);
		this.prev = new Int32Array(this.nCircle.length).fill(-2);
		this.dmin = new Float64Array(n).fill(Infinity);
	}

	// ---- search

	private search(): void {
		if (this.cs.status !== 'ok') return;
		const { sx, sy, budgetIn } = this.cs;
		const q = new FlatQueue<number>();
		// heap items: node, candidate cost, predecessor (−1 start), and whether its leg still needs checking
		const iNode: number[] = [];
		const iPrev: number[] = [];
		const iCheck: number[] = [];
		const iCost: number[] = [];
		const push = (node: number, cost: number, prev: number, check: number) => {
			if (cost > budgetIn || cost >= this.D[node]) return;
			const id = iNode.length;
			iNode.push(node);
			iPrev.push(prev);
			iCheck.push(check);
			iCost.push(cost);
			q.push(id, cost);
		};
		for (let k = 0; k < this.nCircle.length; k++) if (this.nStartLen[k] < Infinity) push(k, this.nStartLen[k], VIA_START, 1);
		while (q.length) {
			const id = q.pop()!;
			const node = iNode[id];
			if (this.D[node] < Infinity) continue;
			const from = iPrev[id];
			if (iCheck[id] === 1) {
				// the leg into this node: from the start or from a departure node
				const ax = from === VIA_START ? sx : this.nX[from];
				const ay = from === VIA_START ? sy : this.nY[from];
				if (this.segmentBlocked(ax, ay, this.nX[node], this.nY[node])) continue;
				const climb = this.climbCharge(ax, ay, this.nX[node], this.nY[node], from === VIA_START, false);
				if (climb > 0) {
					push(node, iCost[id] + climb, from, 2);
					continue;
				}
			}
			const d = iCost[id];
			this.D[node] = d;
			this.prev[node] = from;
			this.stats.settled++;
			const c = this.nCircle[node];
			if (d < this.dmin[c]) this.dmin[c] = d;
			// round the circle to the next node the same way
			const list = this.lists[2 * c + (this.nO[node] > 0 ? 0 : 1)];
			if (list.length > 1) {
				const pos = this.nPos[node];
				const next = list[(pos + (this.nO[node] > 0 ? 1 : list.length - 1)) % list.length];
				if (this.D[next] === Infinity) {
					const delta = arcDelta(this.nTheta[node], this.nTheta[next], this.nO[node]);
					const len = this.circles[c].R * delta;
					if (d + len <= budgetIn && this.arcFree(c, this.nTheta[node], this.nTheta[next], this.nO[node])) push(next, d + len, node, 0);
				}
			}
			const partner = this.nPartner[node];
			if (partner >= 0 && this.D[partner] === Infinity) push(partner, d + this.nLen[node], node, 1);
		}
	}

	// ---- queries

	/** The least cost to end at (x, y), and how the last leg gets there. */
	evaluate(x: number, y: number, bound = Infinity): Evaluation {
		const cs = this.cs;
		const out: Evaluation = { costIn: Infinity, node: -1, circle: -1, o: 0, tx: cs.sx, ty: cs.sy };
		if (cs.status !== 'ok') return out;
		let best = bound;
		const direct = Math.hypot(x - cs.sx, y - cs.sy);
		if (direct < best && !this.segmentBlocked(cs.sx, cs.sy, x, y)) {
			const c = direct + this.climbCharge(cs.sx, cs.sy, x, y, true, true);
			if (c < best) {
				best = c;
				out.costIn = c;
			}
		}
		const C = this.circles;
		for (let c = 0; c < C.length; c++) {
			const dm = this.dmin[c];
			if (dm === Infinity) continue;
			const cc = C[c];
			const dist2 = (x - cc.x) ** 2 + (y - cc.y) ** 2;
			const lb = dm + Math.sqrt(Math.max(0, dist2 - cc.R * cc.R));
			if (lb >= best) continue;
			// the two legs leaving the circle tangentially for (x, y): signed radius o·R to a point
			const dx = x - cc.x;
			const dy = y - cc.y;
			const d = Math.sqrt(dist2);
			if (d === 0 || cc.R > d) continue;
			const ex = dx / d;
			const ey = dy / d;
			const len = Math.sqrt(Math.max(0, dist2 - cc.R * cc.R));
			const a = len / d;
			for (let oi = 0; oi < 2; oi++) {
				const o = oi === 0 ? 1 : -1;
				const b = (o * cc.R) / d;
				// direction u = a·e + b·left(e); the tangent point is c − o·R·left(u)
				const ux = a * ex - b * ey;
				const uy = a * ey + b * ex;
				const tx = cc.x + o * cc.R * uy;
				const ty = cc.y - o * cc.R * ux;
				const theta = cc.R > 0 ? angleOf(cc.x, cc.y, tx, ty) : 0;
				const k = this.prevNode(c, o, theta);
				if (k < 0) continue;
				const dk = this.D[k];
				if (dk === Infinity) continue;
				const arc = cc.R * arcDelta(this.nTheta[k], theta, o);
				const cost = dk + arc + len;
				if (cost >= best) continue;
				if (!this.arcFree(c, this.nTheta[k], theta, o)) continue;
				if (this.segmentBlocked(tx, ty, x, y)) continue;
				const total = cost + this.climbCharge(tx, ty, x, y, false, true);
				if (total < best) {
					best = total;
					out.costIn = total;
					out.node = k;
					out.circle = c;
					out.o = o;
					out.tx = tx;
					out.ty = ty;
				}
			}
		}
		return out;
	}

	/** The node met last before angle t going round circle c in orientation o. */
	private prevNode(c: number, o: number, t: number): number {
		const list = this.lists[2 * c + (o > 0 ? 0 : 1)];
		const n = list.length;
		if (n === 0) return -1;
		if (this.circles[c].R <= 0) {
			// a point: every node on it is "before"; take the cheapest
			let best = -1;
			for (const k of list) if (this.D[k] < Infinity && (best < 0 || this.D[k] < this.D[best])) best = k;
			return best;
		}
		// first index with theta > t
		let lo = 0;
		let hi = n;
		while (lo < hi) {
			const mid = (lo + hi) >> 1;
			if (this.nTheta[list[mid]] <= t) lo = mid + 1;
			else hi = mid;
		}
		if (o > 0) return list[(lo - 1 + n) % n];
		// clockwise: the first node at or after t
		let idx = lo;
		if (idx > 0 && this.nTheta[list[idx - 1]] === t) idx--;
		return list[idx % n];
	}

	/** The route to (x, y) as points (start excluded), arcs as circumscribed polylines. */
	routeTo(ev: Evaluation, x: number, y: number, arcStepRad: number, margin: number): { x: number; y: number }[] {
		const pts: { x: number; y: number }[] = [{ x, y }];
		if (ev.node < 0) return pts;
		// the leg leaves circle ev.circle at (tx, ty) after rounding it from node ev.node
		const rev: { x: number; y: number }[] = [{ x, y }];
		this.pushArc(rev, ev.circle, ev.o, this.nTheta[ev.node], angleOf(this.circles[ev.circle].x, this.circles[ev.circle].y, ev.tx, ev.ty), ev.tx, ev.ty, arcStepRad, margin);
		let k = ev.node;
		rev.push({ x: this.nX[k], y: this.nY[k] });
		while (k >= 0) {
			const p = this.prev[k];
			if (p === VIA_START) break;
			if (this.nCircle[p] === this.nCircle[k] && this.nO[p] === this.nO[k] && this.nPartner[p] !== k) {
				// an arc from p to k
				this.pushArc(rev, this.nCircle[k], this.nO[k], this.nTheta[p], this.nTheta[k], this.nX[k], this.nY[k], arcStepRad, margin);
			}
			rev.push({ x: this.nX[p], y: this.nY[p] });
			k = p;
		}
		rev.reverse();
		// drop repeats (zero-length legs)
		const out: { x: number; y: number }[] = [];
		let px = this.cs.sx;
		let py = this.cs.sy;
		for (const p of rev) {
			if (Math.hypot(p.x - px, p.y - py) < 1e-12) continue;
			out.push(p);
			px = p.x;
			py = p.y;
		}
		if (out.length === 0) out.push({ x, y });
		return out;
	}

	/**
	 * Points (pushed in reverse travel order: end side first) of the polyline circumscribed about
	 * the arc from angle a to b; its vertices lie at most `margin` outside the circle.
	 */
	private pushArc(rev: { x: number; y: number }[], c: number, o: number, a: number, b: number, ex: number, ey: number, stepRad: number, margin: number): void {
		const { x: cx, y: cy, R } = this.circles[c];
		if (R <= 0) return;
		const delta = arcDelta(a, b, o);
		if (delta < 1e-9) return;
		// step so the polyline's corners stay within `margin` of the circle: R(sec(h/2) − 1) ≤ margin
		const maxStep = Math.min(stepRad, 2 * Math.acos(1 / (1 + margin / R)));
		const k = Math.max(1, Math.ceil(delta / maxStep));
		const h = delta / k;
		const rr = R / Math.cos(h / 2);
		rev.push({ x: ex, y: ey });
		for (let j = k - 1; j >= 0; j--) {
			const t = a + o * (j + 0.5) * h;
			rev.push({ x: cx + rr * Math.cos(t), y: cy + rr * Math.sin(t) });
		}
	}
}
