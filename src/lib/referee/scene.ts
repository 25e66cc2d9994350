// The table of one check, prepared once: every piece's footprint at its start and end, the unit
// that moves, and bounding-box indexes (flatbush) so each test only measures nearby things.
import Flatbush from 'flatbush';
import type { CheckRequest, PieceIn, Profile } from '../schemas/check';
import { boxOf, boxesMeet, type Box, type Rounded } from './convex';
import { localFootprint, place, type LocalFootprint } from './footprints';
import { endPose, type PoseDeg } from './path-cost';
import { prepareTerrain, type PreparedTerrain } from './terrain';

export interface ScenePiece {
	idx: number;
	src: PieceIn;
	id: string;
	side: string;
	/** the unit it moves and is spaced with: the joined unit for a leader */
	unit: string;
	member: boolean;
	bulky: boolean;
	flies: boolean;
	local: LocalFootprint;
	startPose: PoseDeg;
	start: Rounded;
	startBox: Box;
	endPose: PoseDeg;
	end: Rounded;
	endBox: Box;
	moved: boolean;
}

export class Scene {
	readonly pieces: ScenePiece[];
	readonly members: ScenePiece[];
	readonly terrain: PreparedTerrain[];
	private readonly pieceIndex: Flatbush;
	private readonly terrainIndex: Flatbush | null;
	private innerCache = new Map<string, Rounded>();

	constructor(
		readonly request: CheckRequest,
		readonly profile: Profile
	) {
		const eps = profile.tolerance;
		const unitId = request.move.unit;
		const paths = request.move.paths ?? {};
		const bulky = new Set<string>(profile.bulky);
		this.pieces = request.pieces.map((src, idx) => {
			const local = localFootprint(src.footprint, eps);
			const startPose: PoseDeg = { x: src.at.x, y: src.at.y, facingDeg: src.at.facing ?? 0 };
			const start = place(local.outer, startPose.x, startPose.y, startPose.facingDeg);
			const unit = src.leaderOf ?? src.unit;
			const member = unit === unitId;
			const path = member ? paths[src.id] : undefined;
			const moved = !!path && path.length > 0;
			const ep = moved ? endPose(src.at, path) : startPose;
			const end = moved ? place(local.outer, ep.x, ep.y, ep.facingDeg) : start;
			const startBox = boxOf(start.pts, start.r);
			return {
				idx,
				src,
				id: src.id,
				side: src.side,
				unit,
				member,
				bulky: bulky.has(src.class),
				flies: src.flies === true,
				local,
				startPose,
				start,
				startBox,
				endPose: ep,
				end,
				endBox: moved ? boxOf(end.pts, end.r) : startBox,
				moved
			};
		});
		this.members = this.pieces.filter((p) => p.member);
		this.pieceIndex = new Flatbush(this.pieces.length);
		for (const p of this.pieces) this.pieceIndex.add(p.startBox.minX, p.startBox.minY, p.startBox.maxX, p.startBox.maxY);
		this.pieceIndex.finish();
		this.terrain = (request.board.terrain ?? []).map(prepareTerrain);
		if (this.terrain.length) {
			this.terrainIndex = new Flatbush(this.terrain.length);
			for (const t of this.terrain) {
				const b = t.wallBox ? unite(t.box, t.wallBox) : t.box;
				this.terrainIndex.add(b.minX, b.minY, b.maxX, b.maxY);
			}
			this.terrainIndex.finish();
		} else this.terrainIndex = null;
	}

	/** Pieces whose start footprint's box comes within `margin` of `box`, in request order. */
	nearStart(box: Box, margin: number): ScenePiece[] {
		const hits = this.pieceIndex.search(box.minX - margin, box.minY - margin, box.maxX + margin, box.maxY + margin);
		hits.sort((a, b) => a - b);
		return hits.map((i) => this.pieces[i]);
	}

	/** Pieces whose footprint after the move comes within `margin` of `box`, in request order. */
	nearEnd(box: Box, margin: number): ScenePiece[] {
		const out = this.nearStart(box, margin).filter((p) => !p.moved);
		for (const m of this.members) if (m.moved && boxesMeet(box, m.endBox, margin)) out.push(m);
		return out.sort((a, b) => a.idx - b.idx);
	}

	/** Terrain whose outline or walls' box comes within `margin` of `box`, in request order. */
	terrainNear(box: Box, margin = 0): PreparedTerrain[] {
		if (!this.terrainIndex) return [];
		const hits = this.terrainIndex.search(box.minX - margin, box.minY - margin, box.maxX + margin, box.maxY + margin);
		hits.sort((a, b) => a - b);
		return hits.map((i) => this.terrain[i]);
	}

	/** A piece's footprint shrunk by ε at a pose (terrain contact beyond ε is what counts). */
	inner(p: ScenePiece, pose: PoseDeg): Rounded {
		const key = `${p.idx}|${pose.x}|${pose.y}|${pose.facingDeg}`;
		let s = this.innerCache.get(key);
		if (!s) {
			s = place(p.local.inner, pose.x, pose.y, pose.facingDeg);
			this.innerCache.set(key, s);
		}
		return s;
	}
}

function unite(a: Box, b: Box): Box {
	return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}
