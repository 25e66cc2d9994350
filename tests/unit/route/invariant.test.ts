// The finder never disagrees with the check: on random tables, whenever it says a point is
// reachable, the route it returns is a legal move for checkMove (fast-check property). Where it is
// conservative it may refuse what the check would allow, but never the opposite.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMove } from '../../../src/lib/referee';
import { RoutePlanner } from '../../../src/lib/referee/route';
import type { FootprintIn, MoveKind, PieceIn } from '../../../src/lib/schemas/check';
import { randomTable } from './tables';

const FOOTPRINTS: FootprintIn[] = [
	{ shape: 'round', diameterMm: 25 },
	{ shape: 'round', diameterMm: 32 },
	{ shape: 'round', diameterMm: 50 },
	{ shape: 'oval', lengthMm: 60, widthMm: 35 },
	{ shape: 'hull', points: [[-1.2, -0.7], [1.2, -0.7], [1.4, 0], [1.2, 0.7], [-1.2, 0.7]] }
];
const CLASSES: PieceIn['class'][] = ['foot', 'beast', 'swarm', 'mounted', 'vehicle', 'monster'];

describe('route finder: every route it returns passes checkMove', () => {
	it('holds on random tables, classes, footprints, fliers and move kinds', () => {
		let reachable = 0;
		let runs = 0;
		let detours = 0;
		fc.assert(
			fc.property(
				fc.integer({ min: 1, max: 1_000_000 }),
				fc.constantFrom(...CLASSES),
				fc.constantFrom(...FOOTPRINTS),
				fc.boolean(),
				fc.constantFrom<MoveKind>('move', 'dash', 'withdraw'),
				fc.integer({ min: 1, max: 6 }),
				fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
				fc.double({ min: 0.05, max: 1.1, noNaN: true }),
				fc.integer({ min: 0, max: 359 }),
				fc.nat(),
				fc.double({ min: 0.1, max: 2.5, noNaN: true }),
				(seed, cls, footprint, flies, kind, die, heading, reach, facing, behindPick, beyond) => {
					const table = randomTable({ seed, moverClass: cls, flies: flies && seed % 3 === 0, allowance: 8, pieces: 14 });
					const m = table.pieces[0];
					m.footprint = footprint;
					m.at = { ...m.at, facing };
					const plan = new RoutePlanner({ table, pieceId: 'm', kind, die });
					const allowance = kind === 'dash' ? 8 + die : 8;
					let x = m.at.x + Math.cos(heading) * reach * allowance;
					let y = m.at.y + Math.sin(heading) * reach * allowance;
					// half the ends lie just behind something (a piece, or a terrain piece's centre) as
					// seen from the start, so that routes have to go round it or over it
					const rho = footprint.shape === 'round' ? footprint.diameterMm / 50.8 : 1.2;
					const targets = [
						...table.pieces.slice(1).map((p) => ({
							x: p.at.x,
							y: p.at.y,
							// just clear of its footprint, and of its keep-out zone for an enemy
							r: (p.footprint.shape === 'round' ? p.footprint.diameterMm / 50.8 : 1) + rho + (p.side === 'a' ? 0.05 : 1.05)
						})),
						...(table.board.terrain ?? []).map((t) => {
							const cx = t.outline.reduce((a, q) => a + q[0], 0) / t.outline.length;
							const cy = t.outline.reduce((a, q) => a + q[1], 0) / t.outline.length;
							return { x: cx, y: cy, r: Math.max(...t.outline.map((q) => Math.hypot(q[0] - cx, q[1] - cy))) + rho };
						})
					].filter((t) => Math.hypot(t.x - m.at.x, t.y - m.at.y) + t.r < allowance * 0.9);
					if (behindPick % 3 !== 0 && targets.length) {
						const t = targets[behindPick % targets.length];
						const d = Math.hypot(t.x - m.at.x, t.y - m.at.y) || 1;
						const side = ((behindPick % 7) - 3) * 0.25;
						x = t.x + ((t.x - m.at.x) / d) * (t.r + beyond * 0.4) - ((t.y - m.at.y) / d) * side;
						y = t.y + ((t.y - m.at.y) / d) * (t.r + beyond * 0.4) + ((t.x - m.at.x) / d) * side;
					}
					const route = plan.findRoute(x, y);
					runs++;
					if (!route.reachable) return;
					reachable++;
					if (route.waypoints.length > 1) detours++;
					expect(plan.inReach(x, y)).toBe(true);
					const report = checkMove({ ...table, move: { unit: 'u', kind, die: kind === 'dash' ? die : undefined, paths: { m: route.waypoints } } });
					const errors = report.findings.filter((f) => f.severity === 'error');
					expect(errors.map((f) => `${f.code}: ${f.message}`)).toEqual([]);
					expect(report.pieces.m.cost).toBeLessThanOrEqual(allowance + 0.005);
					// the finder reports the check's own cost of its route
					expect(Math.abs(report.pieces.m.cost - route.costIn)).toBeLessThan(1e-6);
				}
			),
			{ numRuns: 600, seed: 20261206 }
		);
		// the property must not hold vacuously: most random ends within reach are reached
		expect(runs).toBe(600);
		expect(reachable).toBeGreaterThan(100);
		expect(detours).toBeGreaterThan(25);
	});
});
