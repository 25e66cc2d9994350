// Hand-worked cases of the route finder: a straight line, the detour round one disc and round a
// wall's end (tangent-line geometry, a textbook result), a corridor narrower than the base, over
// or round a block, fliers, locked and holding pieces, and the nearest legal end.
import { describe, expect, it } from 'vitest';
import { checkMove } from '../../../src/lib/referee';
import { ARC_EXCESS, MARGIN_IN, RoutePlanner, type RouteTable } from '../../../src/lib/referee/route';
import type { PieceIn, TerrainIn } from '../../../src/lib/schemas/check';

const EPS = 0.005;
const KEEP_OUT = 1; // common practice, no published source

function mover(x: number, y: number, extra: Partial<PieceIn> = {}): PieceIn {
	return { id: 'm', side: 'a', unit: 'u', class: 'foot', allowance: 20, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x, y }, ...extra };
}

function table(pieces: PieceIn[], terrain: TerrainIn[] = [], width = 40, depth = 40): RouteTable {
	return { board: { width, depth, terrain }, pieces };
}

/** The check's verdict on the route as the move of a one-piece unit. */
function checked(t: RouteTable, kind: 'move' | 'dash' | 'withdraw', waypoints: { x: number; y: number }[], die?: number) {
	const report = checkMove({ ...t, move: { unit: 'u', kind, die, paths: { m: waypoints } } });
	return { report, errors: report.findings.filter((f) => f.severity === 'error').map((f) => f.code) };
}

