// Swept footprints: a translation along a segment is the Minkowski sum of the footprint with the
// segment (exact, convex); a pivot is covered by the hulls of closely spaced turned copies.
import { boxOf, convexHullOfTwo, minkowskiSum, signedDistance, type Box, type Rounded } from './convex';
import { place } from './footprints';

/** The region covered by `shape` translated by every t·(dx, dy), t ∈ [0, 1]. */
export function translationSweep(shape: Rounded, dx: number, dy: number): Rounded {
	if (dx === 0 && dy === 0) return shape;
	const p = shape.pts;
	if (p.length === 2) return { pts: [p[0], p[1], p[0] + dx, p[1] + dy], r: shape.r };
	return { pts: minkowskiSum(p, [0, 0, dx, dy]), r: shape.r };
}

/** Arc length the farthest point may travel between two turned copies of a pivot's cover. */
export const PIVOT_STEP_IN = 0.05;

/**
 * Convex pieces covering a footprint turning about (x, y) from fromDeg by deltaDeg. Each piece is
 * the hull of two copies a small angle apart, grown by the arc's sagitta so nothing is missed;
 * the cover exceeds the true swept area by at most that sagitta (well under 0.001 in).
 */
export function pivotSweep(local: Rounded, rMaxIn: number, x: number, y: number, fromDeg: number, deltaDeg: number): Rounded[] {
	const cover = new PivotCover(local, rMaxIn, x, y, fromDeg, deltaDeg);
	const out: Rounded[] = [];
	for (let i = 0; i < cover.count; i++) out.push(cover.piece(i));
	return out;
}

/**
 * pivotSweep's pieces one at a time, each built only when asked for (a hull per piece is the
 * dear part); the turned copies, their boxes and the pieces' boxes come cheaply without it.
 */
export class PivotCover {
	readonly count: number;
	/** how much each piece is grown beyond the footprint's own rounding */
	readonly sagitta: number;
	private readonly copies: (Rounded | undefined)[];
	private readonly pieces: (Rounded | undefined)[];

	constructor(
		private readonly local: Rounded,
		rMaxIn: number,
		readonly x: number,
		readonly y: number,
		readonly fromDeg: number,
		readonly deltaDeg: number
	) {
		const sweepRad = Math.abs((deltaDeg * Math.PI) / 180);
		const steps = Math.max(1, Math.ceil((rMaxIn * sweepRad) / PIVOT_STEP_IN));
		const stepRad = sweepRad / steps;
		this.count = steps;
		this.sagitta = rMaxIn * (1 - Math.cos(stepRad / 2));
		this.copies = new Array(steps + 1);
		this.pieces = new Array(steps);
	}

	/** the facing of copy i (i = 0 … count) */
	facingOf(i: number): number {
		return i === 0 ? this.fromDeg : this.fromDeg + (this.deltaDeg * i) / this.count;
	}

	copy(i: number): Rounded {
		return (this.copies[i] ??= place(this.local, this.x, this.y, this.facingOf(i)));
	}

	/** piece i: the hull of copies i and i + 1, grown by the sagitta */
	piece(i: number): Rounded {
		return (this.pieces[i] ??= { pts: convexHullOfTwo(this.copy(i).pts, this.copy(i + 1).pts), r: this.local.r + this.sagitta });
	}

	/** the box of piece i, equal to boxOf(piece(i)) (a hull's extremes are its points'), without the hull */
	box(i: number): Box {
		const a = boxOf(this.copy(i).pts);
		const b = boxOf(this.copy(i + 1).pts);
		const r = this.local.r + this.sagitta;
		return { minX: Math.min(a.minX, b.minX) - r, minY: Math.min(a.minY, b.minY) - r, maxX: Math.max(a.maxX, b.maxX) + r, maxY: Math.max(a.maxY, b.maxY) + r };
	}
}

/** Least signed distance between a moving set's sweep and a still one (minus depth when crossing). */
export function sweptDistance(shape: Rounded, dx: number, dy: number, still: Rounded): number {
	return signedDistance(translationSweep(shape, dx, dy), still);
}
