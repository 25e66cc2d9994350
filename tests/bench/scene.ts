// Seeded random tables and moves for the bench and the agreement test: a full 300-piece,
// 20-terrain scene, a smaller one, and proposed moves with a mix of legal and illegal outcomes.
import type { Footprint, MoveKind, PieceClass, PieceIn, Pose, RefRequest, TerrainIn, Xy } from './reference-check';

/** Small fast generator (mulberry32): the same seed always gives the same table. */
export function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

type Rand = () => number;
const between = (r: Rand, lo: number, hi: number) => lo + (hi - lo) * r();
const pick = <T>(r: Rand, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
const round3 = (v: number) => Math.round(v * 1000) / 1000;

export interface UnitSpec {
	unit: string;
	side: 'red' | 'blue';
	class: PieceClass;
	size: number;
	footprint: Footprint;
	allowance: number;
	flies?: boolean;
	ring?: number;
}

const r25: Footprint = { shape: 'round', diameterMm: 25 };
const r28: Footprint = { shape: 'round', diameterMm: 28 };
const r32: Footprint = { shape: 'round', diameterMm: 32 };
const r40: Footprint = { shape: 'round', diameterMm: 40 };
const r100: Footprint = { shape: 'round', diameterMm: 100 };
const o60: Footprint = { shape: 'oval', lengthMm: 60, widthMm: 35 };
const o75: Footprint = { shape: 'oval', lengthMm: 75, widthMm: 42 };
const o120: Footprint = { shape: 'oval', lengthMm: 120, widthMm: 92 };
const box: Footprint = { shape: 'hull', points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] };
const wedge: Footprint = { shape: 'hull', points: [[-2, -1.2], [1.4, -1.2], [2.4, 0], [1.4, 1.2], [-2, 1.2]] };
const skiff: Footprint = { shape: 'hull', points: [[-1.8, -0.9], [1.8, -0.6], [1.8, 0.6], [-1.8, 0.9]] };

/** 150 pieces a side; "b-20" is the 20-piece unit the bench times, "r-60" the 60-piece one. */
export const FULL_ARMIES: UnitSpec[] = [
	{ unit: 'r-60', side: 'red', class: 'foot', size: 60, footprint: r25, allowance: 6 },
	{ unit: 'r-20a', side: 'red', class: 'foot', size: 20, footprint: r32, allowance: 6, ring: 6 },
	{ unit: 'r-20b', side: 'red', class: 'swarm', size: 20, footprint: r40, allowance: 5 },
	{ unit: 'r-10a', side: 'red', class: 'beast', size: 10, footprint: o60, allowance: 8 },
	{ unit: 'r-10b', side: 'red', class: 'foot', size: 10, footprint: r32, allowance: 10, flies: true },
	{ unit: 'r-5', side: 'red', class: 'mounted', size: 5, footprint: o75, allowance: 10 },
	{ unit: 'r-3', side: 'red', class: 'vehicle', size: 3, footprint: box, allowance: 10 },
	{ unit: 'r-1', side: 'red', class: 'monster', size: 1, footprint: r100, allowance: 8, ring: 6 },
	{ unit: 'r-20c', side: 'red', class: 'foot', size: 20, footprint: r28, allowance: 6 },
	{ unit: 'r-1f', side: 'red', class: 'vehicle', size: 1, footprint: skiff, allowance: 12, flies: true },
	{ unit: 'b-20', side: 'blue', class: 'foot', size: 20, footprint: r32, allowance: 6, ring: 6 },
	{ unit: 'b-20b', side: 'blue', class: 'foot', size: 20, footprint: r25, allowance: 6 },
	{ unit: 'b-20c', side: 'blue', class: 'beast', size: 20, footprint: o60, allowance: 7 },
	{ unit: 'b-20d', side: 'blue', class: 'foot', size: 20, footprint: r28, allowance: 6 },
	{ unit: 'b-20e', side: 'blue', class: 'swarm', size: 20, footprint: r32, allowance: 5 },
	{ unit: 'b-12', side: 'blue', class: 'swarm', size: 12, footprint: r40, allowance: 6 },
	{ unit: 'b-10b', side: 'blue', class: 'mounted', size: 10, footprint: o60, allowance: 10 },
	{ unit: 'b-5a', side: 'blue', class: 'foot', size: 5, footprint: r32, allowance: 10, flies: true },
	{ unit: 'b-5b', side: 'blue', class: 'vehicle', size: 5, footprint: wedge, allowance: 9 },
	{ unit: 'b-10c', side: 'blue', class: 'beast', size: 10, footprint: o60, allowance: 8 },
	{ unit: 'b-3c', side: 'blue', class: 'monster', size: 3, footprint: o120, allowance: 7 },
	{ unit: 'b-3', side: 'blue', class: 'vehicle', size: 3, footprint: box, allowance: 10 },
	{ unit: 'b-2', side: 'blue', class: 'monster', size: 2, footprint: r100, allowance: 9, flies: true, ring: 6 }
];

