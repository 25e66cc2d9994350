// The layout document: what it accepts and refuses, and its conversion to the engine's board.
import { describe, expect, it } from 'vitest';
import { boardSchema } from '../../../src/lib/schemas/check';
import { emptyLayout, layoutSchema, layoutToBoard, DEFAULT_BOARD, type LayoutInput } from '../../../src/lib/schemas/layout';
import { demoLayout } from '../../../src/lib/board/demo-layout';

const square = [[1, 1], [3, 1], [3, 3], [1, 3]] as [number, number][];
const base = (over: Partial<LayoutInput> = {}): LayoutInput => ({ schemaVersion: 1, name: 'Test table', ...over });

describe('layout schema', () => {
	it('fills a 44 × 60 in table and empty lists when only the version and name are given', () => {
		const doc = layoutSchema.parse(base());
		expect(doc.board).toEqual({ width: 44, depth: 60 });
		expect(DEFAULT_BOARD).toEqual({ width: 44, depth: 60 });
		expect(doc).toMatchObject({ terrain: [], objectives: [], zones: [] });
	});

	it('accepts the demo table as it is', () => {
		expect(layoutSchema.safeParse(demoLayout()).success).toBe(true);
	});

	it('refuses another schema version, a blank name, and a table under 6 in', () => {
		expect(layoutSchema.safeParse({ ...base(), schemaVersion: 2 }).success).toBe(false);
		expect(layoutSchema.safeParse(base({ name: '   ' })).success).toBe(false);
		expect(layoutSchema.safeParse(base({ board: { width: 5, depth: 60 } })).success).toBe(false);
	});

	it('refuses a block without a height and a zone for a third side', () => {
		const noHeight = base({ terrain: [{ id: 't', kind: 'block', outline: square } as never] });
		expect(layoutSchema.safeParse(noHeight).success).toBe(false);
		const badSide = base({ zones: [{ id: 'z', side: 'c' as never, outline: square }] });
		expect(layoutSchema.safeParse(badSide).success).toBe(false);
	});

	it('refuses duplicate ids across terrain, objectives and zones, naming the path', () => {
		const r = layoutSchema.safeParse(
			base({ terrain: [{ id: 'x', kind: 'area', outline: square }], objectives: [{ id: 'x', x: 5, y: 5 }] })
		);
		expect(r.success).toBe(false);
		expect(r.error!.issues[0]).toMatchObject({ path: ['objectives', 0, 'id'], message: 'duplicate id "x"' });
	});

	it('refuses an outline with no area and an objective off the table', () => {
		const flat = base({ terrain: [{ id: 'f', kind: 'impassable', outline: [[0, 0], [5, 0], [10, 0]] }] });
		expect(layoutSchema.safeParse(flat).error?.issues[0].message).toBe('the outline encloses no area');
		const off = base({ objectives: [{ id: 'o', x: 45, y: 10 }] });
		expect(layoutSchema.safeParse(off).error?.issues[0].message).toBe('the objective is off the table');
	});

	it('a ruin wall needs two points', () => {
		const r = base({ terrain: [{ id: 'r', kind: 'ruin', outline: square, walls: [[[1, 1]]] }] });
		expect(layoutSchema.safeParse(r).success).toBe(false);
	});
});

describe('layoutToBoard', () => {
	it('gives the engine exactly its board: terrain and objectives without names, no zones', () => {
		const board = layoutToBoard(demoLayout());
		expect(boardSchema.safeParse(board).success).toBe(true);
		expect(board.width).toBe(44);
		expect(board.depth).toBe(60);
		expect(board.terrain).toHaveLength(6);
		expect(board.terrain[0]).toEqual({ id: 'granary', kind: 'block', height: 3, outline: [[6, 16], [12, 16], [12, 20], [6, 20]] });
		const chapel = board.terrain.find((t) => t.id === 'chapel');
		expect(chapel).toMatchObject({ kind: 'ruin' });
		expect((chapel as { walls: unknown[] }).walls).toHaveLength(2);
		expect(board.objectives[0]).toEqual({ id: 'obj-north', x: 22, y: 20 });
		expect(JSON.stringify(board)).not.toContain('name');
		expect(board).not.toHaveProperty('zones');
	});

	it('gives a ruin without walls an empty wall list and copies outlines (no shared arrays)', () => {
		const doc = layoutSchema.parse(base({ terrain: [{ id: 'r', kind: 'ruin', outline: square }] }));
		const board = layoutToBoard(doc);
		expect(board.terrain[0]).toEqual({ id: 'r', kind: 'ruin', outline: square, walls: [] });
		expect(board.terrain[0].outline).not.toBe(doc.terrain[0].outline);
	});

	it('an empty layout is an empty 44 × 60 board', () => {
		expect(layoutToBoard(emptyLayout())).toEqual({ width: 44, depth: 60, terrain: [], objectives: [] });
	});
});
