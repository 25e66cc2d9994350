// The reach map against a fine grid search (0.01 in cells, 16 neighbours, built on the engine's
// own predicates: see grid-reference.ts). The grid's lattice paths over-estimate lengths by up to
// 2.7 %; its allowance is scaled by √(π / area of the 16-gon ball) so that in open ground its
// region has the true area. On random points the map, the route finder and checkMove agree.
import { describe, expect, it } from 'vitest';
import { checkMove } from '../../../src/lib/referee';
import { RoutePlanner } from '../../../src/lib/referee/route';
import { gridAreaCorrection, gridReach } from './grid-reference';
import { randomTable, rng } from './tables';

const EPS = 0.005;

function inRings(rings: number[][], x: number, y: number): boolean {
	let inside = false;
	for (const ring of rings) {
		const n = ring.length / 2;
		for (let i = 0, k = n - 1; i < n; k = i++) {
			const xi = ring[2 * i];
			const yi = ring[2 * i + 1];
			const xk = ring[2 * k];
			const yk = ring[2 * k + 1];
			if (yi > y !== yk > y && x < ((xk - xi) * (y - yi)) / (yk - yi) + xi) inside = !inside;
		}
	}
	return inside;
}

function ringDistance(rings: number[][], x: number, y: number): number {
	let d = Infinity;
	for (const ring of rings) {
		const n = ring.length / 2;
		for (let i = 0, k = n - 1; i < n; k = i++) {
			const ax = ring[2 * k];
			const ay = ring[2 * k + 1];
			const dx = ring[2 * i] - ax;
			const dy = ring[2 * i + 1] - ay;
			const l2 = dx * dx + dy * dy || 1;
			const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / l2));
			d = Math.min(d, Math.hypot(x - ax - t * dx, y - ay - t * dy));
		}
	}
	return d;
}

const CASES = [
	{ seed: 11, moverClass: 'foot' as const },
	{ seed: 12, moverClass: 'mounted' as const },
	{ seed: 13, moverClass: 'vehicle' as const }
];

describe('reach map against a fine grid search', () => {
	const k = gridAreaCorrection();

	it('uses the 16-neighbour correction √(π / 3.0537) ≈ 1.0143', () => {
		expect(k).toBeCloseTo(Math.sqrt(Math.PI / (4 * (Math.sin(Math.atan(0.5)) + Math.sin(Math.PI / 4 - Math.atan(0.5))))), 12);
		expect(k).toBeCloseTo(1.01428, 5);
	});

	for (const c of CASES) {
		it(`agrees on table ${c.seed} (${c.moverClass}): area within 0.5 %, points agree with the finder and checkMove`, () => {
			const allowance = 5;
			const table = randomTable({ seed: c.seed, moverClass: c.moverClass, allowance, pieces: 12 });
			const plan = new RoutePlanner({ table, pieceId: 'm', kind: 'move' });
			const map = plan.reachMap();
			const limit = allowance + EPS;
			const grid = gridReach(table, 'm', 'move', undefined, limit * k * 1.03, 0.01);
			const gridArea = grid.areaIn2(limit * k);
			expect(Math.abs(map.areaIn2 - gridArea) / gridArea).toBeLessThan(0.005);
			// and bracketed by the uncorrected grid (paths never shorter than true ones) and the
			// grid allowed its full 2.75 % over-estimate
			expect(map.areaIn2).toBeGreaterThan(grid.areaIn2(limit) * 0.998);
			expect(map.areaIn2).toBeLessThan(grid.areaIn2(limit * 1.0275) * 1.002);

			const r = rng(c.seed * 7919);
			let agreeReach = 0;
			let checked = 0;
			for (let n = 0; n < 300; n++) {
				const a = r() * 2 * Math.PI;
				const rad = Math.sqrt(r()) * allowance * 1.05;
				const x = table.pieces[0].at.x + rad * Math.cos(a);
				const y = table.pieces[0].at.y + rad * Math.sin(a);
				const inReach = plan.inReach(x, y);
				const gridCost = grid.costAt(x, y);
				// the finder is never longer than a legal lattice path (beyond the lattice's rounding
				// of the point to its cell centre and the finder's 0.002 in safety margin)
				const cost = plan.costTo(x, y);
				if (gridCost < Infinity && plan.endClearanceAt(x, y) > 0.01) expect(cost).toBeLessThanOrEqual(gridCost + 0.02);
				// clearly inside the grid's region → inside the map, and the other way round
				if (gridCost <= limit - 0.05 && grid.endOkAt(x, y) && plan.endClearanceAt(x, y) > 0.01) expect(inReach).toBe(true);
				if (inReach) expect(grid.endOkAt(x, y) || plan.endClearanceAt(x, y) < 0.01).toBe(true);
				// the drawn rings and the exact point test agree away from the traced edge
				if (ringDistance(map.rings, x, y) > 2 * map.cellIn) expect(inRings(map.rings, x, y)).toBe(inReach);
				const route = plan.findRoute(x, y);
				expect(route.reachable).toBe(inReach);
				if (route.reachable) {
					const report = checkMove({ ...table, move: { unit: 'u', kind: 'move', paths: { m: route.waypoints } } });
					expect(report.findings.filter((f) => f.severity === 'error')).toEqual([]);
					checked++;
				}
				if (inReach === (gridCost <= limit && grid.endOkAt(x, y))) agreeReach++;
			}
			expect(checked).toBeGreaterThan(100);
			// disagreements only in the thin band along the edge
			expect(agreeReach / 300).toBeGreaterThan(0.95);
		}, 120_000);
	}
});
