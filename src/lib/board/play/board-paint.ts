// The board's overlays, chips and pieces drawn straight onto a 2D context from their
// descriptions, in board inches: by BoardCanvas on the page (the still layer's overlays and the
// table's names), and by the live painter worker (live-paint-worker.ts), which draws the live
// layer off the page's main thread. No Konva here: the same code runs in both places.
import { mmToIn } from '../../referee/profile';
import type { FootprintIn } from '../../schemas/check';
import type { Side } from '../../schemas/layout';
import { PALETTE, SIDE_COLOUR, toneColour } from '../palette';
import type { Overlay, Tone } from '../types';

type Ctx = CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D;

export const BOARD_FONT = 'Inter, system-ui, sans-serif';

/** A piece as drawn: its look and the pose it is drawn at. */
export interface PaintPiece {
	id: string;
	side: Side;
	footprint: FootprintIn;
	label: string;
	faded: boolean;
	flagged: boolean;
	x: number;
	y: number;
	facing: number;
}

/** Where a keep-out band's piece is drawn now. */
export type PieceAt = (id: string) => { footprint: FootprintIn; x: number; y: number; facing: number } | null;

/** Text widths, measured once per text and size (a drag draws the same chips again and again). */
export class ChipWidths {
	private widths = new Map<string, number>();
	private measure: { font: string; measureText(t: string): { width: number } } | null = null;

	constructor(private make: () => { font: string; measureText(t: string): { width: number } } | null) {}

	/** the text's width in screen pixels, bold at `sizePx` */
	px(text: string, sizePx: number): number {
		const k = `${sizePx}|${text}`;
		let w = this.widths.get(k);
		if (w === undefined) {
			this.measure ??= this.make();
			if (!this.measure) return text.length * sizePx * 0.6;
			this.measure.font = `bold ${sizePx}px ${BOARD_FONT}`;
			w = this.measure.measureText(text).width;
			if (this.widths.size > 5000) this.widths.clear();
			this.widths.set(k, w);
		}
		return w;
	}

	/** widths measured before a web font arrived are the fallback font's */
	forget(): void {
		this.widths.clear();
	}
}

/** What a draw needs besides the context: the zoom (screen pixels per inch) and the text widths. */
export interface Paint {
	scale: number;
	widths: ChipWidths;
}

const px = (p: Paint, n: number) => n / p.scale;

/** A stroke of the current path, `widthPx` screen pixels wide, dashed as given (in screen pixels). */
function strokeNow(c: Ctx, p: Paint, colour: string, widthPx: number, dashPx?: [number, number]) {
	c.lineWidth = px(p, widthPx);
	c.strokeStyle = colour;
	if (dashPx) c.setLineDash([px(p, dashPx[0]), px(p, dashPx[1])]);
	c.stroke();
	if (dashPx) c.setLineDash([]);
}

/** Text on a pale rounded box, centred on a point. */
export function drawChip(c: Ctx, p: Paint, x: number, y: number, text: string, colour: string, sizePx: number) {
	const pad = px(p, 4);
	const w = px(p, p.widths.px(text, sizePx)) + 2 * pad;
	const h = px(p, sizePx) + 2 * pad;
	c.beginPath();
	if (c.roundRect) c.roundRect(x - w / 2, y - h / 2, w, h, px(p, 4));
	else c.rect(x - w / 2, y - h / 2, w, h);
	c.globalAlpha *= 0.95;
	c.fillStyle = PALETTE.felt50;
	c.fill();
	c.lineWidth = px(p, 1);
	c.strokeStyle = colour;
	c.stroke();
	c.globalAlpha /= 0.95;
	c.font = `bold ${px(p, sizePx)}px ${BOARD_FONT}`;
	c.textAlign = 'center';
	c.textBaseline = 'middle';
	c.fillStyle = PALETTE.ink900;
	c.fillText(text, x, y);
}