/** About 80 pieces, for the agreement test that runs inside the unit-test suite. */
export const SMALL_ARMIES: UnitSpec[] = [
	{ unit: 'r-20', side: 'red', class: 'foot', size: 20, footprint: r32, allowance: 6, ring: 6 },
	{ unit: 'r-8', side: 'red', class: 'beast', size: 8, footprint: o60, allowance: 8 },
	{ unit: 'r-5f', side: 'red', class: 'foot', size: 5, footprint: r28, allowance: 10, flies: true },
	{ unit: 'r-3', side: 'red', class: 'vehicle', size: 3, footprint: box, allowance: 10 },
	{ unit: 'r-1', side: 'red', class: 'monster', size: 1, footprint: r100, allowance: 8 },
	{ unit: 'b-20', side: 'blue', class: 'foot', size: 20, footprint: r25, allowance: 6 },
	{ unit: 'b-10', side: 'blue', class: 'swarm', size: 10, footprint: r40, allowance: 5 },
	{ unit: 'b-6', side: 'blue', class: 'mounted', size: 6, footprint: o75, allowance: 10, ring: 6 },
	{ unit: 'b-3', side: 'blue', class: 'vehicle', size: 3, footprint: wedge, allowance: 9 },
	{ unit: 'b-2', side: 'blue', class: 'monster', size: 2, footprint: o120, allowance: 7, flies: true }
];

export interface SceneOptions {
	seed: number;
	armies?: UnitSpec[];
	terrainCount?: number;
	width?: number;
	depth?: number;
}

export type Table = Omit<RefRequest, 'move'>;

function boundingRadius(fp: Footprint): number {
	if (fp.shape === 'round') return fp.diameterMm / 2 / 25.4;
	if (fp.shape === 'oval') return Math.max(fp.lengthMm, fp.widthMm) / 2 / 25.4;
	return Math.max(...fp.points.map((p) => Math.hypot(p[0], p[1])));
}

/** Length along the facing and width across it, in inches. */
function extents(fp: Footprint): [number, number] {
	if (fp.shape === 'round') return [fp.diameterMm / 25.4, fp.diameterMm / 25.4];
	if (fp.shape === 'oval') return [fp.lengthMm / 25.4, fp.widthMm / 25.4];
	const xs = fp.points.map((p) => p[0]);
	const ys = fp.points.map((p) => p[1]);
	return [Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)];
}

function rotatedRect(cx: number, cy: number, w: number, h: number, deg: number): Xy[] {
	const t = (deg * Math.PI) / 180;
	const c = Math.cos(t);
	const s = Math.sin(t);
	return ([[-w / 2, -h / 2], [w / 2, -h / 2], [w / 2, h / 2], [-w / 2, h / 2]] as Xy[]).map(
		([x, y]) => [round3(cx + x * c - y * s), round3(cy + x * s + y * c)] as Xy
	);
}

