// Snapping for the board editor: points to a 1 in or 0.5 in grid (or not at all), angles to
// 15° steps. Pure; the editor applies it to every drawn point, move and rotation.
import type { Point } from '$lib/schemas/layout';

export type GridSnap = 1 | 0.5 | 0;
export const GRID_SNAPS: readonly GridSnap[] = [1, 0.5, 0];
export const ANGLE_STEP_DEG = 15;

export interface SnapOptions {
	/** inches between grid points; 0 = off */
	gridIn: GridSnap;
	/** snap rotations to ANGLE_STEP_DEG */
	angle: boolean;
}

export const DEFAULT_SNAP: SnapOptions = { gridIn: 1, angle: true };

/** Rounds half away from zero at a micro-inch, so 0.5-inch steps never drift to 0.49999. */
const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

export function snapValue(v: number, stepIn: GridSnap): number {
	if (stepIn === 0) return round6(v);
	return round6(Math.round(v / stepIn) * stepIn);
}

export function snapPoint([x, y]: readonly [number, number], opts: SnapOptions): Point {
	return [snapValue(x, opts.gridIn), snapValue(y, opts.gridIn)];
}

export function snapAngle(deg: number, opts: SnapOptions): number {
	if (!opts.angle) return deg;
	const s = Math.round(deg / ANGLE_STEP_DEG) * ANGLE_STEP_DEG;
	return s === 0 ? 0 : s; // no −0 in saved documents
}

/** A translation snapped so the reference point (an outline's first vertex) lands on the grid. */
export function snapDelta(ref: readonly [number, number], dx: number, dy: number, opts: SnapOptions): [number, number] {
	const [sx, sy] = snapPoint([ref[0] + dx, ref[1] + dy], opts);
	return [round6(sx - ref[0]), round6(sy - ref[1])];
}

/** The next grid step in the toolbar's cycle: 1 in → 0.5 in → off → 1 in. */
export function nextGrid(g: GridSnap): GridSnap {
	return GRID_SNAPS[(GRID_SNAPS.indexOf(g) + 1) % GRID_SNAPS.length];
}