function footprintPath(c: Ctx, fp: FootprintIn) {
	c.beginPath();
	if (fp.shape === 'round') c.arc(0, 0, mmToIn(fp.diameterMm) / 2, 0, Math.PI * 2);
	else if (fp.shape === 'oval') c.ellipse(0, 0, mmToIn(fp.lengthMm) / 2, mmToIn(fp.widthMm) / 2, 0, 0, Math.PI * 2);
	else fp.points.forEach(([x, y], i) => (i === 0 ? c.moveTo(x, y) : c.lineTo(x, y)));
	c.closePath();
}

/** How far the facing tick reaches from the centre: to 90 % of the front edge. */
export function tickReach(fp: FootprintIn): number {
	if (fp.shape === 'round') return mmToIn(fp.diameterMm) / 2;
	if (fp.shape === 'oval') return mmToIn(fp.lengthMm) / 2;
	return Math.max(...fp.points.map(([x]) => x));
}

/**
 * One piece, as the canvas's Konva pieces look: the footprint in its side's colour with a pale
 * edge (the signal colour, thicker, when flagged), a facing tick, the label upright.
 */
export function drawPiece(c: Ctx, p: Paint, piece: PaintPiece) {
	c.save();
	c.translate(piece.x, piece.y);
	c.rotate((piece.facing * Math.PI) / 180);
	if (piece.faded) c.globalAlpha *= 0.35;
	footprintPath(c, piece.footprint);
	c.fillStyle = SIDE_COLOUR[piece.side];
	c.fill();
	c.lineWidth = (piece.flagged ? 3 : 1.5) / p.scale;
	c.strokeStyle = piece.flagged ? PALETTE.signal500 : PALETTE.felt50;
	c.stroke();
	c.beginPath();
	c.moveTo(0, 0);
	c.lineTo(tickReach(piece.footprint) * 0.9, 0);
	c.lineWidth = 2 / p.scale;
	c.strokeStyle = PALETTE.felt50;
	c.stroke();
	if (piece.label) {
		c.rotate((-piece.facing * Math.PI) / 180);
		c.font = `bold ${11 / p.scale}px ${BOARD_FONT}`;
		c.textAlign = 'center';
		c.textBaseline = 'middle';
		c.fillStyle = PALETTE.felt50;
		c.fillText(piece.label, 0, 0);
	}
	c.restore();
}

/** A touch handle's look (its 44 px hit target is the canvas's Konva node). */
function drawHandle(c: Ctx, p: Paint, o: Extract<Overlay, { kind: 'handle' }>) {
	const r = px(p, o.shape === 'rotate' ? 11 : 9);
	c.beginPath();
	if (o.shape === 'square') c.rect(o.x - r, o.y - r, 2 * r, 2 * r);
	else c.arc(o.x, o.y, r, 0, Math.PI * 2);
	c.fillStyle = o.shape === 'rotate' ? PALETTE.brass500 : PALETTE.felt50;
	c.fill();
	strokeNow(c, p, PALETTE.ink900, 2);
	if (o.shape === 'rotate') {
		c.font = `bold ${px(p, 14)}px ${BOARD_FONT}`;
		c.textAlign = 'center';
		c.textBaseline = 'middle';
		c.fillStyle = PALETTE.ink900;
		c.fillText('↻', o.x, o.y);
	}
}

