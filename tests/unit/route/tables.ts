// Seeded random tables for the route finder's tests: one piece to move near the middle of a
// small board, round pieces of both sides around it, and a ruin, a block and impassable ground.
import type { PieceIn, TerrainIn } from '../../../src/lib/schemas/check';
import type { RouteTable } from '../../../src/lib/referee/route';

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

export interface TableSpec {
	seed: number;
	moverClass?: PieceIn['class'];
	moverMm?: number;
	flies?: boolean;
	allowance?: number;
	pieces?: number;
	size?: number;
}

/** A table with the mover "m" (side a, unit u) at the centre; others are kept clear of it. */
export function randomTable(spec: TableSpec): RouteTable {
	const r = rng(spec.seed);
	const size = spec.size ?? 20;
	const c = size / 2;
	const between = (lo: number, hi: number) => lo + (hi - lo) * r();
	const moverMm = spec.moverMm ?? 32;
	const rho = moverMm / 25.4 / 2;
	const pieces: PieceIn[] = [
		{
			id: 'm',
			side: 'a',
			unit: 'u',
			class: spec.moverClass ?? 'foot',
			flies: spec.flies ?? false,
			allowance: spec.allowance ?? 5,
			footprint: { shape: 'round', diameterMm: moverMm },
			at: { x: c, y: c }
		}
	];
	// terrain in three of the four quadrants around the centre, clear of the start
	const q = [
		[c - 4.5, c - 4],
		[c + 4, c - 3.5],
		[c - 3.5, c + 4],
		[c + 4.2, c + 4.2]
	].sort(() => r() - 0.5);
	const [rx, ry] = q[0];
	const [bx, by] = q[1];
	const [px, py] = q[2];
	const w = between(3, 4.5);
	const hgt = between(2.5, 3.5);
	const gap = between(0.3, 0.6);
	const ruin: TerrainIn = {
		id: 'ruin',
		kind: 'ruin',
		outline: [[rx - w / 2, ry - hgt / 2], [rx + w / 2, ry - hgt / 2], [rx + w / 2, ry + hgt / 2], [rx - w / 2, ry + hgt / 2]],
		walls: [
			[[rx - w / 2, ry - hgt / 2], [rx - w / 2 + w * gap, ry - hgt / 2]],
			[[rx - w / 2 + w * gap + 1.6, ry - hgt / 2], [rx + w / 2, ry - hgt / 2], [rx + w / 2, ry + hgt / 2]]
		]
	};
	const bw = between(1.5, 3);
	const bh = between(1.5, 3);
	const block: TerrainIn = {
		id: 'block',
		kind: 'block',
		height: [0.5, 1, 2][Math.floor(r() * 3)],
		outline: [[bx - bw / 2, by - bh / 2], [bx + bw / 2, by - bh / 2], [bx + bw / 2, by + bh / 2], [bx - bw / 2, by + bh / 2]]
	};
	const pr = between(1, 1.8);
	const blob: [number, number][] = [];
	for (let i = 0; i < 8; i++) {
		const t = (2 * Math.PI * i) / 8;
		blob.push([px + pr * between(0.85, 1) * Math.cos(t), py + pr * between(0.85, 1) * Math.sin(t)]);
	}
	const pond: TerrainIn = { id: 'pond', kind: 'impassable', outline: blob };
	const terrain = [ruin, block, pond];
	const count = spec.pieces ?? 8;
	const discs: { x: number; y: number; r: number }[] = [{ x: c, y: c, r: rho + 2.3 }];
	const terrainDiscs = [
		{ x: rx, y: ry, r: Math.hypot(w, hgt) / 2 + 0.2 },
		{ x: bx, y: by, r: Math.hypot(bw, bh) / 2 + 0.2 },
		{ x: px, y: py, r: pr + 0.2 }
	];
	for (let k = 0, tries = 0; k < count && tries < 2000; tries++) {
		const mm = [25, 32, 40, 50][Math.floor(r() * 4)];
		const pr2 = mm / 25.4 / 2;
		const x = between(pr2 + 0.1, size - pr2 - 0.1);
		const y = between(pr2 + 0.1, size - pr2 - 0.1);
		if (Math.hypot(x - c, y - c) > spec.allowance! + 3 && r() < 0.7) continue;
		if (discs.some((d) => Math.hypot(d.x - x, d.y - y) < d.r + pr2 + 0.1)) continue;
		if (terrainDiscs.some((d) => Math.hypot(d.x - x, d.y - y) < d.r + pr2)) continue;
		const enemy = r() < 0.5;
		const cls = r() < 0.15 ? 'vehicle' : 'foot';
		pieces.push({
			id: `p${k}`,
			side: enemy ? 'b' : 'a',
			unit: enemy ? `e${k}` : `f${k}`,
			class: cls,
			allowance: 5,
			footprint: { shape: 'round', diameterMm: mm },
			at: { x: Math.round(x * 1000) / 1000, y: Math.round(y * 1000) / 1000 }
		});
		discs.push({ x, y, r: pr2 + (enemy ? 1.1 : 0) });
		k++;
	}
	return { board: { width: size, depth: size, terrain }, pieces };
}
