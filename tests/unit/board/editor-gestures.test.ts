// The editor's gesture handling: pointer events in inches become commands (drag a rectangle,
// tap out a polygon, place an objective, drag to move with snapping, undo).
import { describe, expect, it } from 'vitest';
import { BoardEditor } from '../../../src/lib/board/editor/editor.svelte';
import { emptyLayout } from '../../../src/lib/schemas/layout';
import { demoLayout } from '../../../src/lib/board/demo-layout';
import type { BoardPointer, HitTarget } from '../../../src/lib/board/types';

const ev = (phase: BoardPointer['phase'], x: number, y: number, target: HitTarget | null = null): BoardPointer => ({
	phase,
	at: { x, y },
	px: { x: x * 10, y: y * 10 },
	target,
	pointerType: 'touch',
	shiftKey: false
});

function drag(ed: BoardEditor, from: [number, number], to: [number, number], target: HitTarget | null = null) {
	const captured = ed.pointer(ev('down', ...from, target));
	ed.pointer(ev('move', (from[0] + to[0]) / 2, (from[1] + to[1]) / 2));
	ed.pointer(ev('move', ...to));
	ed.pointer(ev('up', ...to));
	return captured;
}

describe('board editor gestures', () => {
	it('a drag with the block tool draws a grid-snapped block, selected, 3 in high', () => {
		const ed = new BoardEditor(emptyLayout());
		ed.setTool('block');
		expect(drag(ed, [4.2, 5.1], [9.8, 8.4])).toBe(true);
		expect(ed.layout.terrain).toHaveLength(1);
		const b = ed.layout.terrain[0];
		expect(b).toMatchObject({ kind: 'block', height: 3 });
		expect(b.outline).toEqual([[4, 5], [10, 5], [10, 8], [4, 8]]);
		expect(ed.selectedId).toBe(b.id);
		ed.undo();
		expect(ed.layout.terrain).toHaveLength(0);
	});

	it('taps with the area tool make a polygon, finished with the button', () => {
		const ed = new BoardEditor(emptyLayout());
		ed.setTool('area');
		for (const [x, y] of [[2, 2], [8, 2], [6, 7]] as const) {
			ed.pointer(ev('down', x, y));
			ed.pointer(ev('up', x, y));
		}
		expect(ed.draftCanFinish).toBe(true);
		ed.finishDraft();
		expect(ed.layout.terrain[0]).toMatchObject({ kind: 'area', outline: [[2, 2], [8, 2], [6, 7]] });
	});

	it('a tap with the objective tool places a marker; a tap off the table puts it on the edge', () => {
		const ed = new BoardEditor(emptyLayout());
		ed.setTool('objective');
		ed.pointer(ev('down', 21.7, 30.2));
		ed.pointer(ev('up', 21.7, 30.2));
		ed.pointer(ev('down', 50, 10));
		ed.pointer(ev('up', 50, 10));
		expect(ed.layout.objectives.map((o) => [o.x, o.y])).toEqual([[22, 30], [44, 10]]);
	});

	it('dragging a selected block moves it with the grid, as one undo step; the preview is not recorded', () => {
		const ed = new BoardEditor(demoLayout());
		const target: HitTarget = { layer: 'terrain', id: 'granary' };
		ed.pointer(ev('down', 9, 18, target));
		ed.pointer(ev('move', 11.4, 19));
		expect(ed.preview).not.toBeNull();
		expect(ed.history.past).toHaveLength(0);
		ed.pointer(ev('up', 12.3, 20.2));
		const g = ed.layout.terrain.find((t) => t.id === 'granary')!;
		expect(g.outline[0]).toEqual([9, 18]); // 6 + 3.3 → 9, 16 + 2.2 → 18
		expect(ed.history.past).toHaveLength(1);
		ed.undo();
		expect(ed.layout.terrain.find((t) => t.id === 'granary')!.outline[0]).toEqual([6, 16]);
	});

	it('the wall tool needs a ruin: a drag inside the chapel adds a straight wall to it', () => {
		const ed = new BoardEditor(demoLayout());
		ed.setTool('wall');
		expect(ed.pointer(ev('down', 30, 50))).toBe(false);
		drag(ed, [20, 30], [24, 30], { layer: 'terrain', id: 'chapel' });
		const chapel = ed.layout.terrain.find((t) => t.id === 'chapel')!;
		expect(chapel.kind === 'ruin' && chapel.walls?.[2]).toEqual([[20, 30], [24, 30]]);
	});

	it('dragging the rotate handle turns the selection in 15° steps', () => {
		const ed = new BoardEditor(emptyLayout());
		ed.setTool('zone-a');
		drag(ed, [0, 0], [10, 4]);
		ed.setTool('select');
		const id = ed.selectedId!;
		// centre (5, 2); start straight above it, end 100° round (snaps to 105°)
		const r = 5;
		const a = (-90 + 100) * (Math.PI / 180);
		ed.pointer(ev('down', 5, 2 - r, { layer: 'handle', id: 'rotate' }));
		ed.pointer(ev('up', 5 + r * Math.cos(a), 2 + r * Math.sin(a)));
		const z = ed.layout.zones.find((x) => x.id === id)!;
		const [p0, p1] = z.outline;
		expect((Math.atan2(p1[1] - p0[1], p1[0] - p0[0]) * 180) / Math.PI).toBeCloseTo(105, 4); // points kept to a micro-inch
	});
});
