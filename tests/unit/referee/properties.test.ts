// Property tests (fast-check): the check never throws on schema-valid input; verdicts and
// findings do not depend on where the table stands or which way it is turned; a path costs the
// same reversed; splitting a straight leg in two does not change its cost.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMove } from '../../../src/lib/referee';
import { checkReportSchema, checkRequestSchema, footprintSchema, type CheckRequest, type PieceIn, type TerrainIn } from '../../../src/lib/schemas/check';

const coord = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true, noDefaultInfinity: true });

const footprint = fc.oneof(
	fc.record({ shape: fc.constant('round' as const), diameterMm: fc.constantFrom(25, 28.5, 32, 40, 50, 60) }),
	fc.record({ shape: fc.constant('oval' as const), lengthMm: fc.constantFrom(60, 75, 90), widthMm: fc.constantFrom(35, 42, 52) }),
	fc.record({
		shape: fc.constant('hull' as const),
		points: fc.array(fc.tuple(coord(-3, 3), coord(-3, 3)), { minLength: 3, maxLength: 6 })
	})
).filter((fp) => footprintSchema.safeParse(fp).success);

const cls = fc.constantFrom('foot', 'beast', 'swarm', 'mounted', 'vehicle', 'monster') as fc.Arbitrary<PieceIn['class']>;

function tableArb(lo: number, hi: number) {
	const pieceArb = (i: number) =>
		fc.record({
			side: fc.constantFrom('red', 'blue'),
			unit: fc.constantFrom('u1', 'u1', 'u2', 'u3'),
			class: cls,
			flies: fc.boolean(),
			allowance: fc.integer({ min: 0, max: 12 }),
			footprint,
			x: coord(lo, hi),
			y: coord(lo, hi),
			facing: fc.option(coord(-360, 360), { nil: undefined }),
			ring: fc.option(fc.record({ radius: coord(0, 8) }), { nil: undefined }),
			path: fc.array(fc.record({ x: coord(lo, hi), y: coord(lo, hi), facing: fc.option(coord(-360, 360), { nil: undefined }) }), { minLength: 1, maxLength: 3 }),
			listed: fc.boolean()
		}).map((p) => ({ ...p, id: `p${i}` }));
	const terrainArb = fc.record({
		kind: fc.constantFrom('block', 'ruin', 'impassable', 'area') as fc.Arbitrary<TerrainIn['kind']>,
		x: coord(lo, hi),
		y: coord(lo, hi),
		w: coord(0.5, 8),
		h: coord(0.5, 8),
		height: coord(0, 4)
	});
	return fc
		.record({
			pieces: fc.tuple(...Array.from({ length: 8 }, (_, i) => pieceArb(i))).chain((all) => fc.integer({ min: 1, max: 8 }).map((n) => all.slice(0, n))),
			terrain: fc.array(terrainArb, { maxLength: 3 }),
			kind: fc.constantFrom('hold', 'move', 'dash', 'withdraw') as fc.Arbitrary<CheckRequest['move']['kind']>,
			die: fc.integer({ min: 1, max: 6 }),
			objective: fc.record({ x: coord(lo, hi), y: coord(lo, hi) })
		})
		.map(({ pieces, terrain, kind, die, objective }) => {
			pieces[0].unit = 'u1';
			const req: CheckRequest = {
				board: {
					width: 200,
					depth: 200,
					terrain: terrain.map((t, i): TerrainIn => {
						const outline: [number, number][] = [
							[t.x, t.y],
							[t.x + t.w, t.y],
							[t.x + t.w, t.y + t.h],
							[t.x, t.y + t.h]
						];
						if (t.kind === 'block') return { id: `t${i}`, kind: 'block', outline, height: t.height };
						if (t.kind === 'ruin') return { id: `t${i}`, kind: 'ruin', outline, walls: [[outline[0], outline[1], outline[2]]] };
						return { id: `t${i}`, kind: t.kind, outline };
					}),
					objectives: [{ id: 'o1', ...objective }]
				},
				pieces: pieces.map((p) => ({
					id: p.id,
					side: p.side,
					unit: p.unit,
					class: p.class,
					flies: p.flies,
					allowance: p.allowance,
					footprint: p.footprint,
					at: { x: p.x, y: p.y, facing: p.facing },
					ring: p.ring
				})),
				move: {
					unit: 'u1',
					kind,
					die: kind === 'dash' ? die : undefined,
					paths: Object.fromEntries(pieces.filter((p) => p.unit === 'u1' && (p.listed || p === pieces[0])).map((p) => [p.id, p.path]))
				}
			};
			return req;
		});
}

/** What must not change: the verdict and every finding's code and pieces, in order. */
function signature(req: CheckRequest): string {
	const r = checkMove(req);
	return JSON.stringify([r.verdict, r.findings.map((f) => [f.code, f.severity, ...f.pieces])]);
}

function mapTable(req: CheckRequest, f: (x: number, y: number) => [number, number], turnDeg: number, board?: { width: number; depth: number }): CheckRequest {
	const pt = ([x, y]: [number, number]): [number, number] => f(x, y);
	const pose = <T extends { x: number; y: number; facing?: number }>(p: T, always: boolean) => {
		const [x, y] = f(p.x, p.y);
		const facing = p.facing === undefined ? (always ? turnDeg : undefined) : p.facing + turnDeg;
		return { ...p, x, y, facing };
	};
	return {
		...req,
		board: {
			width: board?.width ?? req.board.width,
			depth: board?.depth ?? req.board.depth,
			terrain: req.board.terrain!.map((t) => ({ ...t, outline: t.outline.map(pt), ...(t.kind === 'ruin' ? { walls: t.walls!.map((w) => w.map(pt)) } : {}) }) as TerrainIn),
			objectives: req.board.objectives!.map((o) => {
				const [x, y] = f(o.x, o.y);
				return { ...o, x, y };
			})
		},
		pieces: req.pieces.map((p) => ({ ...p, at: pose(p.at, true) })),
		move: { ...req.move, paths: Object.fromEntries(Object.entries(req.move.paths ?? {}).map(([k, path]) => [k, path.map((w) => pose(w, false))])) }
	};
}

