// Editor commands over layouts and their undo/redo round trips; hand-worked geometry.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { emptyLayout, layoutSchema, type Layout, type Point } from '../../../src/lib/schemas/layout';
import { perform, nextId, type Command } from '../../../src/lib/board/editor/commands';
import { execute, redo, startHistory, undo, canUndo, canRedo, HISTORY_LIMIT } from '../../../src/lib/board/editor/history';
import { demoLayout } from '../../../src/lib/board/demo-layout';
import { frameBox } from '../../../src/lib/board/geometry';

const rect = (x: number, y: number, w: number, h: number): Point[] => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];
const withBlock = (): Layout => perform(emptyLayout(), { type: 'add-terrain', terrain: { id: 'b1', kind: 'block', outline: rect(10, 10, 4, 2), height: 2 } });
const block = (l: Layout) => l.terrain.find((t) => t.id === 'b1')!;
const close = (a: Point[], b: Point[]) => a.forEach((p, i) => (expect(p[0]).toBeCloseTo(b[i][0], 6), expect(p[1]).toBeCloseTo(b[i][1], 6)));

describe('commands', () => {
	it('adds terrain, objectives and zones, and never mutates the layout it was given', () => {
		const start = emptyLayout();
		const frozen = JSON.stringify(start);
		let l = perform(start, { type: 'add-terrain', terrain: { id: 'b1', kind: 'block', outline: rect(1, 1, 2, 2), height: 3 } });
		l = perform(l, { type: 'add-objective', objective: { id: 'o1', x: 22, y: 30 } });
		l = perform(l, { type: 'add-zone', zone: { id: 'z1', side: 'a', outline: rect(0, 0, 44, 12) } });
		expect(JSON.stringify(start)).toBe(frozen);
		expect(l.terrain).toHaveLength(1);
		expect(l.objectives).toEqual([{ id: 'o1', x: 22, y: 30 }]);
		expect(l.zones[0].side).toBe('a');
		expect(layoutSchema.safeParse(l).success).toBe(true);
	});

	it('refuses a duplicate id and an objective off the table by returning the same layout', () => {
		const l = withBlock();
		expect(perform(l, { type: 'add-objective', objective: { id: 'b1', x: 1, y: 1 } })).toBe(l);
		expect(perform(l, { type: 'add-objective', objective: { id: 'o9', x: 50, y: 1 } })).toBe(l);
	});

	it('moves terrain with its walls, and keeps a moved objective on the table', () => {
		let l = perform(emptyLayout(), { type: 'add-terrain', terrain: { id: 'r', kind: 'ruin', outline: rect(2, 2, 4, 4), walls: [[[2, 2], [6, 2]]] } });
		l = perform(l, { type: 'add-objective', objective: { id: 'o', x: 43, y: 59 } });
		l = perform(l, { type: 'move', ids: ['r', 'o'], dx: 3, dy: 1 });
		const ruin = l.terrain[0];
		expect(ruin.outline[0]).toEqual([5, 3]);
		expect(ruin.kind === 'ruin' && ruin.walls).toEqual([[[5, 3], [9, 3]]]);
		expect(l.objectives[0]).toMatchObject({ x: 44, y: 60 });
	});

	it('rotates a 4 × 2 block 90° about its centre (12, 11)', () => {
		const l = perform(withBlock(), { type: 'rotate', id: 'b1', deg: 90 });
		// (10,10) → centre + rot90(−2,−1) = (12+1, 11−2)
		close(block(l).outline as Point[], [[13, 9], [13, 13], [11, 13], [11, 9]]);
	});

	it('resizes in the item’s own frame: a rotated rectangle stays a rectangle of the new size', () => {
		let l = perform(withBlock(), { type: 'rotate', id: 'b1', deg: 30 });
		l = perform(l, { type: 'resize', id: 'b1', widthIn: 6, depthIn: 3, anchor: 0 });
		const { box, deg } = frameBox(block(l).outline);
		expect(deg).toBeCloseTo(30, 4); // points are kept to a micro-inch, so the angle to ~1e-5°
		expect(box.maxX - box.minX).toBeCloseTo(6, 6);
		expect(box.maxY - box.minY).toBeCloseTo(3, 6);
		// the anchor corner (the first vertex, top-left in its frame) did not move
		const before = perform(withBlock(), { type: 'rotate', id: 'b1', deg: 30 });
		close([block(l).outline[0] as Point], [block(before).outline[0] as Point]);
	});

	it('resizes about the centre from the side panel, and refuses a size under 0.25 in', () => {
		const l = perform(withBlock(), { type: 'resize', id: 'b1', widthIn: 8, depthIn: 2, anchor: 'centre' });
		close(block(l).outline as Point[], rect(8, 10, 8, 2));
		const same = withBlock();
		expect(perform(same, { type: 'resize', id: 'b1', widthIn: 0.1, depthIn: 2, anchor: 0 })).toBe(same);
	});

	it('edits a block’s height, but not below 0 and not on other kinds', () => {
		const l = perform(withBlock(), { type: 'set-height', id: 'b1', heightIn: 4.5 });
		expect(block(l)).toMatchObject({ kind: 'block', height: 4.5 });
		expect(perform(l, { type: 'set-height', id: 'b1', heightIn: -1 })).toBe(l);
		const d = demoLayout();
		expect(perform(d, { type: 'set-height', id: 'chapel', heightIn: 2 })).toBe(d);
	});

	it('adds and removes ruin walls only on ruins', () => {
		const d = demoLayout();
		const l = perform(d, { type: 'add-wall', id: 'chapel', wall: [[20, 30], [24, 30]] });
		const walls = (x: Layout) => (x.terrain.find((t) => t.id === 'chapel') as { walls: Point[][] }).walls;
		expect(walls(l)).toHaveLength(3);
		const r = perform(l, { type: 'remove-wall', id: 'chapel', index: 0 });
		expect(walls(r)).toEqual([walls(l)[1], walls(l)[2]]);
		expect(perform(d, { type: 'add-wall', id: 'granary', wall: [[1, 1], [2, 2]] })).toBe(d);
		expect(perform(d, { type: 'remove-wall', id: 'chapel', index: 7 })).toBe(d);
	});

	it('deletes by id from any collection, renames, and switches a zone’s side', () => {
		let l = perform(demoLayout(), { type: 'delete', ids: ['granary', 'obj-west', 'zone-b'] });
		expect(l.terrain.map((t) => t.id)).not.toContain('granary');
		expect(l.objectives.map((o) => o.id)).not.toContain('obj-west');
		expect(l.zones.map((z) => z.id)).toEqual(['zone-a']);
		l = perform(l, { type: 'rename', id: 'chapel', name: '  Bell tower ' });
		expect(l.terrain.find((t) => t.id === 'chapel')!.name).toBe('Bell tower');
		l = perform(l, { type: 'rename', id: 'chapel', name: '' });
		expect(l.terrain.find((t) => t.id === 'chapel')).not.toHaveProperty('name');
		l = perform(l, { type: 'set-side', id: 'zone-a', side: 'b' });
		expect(l.zones[0].side).toBe('b');
	});

	it('sets the table size within 6–200 in and pulls markers that would fall off onto the edge', () => {
		const l = perform(demoLayout(), { type: 'set-board', width: 30, depth: 30 });
		expect(l.board).toEqual({ width: 30, depth: 30 });
		expect(l.objectives.find((o) => o.id === 'obj-east')).toMatchObject({ x: 30, y: 30 });
		expect(perform(l, { type: 'set-board', width: 3, depth: 30 })).toBe(l);
	});

	it('gives new ids after the highest of their prefix', () => {
		let l = withBlock();
		expect(nextId(l, 'block')).toBe('block-1');
		l = perform(l, { type: 'add-terrain', terrain: { id: 'block-4', kind: 'block', outline: rect(1, 1, 1, 1), height: 1 } });
		expect(nextId(l, 'block')).toBe('block-5');
	});
});