function blob(r: Rand, cx: number, cy: number, radius: number): Xy[] {
	// A convex irregular polygon: points on a circle with jittered radius stay convex enough.
	const n = 7 + Math.floor(r() * 4);
	const pts: Xy[] = [];
	for (let i = 0; i < n; i++) {
		const t = (2 * Math.PI * i) / n;
		const rr = radius * between(r, 0.92, 1);
		pts.push([round3(cx + rr * Math.cos(t)), round3(cy + rr * Math.sin(t))]);
	}
	return pts;
}

interface Disc {
	x: number;
	y: number;
	r: number;
}

const discsClear = (a: Disc, b: Disc, gap: number) => Math.hypot(a.x - b.x, a.y - b.y) >= a.r + b.r + gap;

function outlineDisc(pts: Xy[]): Disc {
	const x = pts.reduce((s, p) => s + p[0], 0) / pts.length;
	const y = pts.reduce((s, p) => s + p[1], 0) / pts.length;
	return { x, y, r: Math.max(...pts.map((p) => Math.hypot(p[0] - x, p[1] - y))) };
}

/**
 * Terrain first (kept apart from each other), then units grown as loose clusters; every piece
 * is placed clear of other pieces and of blocks, impassable ground and walls, by bounding circles.
 */
export function makeTable(opts: SceneOptions): Table {
	const r = rng(opts.seed);
	const width = opts.width ?? 44;
	const depth = opts.depth ?? 60;
	const armies = opts.armies ?? FULL_ARMIES;
	const terrainCount = opts.terrainCount ?? 20;

	const terrain: TerrainIn[] = [];
	const obstacleDiscs: Disc[] = []; // ground a piece may not start on
	const terrainDiscs: Disc[] = [];
	const kinds: TerrainIn['kind'][] = ['block', 'block', 'block', 'block', 'ruin', 'ruin', 'impassable', 'area'];
	for (let i = 0, tries = 0; terrain.length < terrainCount && tries < 5000; tries++) {
		const kind = kinds[i % kinds.length];
		const cx = between(r, 4, width - 4);
		const cy = between(r, 6, depth - 6);
		let t: TerrainIn;
		if (kind === 'block') {
			const outline = rotatedRect(cx, cy, between(r, 1.5, 4), between(r, 1.5, 5), between(r, 0, 180));
			t = { id: `block-${i}`, kind, outline, height: pick(r, [0.5, 1, 2, 3]) };
		} else if (kind === 'ruin') {
			const w = between(r, 5, 8);
			const h = between(r, 4, 6);
			const x0 = round3(cx - w / 2);
			const y0 = round3(cy - h / 2);
			const x1 = round3(cx + w / 2);
			const y1 = round3(cy + h / 2);
			const gapAt = between(r, 0.3, 0.6);
			// Two walls on an L, the long one broken by a doorway.
			const walls: Xy[][] = [
				[[x0, y0], [round3(x0 + w * gapAt), y0]],
				[[round3(x0 + w * gapAt + 1.8), y0], [x1, y0], [x1, y1]]
			];
			t = { id: `ruin-${i}`, kind, outline: [[x0, y0], [x1, y0], [x1, y1], [x0, y1]], walls };
		} else if (kind === 'impassable') {
			t = { id: `pond-${i}`, kind, outline: blob(r, cx, cy, between(r, 1.5, 3)) };
		} else {
			t = { id: `wood-${i}`, kind, outline: blob(r, cx, cy, between(r, 2.5, 4.5)) };
		}
		const d = outlineDisc(t.outline);
		if (terrainDiscs.some((o) => !discsClear(o, d, 1.5))) continue;
		terrainDiscs.push(d);
		terrain.push(t);
		if (t.kind === 'block' || t.kind === 'impassable') obstacleDiscs.push(d);
		if (t.kind === 'ruin') {
			// Walls as chains of small discs, so pieces may stand on the ruin floor.
			for (const w of t.walls ?? []) {
				for (let k = 0; k + 1 < w.length; k++) {
					const [a, b] = [w[k], w[k + 1]];
					const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
					for (let s = 0; s <= len; s += 0.25) {
						obstacleDiscs.push({ x: a[0] + ((b[0] - a[0]) * s) / len, y: a[1] + ((b[1] - a[1]) * s) / len, r: 0.05 });
					}
				}
			}
		}
		i++;
	}

	const pieces: PieceIn[] = [];
	const placed: Disc[] = [];
	const placedSides: string[] = [];
	// Biggest footprints first: they are the hardest to fit once the table fills up.
	const order = [...armies].sort((a, b) => boundingRadius(b.footprint) - boundingRadius(a.footprint));
	const fits = (disc: Disc, taken: Disc[]) =>
		disc.x - disc.r >= 0.05 &&
		disc.y - disc.r >= 0.05 &&
		disc.x + disc.r <= width - 0.05 &&
		disc.y + disc.r <= depth - 0.05 &&
		obstacleDiscs.every((o) => discsClear(o, disc, 0.05)) &&
		taken.every((o) => discsClear(o, disc, 0.05));
	for (const spec of order) {
		const br = boundingRadius(spec.footprint);
		const want = spec.size >= 7 ? 2 : 1;
		// Most units start clear of the enemy; the rest may start in contact (locked, withdraw).
		const mayTouch = r() < 0.2;
		for (let attempt = 0; ; attempt++) {
			if (attempt > 10000) throw new Error(`could not place unit ${spec.unit} (seed ${opts.seed})`);
			// Units lean towards their own end; the overlap in the middle is where contact happens.
			const cy = spec.side === 'red' ? between(r, 3, depth * 0.62) : between(r, depth * 0.38, depth - 3);
			const first = { x: between(r, 3, width - 3), y: cy, r: br };
			if (!fits(first, placed)) continue;
			const discs: Disc[] = [first];
			const heading = round3(between(r, 0, 360));
			if (spec.footprint.shape !== 'round') {
				// Long footprints grow on a grid in their own frame, all facing the same way, so
				// the gap to each neighbour in a rank or file is exactly the chosen gap.
				const [ex, ey] = extents(spec.footprint);
				const gap = between(r, 0.2, 0.9);
				const t = (heading * Math.PI) / 180;
				const cells = new Map<string, [number, number]>([['0,0', [0, 0]]]);
				const steps: [number, number][] = [[1, 0], [-1, 0], [0, 1], [0, -1]];
				const occupied = (i: number, j: number) => cells.has(`${i},${j}`);
				while (discs.length < spec.size) {
					let best: { cell: [number, number]; disc: Disc } | null = null;
					let bestScore = -1;
					const list = [...cells.values()];
					for (let k = 0; k < 40; k++) {
						const [ci, cj] = pick(r, list);
						const [si, sj] = pick(r, steps);
						const [i, j] = [ci + si, cj + sj];
						if (occupied(i, j)) continue;
						const lx = i * (ex + gap);
						const ly = j * (ey + gap);
						const c = { x: round3(first.x + lx * Math.cos(t) - ly * Math.sin(t)), y: round3(first.y + lx * Math.sin(t) + ly * Math.cos(t)), r: br };
						if (!fits(c, placed)) continue;
						const score = Math.min(want, steps.filter(([a, b]) => occupied(i + a, j + b)).length);
						if (score > bestScore) {
							best = { cell: [i, j], disc: c };
							bestScore = score;
							if (score >= want) break;
						}
					}
					if (!best) break;
					cells.set(`${best.cell[0]},${best.cell[1]}`, best.cell);
					discs.push(best.disc);
				}
			}
			// Round pieces grow a piece at a time beside pieces already down, preferring spots
			// with as many unit-mates close by as the spacing rule asks for.
			while (spec.footprint.shape === 'round' && discs.length < spec.size) {
				let best: Disc | null = null;
				let bestScore = -1;
				for (let k = 0; k < 40; k++) {
					const mate = discs[discs.length - 1 - Math.floor(r() * Math.min(discs.length, 6))];
					const a = between(r, 0, 2 * Math.PI);
					const d = mate.r + br + between(r, 0.15, 0.7);
					const c = { x: round3(mate.x + d * Math.cos(a)), y: round3(mate.y + d * Math.sin(a)), r: br };
					if (!fits(c, placed) || !fits(c, discs)) continue;
					const near = discs.filter((o) => Math.hypot(o.x - c.x, o.y - c.y) - o.r - c.r <= 0.9).length;
					const score = Math.min(near, want);
					if (score > bestScore) {
						best = c;
						bestScore = score;
						if (score >= want) break;
					}
				}
				if (!best) break;
				discs.push(best);
			}
			if (discs.length < spec.size) continue;
			const enemies = placedSides.flatMap((side, i) => (side !== spec.side ? [placed[i]] : []));
			if (!mayTouch && discs.some((d) => enemies.some((e) => !discsClear(d, e, 1.5)))) continue;
			discs.forEach((disc, i) => {
				const facing = spec.footprint.shape === 'round' ? 0 : heading;
				const piece: PieceIn = {
					id: `${spec.unit}.${i + 1}`,
					side: spec.side,
					unit: spec.unit,
					class: spec.class,
					flies: spec.flies ?? false,
					allowance: spec.allowance,
					footprint: spec.footprint,
					at: { x: round3(disc.x), y: round3(disc.y), facing },
					value: spec.size >= 10 ? 1 : 2
				};
				if (spec.ring && i === 0) piece.ring = { radius: spec.ring };
				pieces.push(piece);
			});
			placed.push(...discs);
			placedSides.push(...discs.map(() => spec.side));
			break;
		}
	}
	// Request order by army list, not by placement order, so ids read naturally.
	const rank = new Map(armies.map((a, i) => [a.unit, i]));
	pieces.sort((a, b) => rank.get(a.unit)! - rank.get(b.unit)!);

	const objectives = [
		{ id: 'obj-centre', x: width / 2, y: depth / 2 },
		{ id: 'obj-west', x: round3(width * 0.2), y: round3(depth * 0.45) },
		{ id: 'obj-east', x: round3(width * 0.8), y: round3(depth * 0.55) },
		{ id: 'obj-red', x: round3(width * 0.5), y: 8 },
		{ id: 'obj-blue', x: round3(width * 0.5), y: depth - 8 }
	];
	return { board: { width, depth, terrain, objectives }, pieces };
}

