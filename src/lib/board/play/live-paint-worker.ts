// The live painter: draws the board's live layer (the pieces that just changed, the dragged one
// among them, under the overlays) onto a canvas the page handed over (OffscreenCanvas), off the
// page's main thread. The page sends a scene at most once a frame, whenever the live layer
// changes; the worker draws the newest one in its own animation frame (scenes that come together
// are drawn once), and its frames reach the screen without the page's: a drag frame then costs
// the page a message, not a draw, a raster and a canvas hand-over.
import { BOARD_FONT, ChipWidths, drawOverlay, drawPiece, type PaintAsk, type PaintPiece, type PieceAt } from './board-paint';
import interBold from '@fontsource/inter/files/inter-latin-700-normal.woff2?url';
import type { Overlay } from '../types';

type Scene = Extract<PaintAsk, { type: 'scene' }>;

let canvas: OffscreenCanvas | null = null;
let ctx: OffscreenCanvasRenderingContext2D | null = null;
let scene: Scene | null = null;
let overlays: Overlay[] = [];
let keepOut: NonNullable<Scene['keepOut']> = {};
let pieces: PaintPiece[] = [];
let frame = 0;
let late: ReturnType<typeof setTimeout> | null = null;
/** how long a scene may wait for the worker's animation frame before it is drawn without one (ms) */
const LATE_MS = 50;

const widths = new ChipWidths(() => ctx);
const pieceAt: PieceAt = (id) => keepOut[id] ?? null;

const scope = self as unknown as {
	fonts?: { add(f: FontFace): void };
	requestAnimationFrame?: (cb: () => void) => number;
	cancelAnimationFrame?: (id: number) => void;
	onmessage: ((e: MessageEvent<PaintAsk>) => void) | null;
};

// The chips and labels are bold Inter, as on the page; a worker has its own fonts, so it loads
// the same file (from the browser's cache) and draws again once it is there.
if (typeof FontFace !== 'undefined' && scope.fonts) {
	const face = new FontFace(BOARD_FONT.split(',')[0], `url(${interBold})`, { weight: '700' });
	scope.fonts.add(face);
	void face.load().then(
		() => {
			widths.forget();
			request();
		},
		() => {
			// the fallback font stays: the chips are measured in it
		}
	);
}

// In the worker's animation frame, which keeps the drawing to the display's pace (drawing on
// every scene as it came took more of the shared CPU: 44 frames over 25 ms against 19–23). But
// its callbacks follow the canvas's own frames, and in the reach e2e one stopped coming after a
// drop, so that the layer was never drawn again: a scene that waits longer than LATE_MS is drawn
// in a task of its own (a canvas drawn in a task is shown when the task ends).
function request() {
	if (late || !scene) return;
	if (scope.requestAnimationFrame) frame = scope.requestAnimationFrame(draw);
	late = setTimeout(draw, scope.requestAnimationFrame ? LATE_MS : 0);
}

function draw() {
	if (frame) scope.cancelAnimationFrame?.(frame);
	frame = 0;
	if (late) clearTimeout(late);
	late = null;
	const s = scene;
	if (!s || !canvas || !ctx) return;
	const w = Math.max(1, Math.round(s.width * s.ratio));
	const h = Math.max(1, Math.round(s.height * s.ratio));
	if (canvas.width !== w) canvas.width = w;
	if (canvas.height !== h) canvas.height = h;
	const c = ctx;
	c.setTransform(1, 0, 0, 1, 0, 0);
	c.clearRect(0, 0, w, h);
	c.setTransform(s.ratio * s.scale, 0, 0, s.ratio * s.scale, s.ratio * s.offsetX, s.ratio * s.offsetY);
	const paint = { scale: s.scale, widths };
	for (const p of pieces) drawPiece(c, paint, p);
	for (const o of overlays) drawOverlay(c, paint, o, pieceAt, true);
}

scope.onmessage = (e) => {
	const m = e.data;
	if (m.type === 'canvas') {
		canvas = m.canvas;
		ctx = canvas.getContext('2d');
		request();
		return;
	}
	scene = m;
	pieces = m.pieces;
	if (m.overlays) {
		overlays = m.overlays;
		keepOut = m.keepOut ?? {};
	}
	request();
};