describe('undo and redo', () => {
	const steps: Command[] = [
		{ type: 'add-terrain', terrain: { id: 'b1', kind: 'block', outline: rect(10, 10, 4, 2), height: 2 } },
		{ type: 'move', ids: ['b1'], dx: 2, dy: 0 },
		{ type: 'rotate', id: 'b1', deg: 45 },
		{ type: 'set-height', id: 'b1', heightIn: 5 },
		{ type: 'add-objective', objective: { id: 'o1', x: 5, y: 5 } },
		{ type: 'delete', ids: ['b1'] }
	];

	it('undoing every step returns the exact starting layout, and redoing them the exact end', () => {
		let h = startHistory(emptyLayout());
		const states = [h.present];
		for (const s of steps) {
			h = execute(h, s);
			states.push(h.present);
		}
		for (let i = steps.length - 1; i >= 0; i--) {
			h = undo(h);
			expect(h.present).toEqual(states[i]);
		}
		expect(canUndo(h)).toBe(false);
		for (let i = 1; i <= steps.length; i++) {
			h = redo(h);
			expect(h.present).toEqual(states[i]);
		}
		expect(canRedo(h)).toBe(false);
	});

	it('a new command after an undo clears the redo stack; a no-op is not an undo step', () => {
		let h = execute(execute(startHistory(emptyLayout()), steps[0]), steps[1]);
		h = undo(h);
		expect(canRedo(h)).toBe(true);
		h = execute(h, steps[3]);
		expect(canRedo(h)).toBe(false);
		const before = h;
		expect(execute(h, { type: 'delete', ids: ['nothing'] })).toBe(before);
	});

	it('keeps at most HISTORY_LIMIT undo steps', () => {
		let h = startHistory(withBlock());
		for (let i = 0; i < HISTORY_LIMIT + 20; i++) h = execute(h, { type: 'move', ids: ['b1'], dx: 0.5, dy: 0 });
		expect(h.past).toHaveLength(HISTORY_LIMIT);
	});

	it('property: any sequence of moves and rotations undone in full gives back the start (fast-check)', () => {
		const cmd = fc.oneof(
			fc.record({ type: fc.constant('move' as const), ids: fc.constant<string[]>(['granary', 'chapel', 'obj-north']), dx: fc.integer({ min: -5, max: 5 }), dy: fc.integer({ min: -5, max: 5 }) }),
			fc.record({ type: fc.constant('rotate' as const), id: fc.constantFrom('granary', 'chapel', 'zone-a'), deg: fc.integer({ min: -180, max: 180 }) }),
			fc.record({ type: fc.constant('set-height' as const), id: fc.constant('granary'), heightIn: fc.integer({ min: 0, max: 10 }) })
		);
		fc.assert(
			fc.property(fc.array(cmd, { maxLength: 30 }), (cmds) => {
				const start = demoLayout();
				let h = startHistory(start);
				for (const c of cmds) {
					h = execute(h, c);
					// every intermediate layout stays a valid document
					expect(layoutSchema.safeParse(h.present).success).toBe(true);
				}
				while (canUndo(h)) h = undo(h);
				expect(h.present).toBe(start);
			}),
			{ numRuns: 100 }
		);
	});
});
