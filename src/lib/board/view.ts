// The one place where board inches become screen pixels and back: a scale (px per in) and an
// offset (where the board's corner sits on screen), with fit, zoom-about-a-point and pan.
// Pure, so the canvas, the editor and the tests share the same arithmetic.

export interface View {
	/** pixels per inch */
	scale: number;
	/** screen position (px, relative to the canvas) of board point (0, 0) */
	offsetX: number;
	offsetY: number;
}

export interface PointIn {
	x: number;
	y: number;
}

export interface PointPx {
	x: number;
	y: number;
}

/** Zoom limits: a whole 200 in table on a phone, down to a single base filling a tablet. */
export const MIN_SCALE = 1;
export const MAX_SCALE = 400;
/** Room around the table for the edge rulers, px. */
export const FIT_MARGIN_PX = 28;

export function toPx(view: View, p: PointIn): PointPx {
	return { x: view.offsetX + p.x * view.scale, y: view.offsetY + p.y * view.scale };
}

export function toIn(view: View, p: PointPx): PointIn {
	return { x: (p.x - view.offsetX) / view.scale, y: (p.y - view.offsetY) / view.scale };
}

/** Inches as pixels at this view (for sizes, not positions). */
export const lengthPx = (view: View, inches: number): number => inches * view.scale;
/** Pixels as inches at this view: a 44 px touch target is this many inches. */
export const lengthIn = (view: View, px: number): number => px / view.scale;

const clampScale = (s: number) => Math.min(MAX_SCALE, Math.max(MIN_SCALE, s));

/** The largest view that shows the whole board, centred, with room for the rulers. */
export function fitView(board: { width: number; depth: number }, canvas: { width: number; height: number }, marginPx = FIT_MARGIN_PX): View {
	const w = Math.max(1, canvas.width - 2 * marginPx);
	const h = Math.max(1, canvas.height - 2 * marginPx);
	const scale = clampScale(Math.min(w / board.width, h / board.depth));
	return {
		scale,
		offsetX: (canvas.width - board.width * scale) / 2,
		offsetY: (canvas.height - board.depth * scale) / 2
	};
}

/** Zoom by `factor` keeping the board point under `anchor` (px) where it is. */
export function zoomAt(view: View, anchor: PointPx, factor: number): View {
	const scale = clampScale(view.scale * factor);
	const k = scale / view.scale;
	return {
		scale,
		offsetX: anchor.x - (anchor.x - view.offsetX) * k,
		offsetY: anchor.y - (anchor.y - view.offsetY) * k
	};
}

export function panBy(view: View, dxPx: number, dyPx: number): View {
	return { ...view, offsetX: view.offsetX + dxPx, offsetY: view.offsetY + dyPx };
}

/**
 * One step of a two-finger gesture: the midpoint moves (pan) and the finger spread changes
 * (zoom about the new midpoint), so the board follows both fingers.
 */
export function pinchStep(view: View, before: [PointPx, PointPx], after: [PointPx, PointPx]): View {
	const mid = (a: PointPx, b: PointPx) => ({ x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 });
	const spread = (a: PointPx, b: PointPx) => Math.max(1, Math.hypot(a.x - b.x, a.y - b.y));
	const m0 = mid(...before);
	const m1 = mid(...after);
	const panned = panBy(view, m1.x - m0.x, m1.y - m0.y);
	return zoomAt(panned, m1, spread(...after) / spread(...before));
}

/** Wheel delta (px, as browsers report it) to a zoom factor; smooth for trackpads and wheels. */
export function wheelFactor(deltaY: number): number {
	return Math.exp(-Math.max(-200, Math.min(200, deltaY)) * 0.0015);
}
