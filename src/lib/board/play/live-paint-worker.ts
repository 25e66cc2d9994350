// The live painter: draws the board's live layer (the pieces that just changed, the dragged one
// among them, under the overlays) onto a canvas the page handed over (OffscreenCanvas), off the
// page's main thread. The page sends a scene at most once a frame, whenever the live layer
// changes; the worker draws the newest one in a task of its own (scenes that come together are
// drawn once), and its frames reach the screen without the page's: a drag frame then costs the
// page a message, not a draw, a raster and a canvas hand-over.
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
let pending: ReturnType<typeof setTimeout> | null = null;

const widths = new ChipWidths(() => ctx);
const pieceAt: PieceAt = (id) => keepOut[id] ?? null;

const scope = self as unknown as {
	fonts?: { add(f: FontFace): void };
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

// Not in the worker's animation frames: in the reach e2e their callbacks stopped coming after a
// drop and the live layer stayed blank, and with a fallback task for a late frame the layer was
// still blank in the screenshot taken just after the drop. A canvas drawn in a task is shown when
// the task ends; the page posts at most one scene a frame, so this keeps to its pace.
function request() {
	if (pending || !scene) return;
	pending = setTimeout(draw, 0);
}

function draw() {
	pending = null;
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
