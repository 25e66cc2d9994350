// The table of one check, prepared once: every piece's footprint at its start and end, the unit
// that moves, and bounding-box indexes (flatbush) so each test only measures nearby things.
import Flatbush from 'flatbush';
import type { CheckRequest, PieceIn, Profile } from '../schemas/check';
import { boxesMeet, signedDistancePointConvex, type Box, type Rounded } from './convex';
import { localFootprint, place, type LocalFootprint } from './footprints';
import { frameOf, lowerGap, reachOfLocal, type Frame, type Reach } from './bounds';
import { endPose, type PoseDeg } from './path-cost';
import { mmToIn } from './profile';
import { prepareTerrain, type PreparedTerrain } from './terrain';

/** Radius of a disk about the reference point that holds the footprint, without building it. */
function reachOf(fp: PieceIn['footprint']): number {
	if (fp.shape === 'round') return mmToIn(fp.diameterMm) / 2;
	// an oval's polygon is grown by at most its chord error, far below this margin
	if (fp.shape === 'oval') return mmToIn(Math.max(fp.lengthMm, fp.widthMm)) / 2 + 1e-3;
	let r = 0;
	for (const [x, y] of fp.points) r = Math.max(r, Math.hypot(x, y));
	return r;
}

/** One piece of the table. Footprint shapes are built only when a test needs them. */
export class ScenePiece {
	readonly id: string;
	readonly side: string;
	/** the unit it moves and is spaced with: the joined unit for a leader */
	readonly unit: string;
	readonly bulky: boolean;
	readonly flies: boolean;
	/** a round base (whose bounding disk is its footprint) */
	readonly round: boolean;
	/** radius of a disk about the reference point that holds the footprint (for cheap pruning) */
	readonly reachIn: number;
	readonly startPose: PoseDeg;
	readonly startBox: Box;
	readonly endPose: PoseDeg;
	readonly endBox: Box;
	private _local: LocalFootprint | null = null;
	private _start: Rounded | null = null;
	private _end: Rounded | null = null;

	constructor(
		readonly idx: number,
		readonly src: PieceIn,
		readonly member: boolean,
		readonly moved: boolean,
		endPose: PoseDeg,
		bulky: boolean,
		private readonly toleranceIn: number
	) {
		this.id = src.id;
		this.side = src.side;
		this.unit = src.leaderOf ?? src.unit;
		this.bulky = bulky;
		this.flies = src.flies === true;
		this.reachIn = reachOf(src.footprint);
		this.round = src.footprint.shape === 'round';
		this.startPose = { x: src.at.x, y: src.at.y, facingDeg: src.at.facing ?? 0 };
		this.endPose = moved ? endPose : this.startPose;
		const r = this.reachIn;
		this.startBox = { minX: src.at.x - r, minY: src.at.y - r, maxX: src.at.x + r, maxY: src.at.y + r };
		this.endBox = moved ? { minX: endPose.x - r, minY: endPose.y - r, maxX: endPose.x + r, maxY: endPose.y + r } : this.startBox;
	}

	/**
	 * Radius of a disk about the reference point inside the footprint; −Infinity when there is
	 * none (a hull whose reference point lies outside it), so no pair is taken as surely close.
	 */
	get innerReachIn(): number {
		if (this._innerReachIn !== null) return this._innerReachIn;
		const fp = this.src.footprint;
		let v: number;
		if (fp.shape === 'round') v = this.reachIn;
		// the oval's polygon lies inside the curve by at most its chord error, far below 1e-3
		else if (fp.shape === 'oval') v = mmToIn(Math.min(fp.lengthMm, fp.widthMm)) / 2 - 1e-3;
		else {
			const sd = signedDistancePointConvex(0, 0, this.local.outer.pts);
			v = sd <= 0 ? -sd - 1e-9 : -Infinity;
		}
		return (this._innerReachIn = v);
	}
	private _innerReachIn: number | null = null;

	/** what the distance brackets need of the footprint (bounds.ts) */
	get reach(): Reach {
		if (this._reach) return this._reach;
		const fp = this.src.footprint;
		const [a, b] = fp.shape === 'oval' ? [mmToIn(fp.lengthMm) / 2, mmToIn(fp.widthMm) / 2] : [0, 0];
		return (this._reach = reachOfLocal(this.local, fp.shape, a, b, fp.shape === 'hull' ? this.innerReachIn : -Infinity));
	}
	private _reach: Reach | null = null;
	get startFrame(): Frame {
		return (this._startFrame ??= frameOf(this.startPose.x, this.startPose.y, this.startPose.facingDeg));
	}
	get endFrame(): Frame {
		if (!this.moved) return this.startFrame;
		return (this._endFrame ??= frameOf(this.endPose.x, this.endPose.y, this.endPose.facingDeg));
	}
	private _startFrame: Frame | null = null;
	private _endFrame: Frame | null = null;

