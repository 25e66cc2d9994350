// The reference the route finder is measured against: a fine grid search (0.01 in cells, 16
// neighbours) for a round-based piece. Cells are classified with the engine's own footprint and
// terrain predicates at the check's thresholds (not with the finder's configuration space), steps
// cost their length plus the change of climb level, and Dijkstra runs over the lattice.
import FlatQueue from 'flatqueue';
import { signedDistance, type Rounded } from '../../../src/lib/referee/convex';
import { localFootprint, place } from '../../../src/lib/referee/footprints';
import { resolveProfile } from '../../../src/lib/referee/profile';
import { meetsRegion, overhangOf, prepareTerrain, wallMet } from '../../../src/lib/referee/terrain';
import type { MoveKind } from '../../../src/lib/schemas/check';
import type { RouteTable } from '../../../src/lib/referee/route';

/** The 16 lattice directions: (±1,0), (0,±1), (±1,±1), (±2,±1), (±1,±2). */
export const STEPS: [number, number][] = [
	[1, 0], [-1, 0], [0, 1], [0, -1],
	[1, 1], [1, -1], [-1, 1], [-1, -1],
	[2, 1], [2, -1], [-2, 1], [-2, -1],
	[1, 2], [1, -2], [-1, 2], [-1, -2]
];

/**
 * In open ground a 16-neighbour grid's "circle" of radius d is the 16-gon with vertices at
 * distance d in the 16 step directions, so it over-estimates straight distances by up to
 * sec(13.28°) − 1 ≈ 2.7 % and its ball has a smaller area than the disc. Scaling the allowance by
 * √(π / area of the unit 16-gon) gives a grid region of the right area in open ground: the
 * correction used when comparing areas.
 */
export function gridAreaCorrection(): number {
	const angles = STEPS.map(([x, y]) => Math.atan2(y, x)).sort((a, b) => a - b);
	let area = 0;
	for (let i = 0; i < angles.length; i++) {
		const a = angles[i];
		const b = i + 1 < angles.length ? angles[i + 1] : angles[0] + 2 * Math.PI;
		area += 0.5 * Math.sin(b - a);
	}
	return Math.sqrt(Math.PI / area);
}

export interface GridResult {
	cellIn: number;
	x0: number;
	y0: number;
	nx: number;
	ny: number;
	/** least grid cost to each cell centre (Infinity: not reached within the budget) */
	cost: Float64Array;
	/** 1 where a piece may end */
	endOk: Uint8Array;
	/** area of cells with cost ≤ limit and a legal end, in square inches */
	areaIn2(limitIn: number): number;
	costAt(x: number, y: number): number;
	endOkAt(x: number, y: number): boolean;
}