/**
 * How crowded the end of a whole-unit translation would be, by bounding circles: overlaps with
 * other pieces, enemies within 1 in, and pieces off the board. Used to steer half the moves
 * towards open ground so that legal moves are common enough to be tested too.
 */
function crowding(table: Table, members: PieceIn[], dx: number, dy: number): number {
	const others = table.pieces.filter((p) => p.unit !== members[0].unit);
	const ground = (table.board.terrain ?? [])
		.filter((t) => t.kind === 'block' || t.kind === 'impassable')
		.map((t) => outlineDisc(t.outline));
	let bad = 0;
	for (const p of members) {
		const br = boundingRadius(p.footprint);
		const x = p.at.x + dx;
		const y = p.at.y + dy;
		if (x - br < 0 || y - br < 0 || x + br > table.board.width || y + br > table.board.depth) bad++;
		for (const q of others) {
			const gap = Math.hypot(q.at.x - x, q.at.y - y) - br - boundingRadius(q.footprint);
			if (gap < (q.side === p.side ? 0 : 1.2)) bad++;
		}
		for (const g of ground) if (!discsClear(g, { x, y, r: br }, 0)) bad++;
	}
	return bad;
}

/**
 * A proposed move for one unit. Half are "tidy": the unit translates together towards open
 * ground, turning a little; half are "loose": wobbling paths, big turns, stragglers and reaches
 * past the allowance. Together they give legal moves and most of the finding codes.
 */