describe('properties of the check', () => {
	it('never throws on schema-valid input, and its report matches the report schema', () => {
		fc.assert(
			fc.property(tableArb(-5, 205), (req) => {
				const parsed = checkRequestSchema.safeParse(req);
				fc.pre(parsed.success);
				const report = checkMove(req);
				expect(checkReportSchema.safeParse(report).success).toBe(true);
				expect(JSON.stringify(checkMove(parsed.data!))).toBe(JSON.stringify(report));
			}),
			{ numRuns: 300, seed: 11 }
		);
	});

	it('gives the same verdict and findings when the whole table is moved', () => {
		fc.assert(
			fc.property(tableArb(60, 120), coord(-40, 40), coord(-40, 40), (req, tx, ty) => {
				const moved = mapTable(req, (x, y) => [x + tx, y + ty], 0);
				expect(signature(moved)).toBe(signature(req));
			}),
			{ numRuns: 200, seed: 12 }
		);
	});

	it('gives the same verdict and findings when the table is turned a quarter (board sides swapped)', () => {
		fc.assert(
			fc.property(tableArb(5, 195), (req) => {
				const board = { width: 150, depth: 200 };
				const r0 = { ...req, board: { ...req.board, ...board } };
				// turning CCW about the origin and sliding back onto the board: (x, y) → (depth − y, x)
				const turned = mapTable(r0, (x, y) => [board.depth - y, x], 90, { width: board.depth, depth: board.width });
				expect(signature(turned)).toBe(signature(r0));
			}),
			{ numRuns: 200, seed: 13 }
		);
	});

	it('gives the same verdict and findings when the table is turned by any angle about its middle', () => {
		fc.assert(
			fc.property(tableArb(80, 120), coord(-180, 180), (req, deg) => {
				const t = (deg * Math.PI) / 180;
				const [c, s] = [Math.cos(t), Math.sin(t)];
				const turned = mapTable(req, (x, y) => [100 + (x - 100) * c - (y - 100) * s, 100 + (x - 100) * s + (y - 100) * c], deg);
				expect(signature(turned)).toBe(signature(req));
			}),
			{ numRuns: 200, seed: 14 }
		);
	});
});

describe('properties of path cost', () => {
	const costOf = (p: PieceIn, path: { x: number; y: number; facing?: number }[], terrain: TerrainIn[]) =>
		checkMove({ board: { width: 200, depth: 200, terrain }, pieces: [{ ...p }], move: { unit: 'u1', kind: 'move', paths: { [p.id]: path } } }).pieces[p.id].cost;
	const blocks = fc.array(
		fc.record({ x: coord(20, 60), y: coord(20, 60), w: coord(0.5, 6), h: coord(0.5, 6), height: coord(0.5, 3) }),
		{ maxLength: 3 }
	).map((list): TerrainIn[] =>
		list.map((b, i): TerrainIn => ({ id: `b${i}`, kind: 'block', outline: [[b.x, b.y], [b.x + b.w, b.y], [b.x + b.w, b.y + b.h], [b.x, b.y + b.h]], height: b.height }))
	);
	const poses = fc.array(fc.record({ x: coord(15, 70), y: coord(15, 70), facing: coord(-180, 180) }), { minLength: 2, maxLength: 6 });

	it('a path costs the same reversed (facings held on the same legs), pivots and climbs included', () => {
		fc.assert(
			fc.property(footprint, poses, blocks, (fp, ps, terrain) => {
				const p: PieceIn = { id: 'a', side: 'red', unit: 'u1', class: 'foot', allowance: 100, footprint: fp, at: { x: ps[0].x, y: ps[0].y, facing: ps[0].facing } };
				const forward = ps.slice(1);
				// backwards: turn first to the facing held on the last leg, then retrace
				const n = ps.length - 1;
				const back: { x: number; y: number; facing: number }[] = [];
				for (let i = n; i >= 1; i--) back.push({ x: ps[i].x, y: ps[i].y, facing: ps[i - 1].facing });
				back.push({ x: ps[0].x, y: ps[0].y, facing: ps[0].facing });
				const rp: PieceIn = { ...p, at: { x: ps[n].x, y: ps[n].y, facing: ps[n].facing } };
				expect(costOf(rp, back, terrain)).toBeCloseTo(costOf(p, forward, terrain), 9);
			}),
			{ numRuns: 300, seed: 21 }
		);
	});

	it('splitting a straight leg in two does not change its cost', () => {
		fc.assert(
			fc.property(footprint, poses, blocks, fc.double({ min: 0.01, max: 0.99, noNaN: true }), (fp, ps, terrain, t) => {
				const p: PieceIn = { id: 'a', side: 'red', unit: 'u1', class: 'foot', allowance: 100, footprint: fp, at: { x: ps[0].x, y: ps[0].y, facing: 0 } };
				const end = { x: ps[1].x, y: ps[1].y };
				const mid = { x: p.at.x + (end.x - p.at.x) * t, y: p.at.y + (end.y - p.at.y) * t };
				expect(costOf(p, [mid, end], terrain)).toBeCloseTo(costOf(p, [end], terrain), 9);
			}),
			{ numRuns: 300, seed: 22 }
		);
	});
});
