// The engine against a second opinion: a reference implementation built on JSTS DistanceOp, a
// general-purpose planar library from npm, written from the spec alone (tests/bench/reference-check.ts).
import { describe, expect, it } from 'vitest';
import { checkMove, type CheckRequest } from '../../../src/lib/referee/index';
import { referenceCheck, type Finding, type PieceIn, type RefReport, type RefRequest } from '../../bench/reference-check';
import { makeTable, randomMove, SMALL_ARMIES } from '../../bench/scene';

const engine = (req: RefRequest) => checkMove(req as CheckRequest) as unknown as RefReport;

/** Finding codes with every piece named under each: what the two checks must agree on. */
function signature(findings: Finding[]): Record<string, string[]> {
	const out: Record<string, Set<string>> = {};
	for (const f of findings) for (const p of f.pieces) (out[`${f.code}/${f.severity}`] ??= new Set()).add(p);
	return Object.fromEntries(Object.entries(out).map(([k, v]) => [k, [...v].sort()]));
}

/** Verdict and signature as one comparable line, codes in a fixed order. */
const summary = (r: RefReport) => JSON.stringify(Object.entries({ verdict: r.verdict, ...signature(r.findings) }).sort());

const MM = 25.4;
const r25 = 12.5 / MM; // radius of a 25 mm round base, in inches
const foot = (id: string, side: string, unit: string, x: number, y: number): PieceIn => ({
	id,
	side,
	unit,
	class: 'foot',
	allowance: 6,
	footprint: { shape: 'round', diameterMm: 25 },
	at: { x, y, facing: 0 }
});
const table = (pieces: PieceIn[], move: RefRequest['move'], terrain: NonNullable<RefRequest['board']['terrain']> = []): RefRequest => ({
	board: { width: 44, depth: 60, terrain },
	pieces,
	move
});

describe('the JSTS reference on hand-worked cases', () => {
	it('prices going up, across and down a block: 1 + 2 + 2 + 2 in plus the base (common practice, no published source)', () => {
		// The base's edge starts 1 in short of a 2 in wide, 2 in high block and ends 0.01 in past it.
		const block = { id: 'b', kind: 'block' as const, outline: [[10, 0], [12, 0], [12, 10], [10, 10]] as [number, number][], height: 2 };
		const rep = referenceCheck(
			table([foot('a', 'red', 'u', 9 - r25, 5)], { unit: 'u', kind: 'move', paths: { a: [{ x: 12 + r25 + 0.01, y: 5 }] } }, [block])
		);
		expect(rep.pieces.a.cost).toBeCloseTo(1 + 2 + 2 + 2 + 2 * r25 + 0.01, 6);
		expect(rep.findings.map((f) => f.code)).toEqual(['over-allowance']);
	});

	it('ends in the 1 in keep-out at 1.004 in but not at 1.006 in (tolerance 0.005; common practice, no published source)', () => {
		for (const [gap, inside] of [[1.004, true], [1.006, false]] as const) {
			const rep = referenceCheck(
				table([foot('a', 'red', 'u', 10, 5), foot('e', 'blue', 'v', 20, 5)], {
					unit: 'u',
					kind: 'move',
					paths: { a: [{ x: 20 - 2 * r25 - gap, y: 5 }] }
				})
			);
			expect(rep.findings.some((f) => f.code === 'ends-in-keep-out')).toBe(inside);
		}
	});

	it('charges an oval its farthest point’s arc for a quarter turn', () => {
		const oval: PieceIn = { ...foot('a', 'red', 'u', 5, 5), footprint: { shape: 'oval', lengthMm: 60, widthMm: 35 } };
		const rep = referenceCheck(table([oval], { unit: 'u', kind: 'move', paths: { a: [{ x: 5, y: 5, facing: 90 }] } }));
		expect(rep.pieces.a.cost).toBeCloseTo((30 / MM) * (Math.PI / 2), 6);
	});

	it('needs each piece of a small unit within 2 in of a mate (common practice, no published source)', () => {
		const rep = referenceCheck(
			table([foot('a', 'red', 'u', 5, 5), foot('b', 'red', 'u', 5 + 2 * r25 + 1.9, 5), foot('c', 'red', 'u', 5, 5 + 2 * r25 + 2.1)], {
				unit: 'u',
				kind: 'move',
				paths: { a: [{ x: 5, y: 5.001 }] }
			})
		);
		const spacing = rep.findings.filter((f) => f.code === 'spacing');
		expect(spacing.map((f) => f.pieces)).toEqual([['c']]);
		expect(spacing[0].measured).toBeCloseTo(2.099, 2);
	});
});

describe('engine and JSTS reference agree on random moves', () => {
	const scene = makeTable({ seed: 7, armies: SMALL_ARMIES, terrainCount: 10 });
	const units = [...new Set(scene.pieces.map((p) => p.unit))];
	const moves = Array.from({ length: 100 }, (_, i) => randomMove(scene, units[i % units.length], 20_000 + i));

	it('gives the same verdict, finding codes and pieces per code on 100 seeded moves of a 78-piece table', () => {
		const mismatches: string[] = [];
		const verdicts = new Set<string>();
		for (const req of moves) {
			const ref = referenceCheck(req);
			const eng = engine(req);
			verdicts.add(ref.verdict);
			const a = summary(ref);
			const b = summary(eng);
			if (a !== b) mismatches.push(`${req.move.unit} ${req.move.kind}\n  reference ${a}\n  engine    ${b}\n  move ${JSON.stringify(req.move)}`);
		}
		// Both verdicts occur, so agreement is not agreement on "everything illegal".
		expect([...verdicts].sort()).toEqual(['illegal', 'legal']);
		expect(mismatches).toEqual([]);
	}, 300_000);

	it('gives every piece the same path cost to 0.01 in', () => {
		for (const req of moves.slice(0, 40)) {
			const ref = referenceCheck(req);
			const eng = engine(req);
			for (const id of Object.keys(ref.pieces)) expect(eng.pieces[id].cost).toBeCloseTo(ref.pieces[id].cost, 2);
		}
	}, 300_000);
});