	get local(): LocalFootprint {
		return (this._local ??= localFootprint(this.src.footprint, this.toleranceIn));
	}
	/** footprint at the start of the move */
	get start(): Rounded {
		return (this._start ??= place(this.local.outer, this.startPose.x, this.startPose.y, this.startPose.facingDeg));
	}
	/** footprint after the move (the start, for a piece that does not move) */
	get end(): Rounded {
		if (!this.moved) return this.start;
		return (this._end ??= place(this.local.outer, this.endPose.x, this.endPose.y, this.endPose.facingDeg));
	}
}

export class Scene {
	readonly pieces: ScenePiece[];
	readonly members: ScenePiece[];
	readonly terrain: PreparedTerrain[];
	private readonly pieceIndex: Flatbush;
	private readonly terrainIndex: Flatbush | null;

	constructor(
		readonly request: CheckRequest,
		readonly profile: Profile
	) {
		const eps = profile.tolerance;
		const unitId = request.move.unit;
		const paths = request.move.paths ?? {};
		const bulky = new Set<string>(profile.bulky);
		this.pieces = request.pieces.map((src, idx) => {
			const member = (src.leaderOf ?? src.unit) === unitId;
			const path = member ? paths[src.id] : undefined;
			const moved = !!path && path.length > 0;
			const ep = moved ? endPose(src.at, path) : { x: src.at.x, y: src.at.y, facingDeg: src.at.facing ?? 0 };
			return new ScenePiece(idx, src, member, moved, ep, bulky.has(src.class), eps);
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
		const moved = this.movedIndex();
		if (moved) {
			// the index's hits (a little wide for rounding) are then held to the very box test
			const w = margin + 1e-9;
			for (const i of moved.index.search(box.minX - w, box.minY - w, box.maxX + w, box.maxY + w)) {
				const m = moved.pieces[i];
				if (boxesMeet(box, m.endBox, margin)) out.push(m);
			}
		}
		return out.sort((a, b) => a.idx - b.idx);
	}

	/** A flatbush of the moved pieces' end boxes, built on first use; null when nothing moved. */
	private movedIndex(): { index: Flatbush; pieces: ScenePiece[] } | null {
		if (this._moved !== undefined) return this._moved;
		const pieces = this.members.filter((m) => m.moved);
		if (pieces.length === 0) return (this._moved = null);
		const index = new Flatbush(pieces.length);
		for (const m of pieces) index.add(m.endBox.minX, m.endBox.minY, m.endBox.maxX, m.endBox.maxY);
		index.finish();
		return (this._moved = { index, pieces });
	}
	private _moved: { index: Flatbush; pieces: ScenePiece[] } | null | undefined = undefined;

	/** Terrain whose outline or walls' box comes within `margin` of `box`, in request order. */
	terrainNear(box: Box, margin = 0): PreparedTerrain[] {
		if (!this.terrainIndex) return [];
		const hits = this.terrainIndex.search(box.minX - margin, box.minY - margin, box.maxX + margin, box.maxY + margin);
		hits.sort((a, b) => a - b);
		return hits.map((i) => this.terrain[i]);
	}

	/** Whether any terrain's box comes within `margin` of `box` (a cheaper terrainNear(…).length > 0). */
	anyTerrainNear(box: Box, margin = 0): boolean {
		if (!this.terrainIndex) return false;
		return this.terrainIndex.search(box.minX - margin, box.minY - margin, box.maxX + margin, box.maxY + margin).length > 0;
	}

	/** A piece's footprint shrunk by ε at a pose (terrain contact beyond ε is what counts). */
	inner(p: ScenePiece, pose: PoseDeg): Rounded {
		return place(p.local.inner, pose.x, pose.y, pose.facingDeg);
	}
}

/**
 * Lower bound on the edge-to-edge distance of two pieces, each at its start or its end: their
 * bounding disks, or for a non-round footprint its support along the line of centres.
 */
export function pairGap(a: ScenePiece, aEnd: boolean, b: ScenePiece, bEnd: boolean): number {
	const pa = aEnd ? a.endPose : a.startPose;
	const pb = bEnd ? b.endPose : b.startPose;
	const disks = reachGap(a, pa.x, pa.y, b, pb.x, pb.y);
	if (a.round && b.round) return disks;
	return Math.max(disks, lowerGap(a.reach, aEnd ? a.endFrame : a.startFrame, b.reach, bEnd ? b.endFrame : b.startFrame));
}

/** Lower bound on the edge-to-edge distance of two pieces at given centres, from their reach. */
export function reachGap(a: ScenePiece, ax: number, ay: number, b: ScenePiece, bx: number, by: number): number {
	return Math.hypot(ax - bx, ay - by) - a.reachIn - b.reachIn;
}

function unite(a: Box, b: Box): Box {
	return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}