export function randomMove(table: Table, unit: string, seed: number): RefRequest {
	const r = rng(seed);
	const members = table.pieces.filter((p) => p.unit === unit);
	const roll = r();
	const kind: MoveKind = roll < 0.45 ? 'move' : roll < 0.7 ? 'dash' : roll < 0.9 ? 'withdraw' : 'hold';
	const die = 1 + Math.floor(r() * 6);
	const tidy = r() < 0.5;
	const allowance = members[0].allowance + (kind === 'dash' ? die : 0);
	const reach = allowance * (tidy ? between(r, 0.05, 0.6) : r() < 0.7 ? between(r, 0.1, 0.9) : between(r, 1.0, 1.4));
	let heading = between(r, 0, 2 * Math.PI);
	if (tidy) {
		let best = Infinity;
		for (let k = 0; k < 24; k++) {
			const h = between(r, 0, 2 * Math.PI);
			// Halfway and at the end, so the way there is roughly clear as well.
			const [cx, cy] = [reach * Math.cos(h), reach * Math.sin(h)];
			const c = crowding(table, members, cx / 2, cy / 2) + crowding(table, members, cx, cy);
			if (c < best) [best, heading] = [c, h];
		}
	}
	const dx = reach * Math.cos(heading);
	const dy = reach * Math.sin(heading);
	const waypointCount = 1 + Math.floor(r() * 4);
	const paths: Record<string, Pose[]> = {};
	if (kind !== 'hold') {
		for (const p of members) {
			if (!tidy && members.length > 1 && r() < 0.05) continue; // a straggler stays behind
			const straggle = !tidy && r() < 0.05 ? between(r, 0.4, 0.9) : 1; // or falls short
			const n = Math.max(1, Math.min(4, waypointCount + (r() < 0.2 ? 1 : 0) - (r() < 0.2 ? 1 : 0)));
			const wobble = tidy ? between(r, 0, 0.2) : between(r, 0, 0.9);
			const turnMax = tidy ? 15 : 100;
			const path: Pose[] = [];
			let facing = p.at.facing ?? 0;
			for (let k = 1; k <= n; k++) {
				const f = (k / n) * straggle;
				const side = k < n ? between(r, -wobble, wobble) : 0;
				const wp: Pose = {
					x: round3(p.at.x + dx * f - Math.sin(heading) * side),
					y: round3(p.at.y + dy * f + Math.cos(heading) * side)
				};
				// Non-round pieces often turn at a waypoint; round ones occasionally name a facing.
				if (p.footprint.shape !== 'round' ? r() < 0.35 : r() < 0.1) {
					facing = round3((facing + between(r, -turnMax, turnMax) + 360) % 360);
					wp.facing = facing;
				}
				path.push(wp);
			}
			paths[p.id] = path;
		}
	}
	const move: RefRequest['move'] = { unit, kind, paths };
	if (kind === 'dash') move.die = die;
	return { ...table, move };
}

/** The timed 20-piece move: every piece of the unit 3 in along a heading, by two waypoints. */
export function benchMove(table: Table, unit: string, headingDeg: number, reach = 3): RefRequest {
	const members = table.pieces.filter((p) => p.unit === unit);
	const t = (headingDeg * Math.PI) / 180;
	const paths: Record<string, Pose[]> = {};
	for (const p of members) {
		paths[p.id] = [
			{ x: round3(p.at.x + (reach / 2) * Math.cos(t)), y: round3(p.at.y + (reach / 2) * Math.sin(t)) },
			{ x: round3(p.at.x + reach * Math.cos(t)), y: round3(p.at.y + reach * Math.sin(t)) }
		];
	}
	return { ...table, move: { unit, kind: 'move', paths } };
}