export function gridReach(table: RouteTable, pieceId: string, kind: MoveKind, die: number | undefined, budgetIn: number, cellIn = 0.01): GridResult {
	const profile = resolveProfile(table.profile);
	const eps = profile.tolerance;
	const piece = table.pieces.find((p) => p.id === pieceId)!;
	if (piece.footprint.shape !== 'round') throw new Error('the grid reference handles round bases');
	const rho = piece.footprint.diameterMm / 25.4 / 2;
	const rIn = Math.max(0, rho - eps);
	const unit = piece.leaderOf ?? piece.unit;
	const flies = piece.flies === true;
	const bulky = new Set<string>(profile.bulky);
	const climber = new Set<string>(profile.climbers).has(piece.class);
	const wallPasser = new Set<string>(profile.wallPassers).has(piece.class);
	const sx = piece.at.x;
	const sy = piece.at.y;
	const W = table.board.width;
	const Dp = table.board.depth;
	const terrain = (table.board.terrain ?? []).map(prepareTerrain);
	const others = table.pieces
		.filter((o) => o.id !== piece.id)
		.map((o) => ({
			o,
			set: place(localFootprint(o.footprint, eps).outer, o.at.x, o.at.y, o.at.facing ?? 0),
			enemy: o.side !== piece.side,
			member: (o.leaderOf ?? o.unit) === unit,
			bulky: bulky.has(o.class)
		}))
		.map((e) => ({ ...e, bound: localFootprint(e.o.footprint, eps).rMaxIn }))
		// a piece matters to a cell within the budget only within keep-out + both footprints
		.filter((e) => Math.hypot(e.o.at.x - sx, e.o.at.y - sy) - e.bound < budgetIn + profile.keepOut + rho + 1);
	const reachOf = profile.keepOut + eps + rho + 0.5;

	const h = cellIn;
	const x0 = Math.max(0, sx - budgetIn - 2 * h);
	const y0 = Math.max(0, sy - budgetIn - 2 * h);
	const nx = Math.ceil((Math.min(W, sx + budgetIn + 2 * h) - x0) / h) + 1;
	const ny = Math.ceil((Math.min(Dp, sy + budgetIn + 2 * h) - y0) / h) + 1;
	const N = nx * ny;
	const free = new Uint8Array(N);
	const endOk = new Uint8Array(N);
	const level = new Float64Array(N);
	const climbs = flies ? profile.fliersPayClimb : true;
	for (let j = 0; j < ny; j++) {
		const y = y0 + j * h;
		for (let i = 0; i < nx; i++) {
			const x = x0 + i * h;
			const v = j * nx + i;
			if (Math.hypot(x - sx, y - sy) > budgetIn + h) continue;
			// the check's off-board rule: the footprint's box beyond the edge by more than ε
			if (x - rho < -eps || y - rho < -eps || x + rho > W + eps || y + rho > Dp + eps) continue;
			const outer: Rounded = { pts: [x, y], r: rho };
			const inner: Rounded = { pts: [x, y], r: rIn };
			let pass = true;
			let end = true;
			for (const e of others) {
				// centre distance minus both bounding radii is a lower bound of the gap
				if (Math.hypot(e.o.at.x - x, e.o.at.y - y) - e.bound > reachOf) continue;
				const d = signedDistance(outer, e.set);
				if (!flies && !e.member) {
					if (e.enemy && (kind === 'move' || kind === 'dash') && d <= profile.keepOut + eps) pass = false;
					if (e.enemy && d < -eps) pass = false;
					if (piece.class && bulky.has(piece.class) && e.bulky && d < -eps) pass = false;
				}
				if (d < -eps) end = false;
				if (e.enemy && d <= profile.keepOut + eps) end = false;
			}
			let lv = 0;
			for (const t of terrain) {
				if (t.kind === 'impassable') {
					if (meetsRegion(inner, t)) {
						end = false;
						if (!flies || !profile.fliersCrossImpassable) pass = false;
					}
				} else if (t.kind === 'ruin') {
					if (!flies && !wallPasser && wallMet(inner, t)) pass = false;
					if (profile.ruinFloorOverhang && meetsRegion(inner, t) && overhangOf(inner, outer, t) > 0) end = false;
				} else if (t.kind === 'block') {
					if (meetsRegion(inner, t)) {
						if (!flies && !climber) pass = false;
						if (climbs) lv = Math.max(lv, t.heightIn);
						if (overhangOf(inner, outer, t) > 0) end = false;
					}
				}
			}
			if (!pass) continue;
			free[v] = 1;
			endOk[v] = end ? 1 : 0;
			level[v] = lv;
		}
	}
	// Dijkstra from the cell nearest the start
	const si = Math.round((sx - x0) / h);
	const sj = Math.round((sy - y0) / h);
	const cost = new Float64Array(N).fill(Infinity);
	const start = sj * nx + si;
	const q = new FlatQueue<number>();
	// the start cell is where the piece stands, whatever the classification says
	free[start] = 1;
	const startOffset = Math.hypot(si * h + x0 - sx, sj * h + y0 - sy);
	cost[start] = startOffset;
	q.push(start, startOffset);
	const lens = STEPS.map(([a, b]) => Math.hypot(a, b) * h);
	while (q.length) {
		const v = q.pop()!;
		const c = cost[v];
		const i = v % nx;
		const j = (v - i) / nx;
		for (let k = 0; k < 16; k++) {
			const ii = i + STEPS[k][0];
			const jj = j + STEPS[k][1];
			if (ii < 0 || jj < 0 || ii >= nx || jj >= ny) continue;
			const w = jj * nx + ii;
			if (!free[w]) continue;
			const nc = c + lens[k] + Math.abs(level[w] - level[v]);
			if (nc < cost[w] && nc <= budgetIn) {
				cost[w] = nc;
				q.push(w, nc);
			}
		}
	}
	const idx = (x: number, y: number) => {
		const i = Math.round((x - x0) / h);
		const j = Math.round((y - y0) / h);
		return i < 0 || j < 0 || i >= nx || j >= ny ? -1 : j * nx + i;
	};
	return {
		cellIn: h,
		x0,
		y0,
		nx,
		ny,
		cost,
		endOk,
		areaIn2(limitIn: number) {
			let n = 0;
			for (let v = 0; v < N; v++) if (endOk[v] && cost[v] <= limitIn) n++;
			return n * h * h;
		},
		costAt(x: number, y: number) {
			const v = idx(x, y);
			return v < 0 ? Infinity : cost[v];
		},
		endOkAt(x: number, y: number) {
			const v = idx(x, y);
			return v >= 0 && endOk[v] === 1;
		}
	};
}