describe('route finder: analytic cases', () => {
	it('goes straight across open ground, at exactly the distance', () => {
		const t = table([mover(5, 5)]);
		const plan = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		const r = plan.findRoute(9, 8);
		expect(r.reachable).toBe(true);
		expect(r.waypoints).toEqual([{ x: 9, y: 8 }]);
		expect(r.costIn).toBeCloseTo(5, 12);
		expect(checked(t, 'move', r.waypoints).errors).toEqual([]);
	});

	it('detours round one disc: 2√(d²−r²) + r(π − 2·acos(r/d)) = 11.861006653 in for d = 5, r = 3', () => {
		// A point-like mover (0.254 mm base) and an enemy whose keep-out zone, grown by the mover's
		// radius and the finder's margin, is a circle of radius 3 about the origin (moved to (20, 20)).
		const rho = 0.254 / 25.4 / 2;
		const re = 3 - rho - KEEP_OUT - EPS - MARGIN_IN;
		const enemy: PieceIn = { id: 'e', side: 'b', unit: 'v', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: re * 2 * 25.4 }, at: { x: 20, y: 20 } };
		const t = table([mover(15, 20, { footprint: { shape: 'round', diameterMm: 0.254 } }), enemy]);
		const plan = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		const d = 5;
		const r = 3;
		const exact = 2 * Math.sqrt(d * d - r * r) + r * (Math.PI - 2 * Math.acos(r / d));
		expect(exact).toBeCloseTo(11.861006653, 9);
		expect(plan.costTo(25, 20)).toBeCloseTo(exact, 9);
		const route = plan.findRoute(25, 20);
		expect(route.reachable).toBe(true);
		// the arc becomes a circumscribed polyline: longer than the arc by at most ARC_EXCESS of it
		expect(route.costIn).toBeGreaterThanOrEqual(exact - 1e-9);
		expect(route.costIn).toBeLessThanOrEqual(exact + r * (Math.PI - 2 * Math.acos(r / d)) * ARC_EXCESS + 1e-9);
		const { report, errors } = checked(t, 'move', route.waypoints);
		expect(errors).toEqual([]);
		expect(report.pieces.m.cost).toBeCloseTo(route.costIn, 9);
	});

	it('goes round the end of a wall for a class that may not pass walls; a wall passer goes straight', () => {
		// wall from (10, 4) to (10, 15); the detour turns about the nearer end (10, 15) at radius R
		const ruin: TerrainIn = { id: 'ruin', kind: 'ruin', outline: [[9.5, 3], [10.5, 3], [10.5, 16], [9.5, 16]], walls: [[[10, 4], [10, 15]]] };
		const rho = 0.5;
		const R = rho - EPS + MARGIN_IN;
		const s = { x: 8, y: 10 };
		const p = { x: 12, y: 10 };
		const d = Math.hypot(2, 5);
		const theta = 2 * Math.atan(2 / 5); // angle between the directions from the wall's end to s and p
		const exact = 2 * Math.sqrt(d * d - R * R) + R * (2 * Math.PI - theta - 2 * Math.acos(R / d));
		const tMounted = table([mover(s.x, s.y, { class: 'mounted' })], [ruin]);
		const plan = new RoutePlanner({ table: tMounted, pieceId: 'm', kind: 'move' });
		expect(plan.costTo(p.x, p.y)).toBeCloseTo(exact, 9);
		const route = plan.findRoute(p.x, p.y);
		expect(route.reachable).toBe(true);
		expect(route.waypoints.every((w) => w.y >= 10 - 1e-9)).toBe(true);
		expect(Math.max(...route.waypoints.map((w) => w.y))).toBeGreaterThan(15);
		expect(checked(tMounted, 'move', route.waypoints).errors).toEqual([]);
		// the straight line is what the check refuses for this class
		expect(checked(tMounted, 'move', [p]).errors).toContain('wall-blocked');

		const tFoot = table([mover(s.x, s.y, { class: 'foot' })], [ruin]);
		const foot = new RoutePlanner({ table: tFoot, pieceId: 'm', kind: 'move' }).findRoute(p.x, p.y);
		expect(foot.costIn).toBeCloseTo(4, 12);
	});

	it('finds no route through a corridor narrower than the base, and one when the base fits', () => {
		// a full-width barrier of impassable ground with a 1.00 in gap at x 5.5–6.5
		const barrier: TerrainIn[] = [
			{ id: 'west', kind: 'impassable', outline: [[0, 9], [5.5, 9], [5.5, 10], [0, 10]] },
			{ id: 'east', kind: 'impassable', outline: [[6.5, 9], [12, 9], [12, 10], [6.5, 10]] }
		];
		const wide = table([mover(6, 6, { footprint: { shape: 'round', diameterMm: 32 } })], barrier, 12, 20);
		const r = new RoutePlanner({ table: wide, pieceId: 'm', kind: 'move' }).findRoute(6, 13);
		expect(r.reachable).toBe(false);
		expect(r.costIn).toBe(Infinity);
		// the check agrees that the straight line is blocked
		expect(checked(wide, 'move', [{ x: 6, y: 13 }]).errors).toContain('impassable');

		const narrow = table([mover(6, 6, { footprint: { shape: 'round', diameterMm: 25 } })], barrier, 12, 20);
		const ok = new RoutePlanner({ table: narrow, pieceId: 'm', kind: 'move' }).findRoute(6, 13);
		expect(ok.reachable).toBe(true);
		expect(ok.costIn).toBeCloseTo(7, 9);
		expect(checked(narrow, 'move', ok.waypoints).errors).toEqual([]);
	});

	it('a climber goes over a low block (paying up and down) and round a high one', () => {
		// a block 1 in across and 8 in long lying across the straight line from (5, 10) to (12, 10)
		const block = (h: number): TerrainIn => ({ id: 'b', kind: 'block', height: h, outline: [[8, 6], [9, 6], [9, 14], [8, 14]] });
		const low = table([mover(5, 10)], [block(0.5)]);
		const over = new RoutePlanner({ table: low, pieceId: 'm', kind: 'move' }).findRoute(12, 10);
		expect(over.reachable).toBe(true);
		expect(over.horizontalIn).toBeCloseTo(7, 9);
		expect(over.climbIn).toBeCloseTo(1, 9);
		const c1 = checked(low, 'move', over.waypoints);
		expect(c1.errors).toEqual([]);
		expect(c1.report.pieces.m.cost).toBeCloseTo(8, 9);

		const high = table([mover(5, 10)], [block(3)]);
		const round = new RoutePlanner({ table: high, pieceId: 'm', kind: 'move' }).findRoute(12, 10);
		expect(round.reachable).toBe(true);
		expect(round.climbIn).toBe(0);
		expect(round.costIn).toBeLessThan(7 + 6);
		expect(round.costIn).toBeGreaterThan(7 + 2 * 4 * 0.5); // it had to leave the line
		expect(checked(high, 'move', round.waypoints).errors).toEqual([]);

		// a class that may not climb goes round even the low block
		const noClimb = table([mover(5, 10, { class: 'mounted' })], [block(0.5)]);
		const mounted = new RoutePlanner({ table: noClimb, pieceId: 'm', kind: 'move' }).findRoute(12, 10);
		expect(mounted.climbIn).toBe(0);
		expect(mounted.costIn).toBeGreaterThan(8);
		expect(checked(noClimb, 'move', mounted.waypoints).errors).toEqual([]);
	});

	it('a flier passes straight over an enemy but may not end in its keep-out zone', () => {
		const enemy: PieceIn = { id: 'e', side: 'b', unit: 'v', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 10, y: 10 } };
		const t = table([mover(5, 10, { flies: true }), enemy]);
		const plan = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		const r = plan.findRoute(15, 10);
		expect(r.reachable).toBe(true);
		expect(r.waypoints).toEqual([{ x: 15, y: 10 }]);
		expect(checked(t, 'move', r.waypoints).errors).toEqual([]);
		// edge to edge 0.9 in from the enemy: inside the 1 in zone
		const near = plan.findRoute(11.9, 10);
		expect(near.reachable).toBe(false);
		expect(near.endLegal).toBe(false);
		expect(checked(t, 'move', [{ x: 11.9, y: 10 }]).errors).toContain('ends-in-keep-out');
	});

	it('a piece within keep-out of an enemy is locked for a move but may withdraw through the zone', () => {
		const enemy: PieceIn = { id: 'e', side: 'b', unit: 'v', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 11.5, y: 10 } };
		const t = table([mover(10, 10, { allowance: 6 }), enemy]);
		const locked = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		expect(locked.status).toBe('locked');
		expect(locked.reachMap().rings).toEqual([]);
		const w = new RoutePlanner({ table: t, pieceId: 'm', kind: 'withdraw' });
		const r = w.findRoute(5, 10);
		expect(r.reachable).toBe(true);
		expect(checked(t, 'withdraw', r.waypoints).errors).toEqual([]);
		expect(new RoutePlanner({ table: t, pieceId: 'm', kind: 'hold' }).findRoute(10, 11).reachable).toBe(false);
	});

	it('offers the nearest legal end for an end inside an enemy keep-out zone', () => {
		const enemy: PieceIn = { id: 'e', side: 'b', unit: 'v', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 14, y: 10 } };
		const t = table([mover(8, 10, { allowance: 6 }), enemy]);
		const plan = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		// proposed: 0.5 in edge to edge from the enemy, straight on the line between them
		const n = plan.nearestLegal(12.5, 10);
		expect(n.at).not.toBeNull();
		// the nearest legal centre is 1 + 1 + ε (+ margin) from the enemy's centre, along the line
		const expected = 14 - (1 + KEEP_OUT + EPS + MARGIN_IN);
		expect(n.at!.x).toBeCloseTo(expected, 2);
		expect(Math.abs(n.at!.y - 10)).toBeLessThan(0.02);
		expect(n.distanceIn).toBeLessThan(12.5 - expected + 0.02);
		expect(n.route!.reachable).toBe(true);
		expect(checked(t, 'move', n.route!.waypoints).errors).toEqual([]);
	});

	it('keeps a non-round footprint at its facing and the check accepts its route', () => {
		const enemy: PieceIn = { id: 'e', side: 'b', unit: 'v', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 40 }, at: { x: 12, y: 10 } };
		const t = table([mover(6, 10, { class: 'mounted', footprint: { shape: 'oval', lengthMm: 75, widthMm: 42 }, at: { x: 6, y: 10, facing: 30 } }), enemy]);
		const plan = new RoutePlanner({ table: t, pieceId: 'm', kind: 'move' });
		const r = plan.findRoute(18, 10);
		expect(r.reachable).toBe(true);
		expect(r.costIn).toBeGreaterThan(12);
		expect(checked(t, 'move', r.waypoints).errors).toEqual([]);
	});
});
