// Plane geometry the board needs for drawing and editing (inches, degrees): centroids, boxes,
// rotation and scaling of outlines, hit tests. The engine keeps its own exact geometry; this is
// for the editor's handles and labels only.
import type { Point } from '$lib/schemas/layout';

export const DEG = Math.PI / 180;

export interface Box {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

export function bbox(points: readonly (readonly [number, number])[]): Box {
	let minX = Infinity,
		minY = Infinity,
		maxX = -Infinity,
		maxY = -Infinity;
	for (const [x, y] of points) {
		if (x < minX) minX = x;
		if (y < minY) minY = y;
		if (x > maxX) maxX = x;
		if (y > maxY) maxY = y;
	}
	return { minX, minY, maxX, maxY };
}

/** Area centroid of a polygon; the vertex mean for a degenerate one. */
export function centroid(outline: readonly (readonly [number, number])[]): Point {
	let a = 0,
		cx = 0,
		cy = 0;
	for (let i = 0; i < outline.length; i++) {
		const [x1, y1] = outline[i];
		const [x2, y2] = outline[(i + 1) % outline.length];
		const cross = x1 * y2 - x2 * y1;
		a += cross;
		cx += (x1 + x2) * cross;
		cy += (y1 + y2) * cross;
	}
	if (Math.abs(a) < 1e-12) {
		const n = outline.length || 1;
		return [outline.reduce((s, p) => s + p[0], 0) / n, outline.reduce((s, p) => s + p[1], 0) / n];
	}
	return [cx / (3 * a), cy / (3 * a)];
}

/** Rotate a point about a centre by `deg` (positive turns x towards y, clockwise on screen). */
export function rotatePoint([x, y]: readonly [number, number], [cx, cy]: readonly [number, number], deg: number): Point {
	const c = Math.cos(deg * DEG);
	const s = Math.sin(deg * DEG);
	const dx = x - cx;
	const dy = y - cy;
	return [cx + dx * c - dy * s, cy + dx * s + dy * c];
}

export const rotatePoints = (pts: readonly (readonly [number, number])[], centre: readonly [number, number], deg: number): Point[] =>
	pts.map((p) => rotatePoint(p, centre, deg));

export const translatePoints = (pts: readonly (readonly [number, number])[], dx: number, dy: number): Point[] =>
	pts.map(([x, y]) => [x + dx, y + dy]);

/**
 * The direction (deg) of an outline's own frame: the first edge. A rectangle drawn by drag and
 * then rotated keeps its first edge along its width, so resizing in this frame keeps it square.
 */
export function frameDeg(outline: readonly (readonly [number, number])[]): number {
	if (outline.length < 2) return 0;
	const [x1, y1] = outline[0];
	const [x2, y2] = outline[1];
	if (Math.hypot(x2 - x1, y2 - y1) < 1e-9) return 0;
	return Math.atan2(y2 - y1, x2 - x1) / DEG;
}

/** The outline's box in its own frame (rotated by −frameDeg about the centroid). */
export function frameBox(outline: readonly (readonly [number, number])[]): { box: Box; deg: number; centre: Point } {
	const deg = frameDeg(outline);
	const centre = centroid(outline);
	return { box: bbox(rotatePoints(outline, centre, -deg)), deg, centre };
}

/** An axis-aligned rectangle (clockwise on screen, first edge along x) from two corners. */
export function rectOutline(a: readonly [number, number], b: readonly [number, number]): Point[] {
	const minX = Math.min(a[0], b[0]);
	const maxX = Math.max(a[0], b[0]);
	const minY = Math.min(a[1], b[1]);
	const maxY = Math.max(a[1], b[1]);
	return [
		[minX, minY],
		[maxX, minY],
		[maxX, maxY],
		[minX, maxY]
	];
}

/** Even-odd point-in-polygon (boundary counts either way; fine for picking). */
export function pointInPolygon([px, py]: readonly [number, number], outline: readonly (readonly [number, number])[]): boolean {
	let inside = false;
	for (let i = 0, j = outline.length - 1; i < outline.length; j = i++) {
		const [xi, yi] = outline[i];
		const [xj, yj] = outline[j];
		if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside;
	}
	return inside;
}

export function distToSegment([px, py]: readonly [number, number], [ax, ay]: readonly [number, number], [bx, by]: readonly [number, number]): number {
	const dx = bx - ax;
	const dy = by - ay;
	const len2 = dx * dx + dy * dy;
	const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2));
	return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/** Rounds to a micro-inch so repeated edits do not pile up float noise in saved documents. */
export const tidy = (v: number): number => Math.round(v * 1e6) / 1e6;
export const tidyPoints = (pts: readonly (readonly [number, number])[]): Point[] => pts.map(([x, y]) => [tidy(x), tidy(y)]);
