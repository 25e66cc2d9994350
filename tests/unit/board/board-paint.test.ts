// board-paint.ts draws the same overlays, chips and pieces on the page and in the live painter
// worker: checked here against a context that records what it is asked to do.
import { describe, expect, it } from 'vitest';
import { ChipWidths, drawChip, drawOverlay, drawPiece, type PaintPiece } from '$lib/board/play/board-paint';
import { PALETTE } from '$lib/board/palette';

/** A 2D context stand-in: properties are kept, every method call is written down. */
function recorder() {
	const calls: string[] = [];
	const props: Record<string, unknown> = { globalAlpha: 1 };
	const ctx = new Proxy(
		{},
		{
			get(_, k: string) {
				if (k in props) return props[k];
				return (...args: unknown[]) => {
					calls.push(`${k}(${args.map((a) => (typeof a === 'number' ? Number(a.toFixed(4)) : Array.isArray(a) ? `[${a}]` : a)).join(',')})`);
					return k === 'measureText' ? { width: String(args[0]).length * 7 } : undefined;
				};
			},
			set(_, k: string, v) {
				props[k] = v;
				calls.push(`${k}=${typeof v === 'number' ? Number(v.toFixed(4)) : v}`);
				return true;
			}
		}
	) as CanvasRenderingContext2D;
	return { ctx, calls, props };
}

const paintAt = (scale: number) => ({ scale, widths: new ChipWidths(() => null) });

describe('board paint', () => {
	it('draws a keep-out band about where its piece is drawn now, and nothing without the piece', () => {
		const { ctx, calls } = recorder();
		const at = { footprint: { shape: 'round' as const, diameterMm: 25.4 }, x: 3, y: 4, facing: 90 };
		drawOverlay(ctx, paintAt(10), { kind: 'keep-out', pieceId: 'b-u1-p1', distanceIn: 1, tone: 'signal' }, (id) => (id === 'b-u1-p1' ? at : null));
		expect(calls).toContain('translate(3,4)');
		expect(calls).toContain(`rotate(${Number((Math.PI / 2).toFixed(4))})`);
		expect(calls).toContain('arc(0,0,0.5,0,6.2832)');
		// a stroke twice the distance wide about the edge is the band within the distance
		expect(calls).toContain('lineWidth=2');
		expect(calls[calls.length - 1]).toBe('restore()');

		const none = recorder();
		drawOverlay(none.ctx, paintAt(10), { kind: 'keep-out', pieceId: 'gone', distanceIn: 1, tone: 'signal' }, () => null);
		expect(none.calls).toEqual([]);
	});

	it('draws a handle only when asked (on the page its Konva node draws it)', () => {
		const handle = { kind: 'handle' as const, id: 'h', x: 1, y: 2, shape: 'round' as const };
		const page = recorder();
		drawOverlay(page.ctx, paintAt(10), handle, () => null);
		expect(page.calls).toEqual([]);
		const worker = recorder();
		drawOverlay(worker.ctx, paintAt(10), handle, () => null, true);
		// 9 screen pixels at 10 px per inch
		expect(worker.calls).toContain('arc(1,2,0.9,0,6.2832)');
	});

	it('sizes strokes, dashes and chips in screen pixels at the zoom of the draw', () => {
		const { ctx, calls } = recorder();
		drawOverlay(ctx, paintAt(20), { kind: 'link', from: { x: 0, y: 0 }, to: { x: 2, y: 0 }, tone: 'ok', dashed: true, label: '2.00 in' }, () => null);
		expect(calls).toContain('lineWidth=0.125');
		expect(calls).toContain('setLineDash([0.3,0.25])');
		expect(calls).toContain('setLineDash([])');
		// the chip sits at the middle of the link, with its text
		expect(calls).toContain('fillText(2.00 in,1,0)');
	});

	it('measures a chip text once per text and size, again after forget()', () => {
		let measured = 0;
		const widths = new ChipWidths(() => ({
			font: '',
			measureText: (t: string) => {
				measured++;
				return { width: t.length * 6 };
			}
		}));
		const { ctx } = recorder();
		const paint = { scale: 10, widths };
		drawChip(ctx, paint, 0, 0, '5.63 in of 6', PALETTE.ink700, 12);
		drawChip(ctx, paint, 1, 1, '5.63 in of 6', PALETTE.ink700, 12);
		expect(measured).toBe(1);
		drawChip(ctx, paint, 0, 0, '5.63 in of 6', PALETTE.ink700, 13);
		expect(measured).toBe(2);
		widths.forget();
		drawChip(ctx, paint, 0, 0, '5.63 in of 6', PALETTE.ink700, 12);
		expect(measured).toBe(3);
	});

	it('draws a faded piece translucent and a flagged one with a thicker signal edge', () => {
		const piece: PaintPiece = { id: 'a-u1-p1', side: 'a', footprint: { shape: 'round', diameterMm: 25.4 }, label: '1', faded: true, flagged: true, x: 5, y: 6, facing: 0 };
		const { ctx, calls } = recorder();
		drawPiece(ctx, paintAt(10), piece);
		expect(calls).toContain('globalAlpha=0.35');
		expect(calls).toContain(`strokeStyle=${PALETTE.signal500}`);
		expect(calls).toContain('lineWidth=0.3');
		expect(calls).toContain('fillText(1,0,0)');
		const plain = recorder();
		drawPiece(plain.ctx, paintAt(10), { ...piece, faded: false, flagged: false });
		expect(plain.calls).not.toContain('globalAlpha=0.35');
		expect(plain.calls).toContain('lineWidth=0.15');
	});
});