/** One overlay; handles only when `handles` is set (else the caller draws them as nodes). */
export function drawOverlay(c: Ctx, p: Paint, o: Overlay, pieceAt: PieceAt, handles = false) {
	const colour = toneColour(o.kind === 'warning' ? 'signal' : ((o as { tone?: Tone }).tone ?? 'ink'));
	switch (o.kind) {
		case 'ring':
			c.beginPath();
			c.arc(o.x, o.y, o.radiusIn, 0, Math.PI * 2);
			if (o.fill) {
				c.fillStyle = colour + '22';
				c.fill();
			}
			strokeNow(c, p, colour, 2, o.dashed ? [8, 6] : undefined);
			if (o.label) drawChip(c, p, o.x, o.y - o.radiusIn, o.label, colour, 12);
			break;
		case 'keep-out': {
			const at = pieceAt(o.pieceId);
			if (!at) break;
			// a stroke of width 2d with round joins around the footprint is exactly the set
			// within d of its edge: the keep-out band for any footprint
			c.save();
			c.translate(at.x, at.y);
			c.rotate((at.facing * Math.PI) / 180);
			footprintPath(c, at.footprint);
			c.lineJoin = 'round';
			c.lineWidth = 2 * o.distanceIn;
			c.strokeStyle = colour + '40';
			c.stroke();
			c.restore();
			break;
		}
		case 'link':
			c.beginPath();
			c.moveTo(o.from.x, o.from.y);
			c.lineTo(o.to.x, o.to.y);
			c.lineCap = 'round';
			strokeNow(c, p, colour, 2.5, o.dashed ? [6, 5] : undefined);
			c.lineCap = 'butt';
			if (o.label) drawChip(c, p, (o.from.x + o.to.x) / 2, (o.from.y + o.to.y) / 2, o.label, colour, 12);
			break;
		case 'path': {
			const pts = o.points;
			if (!pts.length) break;
			c.beginPath();
			c.moveTo(pts[0].x, pts[0].y);
			for (let i = 1; i < pts.length; i++) c.lineTo(pts[i].x, pts[i].y);
			if (o.closed) c.closePath();
			c.lineCap = 'round';
			c.lineJoin = 'round';
			if (o.closed && o.fill) {
				c.fillStyle = colour + '33';
				c.fill();
			}
			strokeNow(c, p, colour, 3, o.dashed ? [8, 6] : undefined);
			if (o.arrow && pts.length > 1) {
				// the head: a filled triangle 12 px long and wide, its tip on the last point
				const a = pts[pts.length - 2];
				const b = pts[pts.length - 1];
				const len = px(p, 12);
				c.save();
				c.translate(b.x, b.y);
				c.rotate(Math.atan2(b.y - a.y, b.x - a.x));
				c.beginPath();
				c.moveTo(0, 0);
				c.lineTo(-len, len / 2);
				c.lineTo(-len, -len / 2);
				c.closePath();
				c.fillStyle = colour;
				c.fill();
				strokeNow(c, p, colour, 3);
				c.restore();
			}
			c.lineCap = 'butt';
			c.lineJoin = 'miter';
			break;
		}
		case 'label':
			drawChip(c, p, o.x, o.y, o.text, colour, o.sizePx ?? 13);
			break;
		case 'warning': {
			// a triangle with "!" (shape and sign, not colour alone)
			const r = px(p, 13);
			c.beginPath();
			for (let i = 0; i < 3; i++) {
				const t = (i * 2 * Math.PI) / 3;
				if (i === 0) c.moveTo(o.x + r * Math.sin(t), o.y - r * Math.cos(t));
				else c.lineTo(o.x + r * Math.sin(t), o.y - r * Math.cos(t));
			}
			c.closePath();
			c.fillStyle = PALETTE.signal500;
			c.fill();
			strokeNow(c, p, PALETTE.felt50, 2);
			c.font = `bold ${px(p, 13)}px ${BOARD_FONT}`;
			c.textAlign = 'center';
			c.textBaseline = 'middle';
			c.fillStyle = PALETTE.felt50;
			c.fillText('!', o.x, o.y + px(p, 2));
			if (o.label) drawChip(c, p, o.x, o.y + px(p, 24), o.label, PALETTE.signal700, 12);
			break;
		}
		case 'handle':
			if (handles) drawHandle(c, p, o);
			break;
	}
}

// --- the live painter worker's messages ------------------------------------------------------

/** The page to the live painter. */
export type PaintAsk =
	| { type: 'canvas'; canvas: OffscreenCanvas }
	| {
			type: 'scene';
			/** canvas size in CSS pixels, and device pixels per CSS pixel */
			width: number;
			height: number;
			ratio: number;
			/** the stage's zoom (px per inch) and offset (px) */
			scale: number;
			offsetX: number;
			offsetY: number;
			pieces: PaintPiece[];
			/** the overlays, when they changed since the last scene */
			overlays?: Overlay[];
			/** where the overlays' keep-out bands' pieces stand, by id (sent with `overlays`) */
			keepOut?: Record<string, { footprint: FootprintIn; x: number; y: number; facing: number }>;
	  };
