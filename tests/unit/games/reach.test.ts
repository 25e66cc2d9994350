// The play screen's reach helpers on the invented test table: the finder's request is the live
// check's table, the nearest legal spot it offers for a drop beyond reach is accepted by checkMove
// once taken (the path kept verbatim), spacing breaks come from the engine's own findings, and the
// overlays say in shape which rings are holes. Distances are hand-worked from fixtures.ts.
import { describe, expect, it } from 'vitest';
import { checkMove } from '$lib/referee';
import { RouteClient } from '$lib/board/route/route-client';
import { checkRequestFor } from '$lib/board/play/rules';
import { offerFor, offerWords, pathWith, pickKey, reachShading, ringArea, routeParts, routeRequestFor, routeWords, spacingBreaks } from '$lib/board/play/reach';
import type { RouteResult } from '$lib/referee/route';
import { LAYOUT, PROFILE } from './fixtures';
import { ready } from './ready-table';

describe('the finder on the play screen', () => {
	it('maps a lone piece in open ground: at most the disc of its allowance, nearly all of it', async () => {
		const s = ready();
		const routes = new RouteClient({ useWorker: false });
		const map = await routes.pickUp(routeRequestFor(LAYOUT, PROFILE, s.pieces, { pieceId: 'a-u2-p1', kind: 'move' }));
		expect(map.status).toBe('ok');
		expect(map.allowanceIn).toBe(5);
		// π·5² = 78.54 sq in, less the bite of the Lantern Guard at x 14 (centre 6 in away, the two
		// footprints touch within 0.63 + 0.79 = 1.42 in of it)
		expect(map.areaIn2).toBeLessThan(Math.PI * 25);
		expect(map.areaIn2).toBeGreaterThan(0.9 * Math.PI * 25);
		const straight = (await routes.findRoute(20, 10))!;
		expect(straight.reachable).toBe(true);
		expect(straight.costIn).toBeCloseTo(4, 6);
		expect(routeWords(straight)).toBe('4.00 in of 5');
		routes.dispose();
	});

	it('offers the nearest legal spot for a drop beyond reach, and the check accepts the route taken', async () => {
		const s = ready();
		const routes = new RouteClient({ useWorker: false });
		await routes.pickUp(routeRequestFor(LAYOUT, PROFILE, s.pieces, { pieceId: 'a-u2-p1', kind: 'move' }));
		// dropped 10 in straight ahead, at (20, 16): the reach ends 5 in out, so about 5 in away
		const beyond = (await routes.findRoute(20, 16))!;
		expect(beyond.reachable).toBe(false);
		const offer = offerFor('a-u2-p1', await routes.nearestLegal(20, 16));
		expect(offer?.kind).toBe('spot');
		if (offer?.kind !== 'spot') throw new Error('no spot');
		expect(offer.distanceIn).toBeGreaterThan(4.99);
		expect(offer.distanceIn).toBeLessThan(5.05);
		expect(offerWords(offer)).toMatch(/^Move to nearest legal spot \(5\.0\d in away\)$/);
		// the path as the screen submits it: the start, then the finder's waypoints kept verbatim
		const trace = [{ x: 20, y: 6 }, ...offer.waypoints];
		const path = pathWith(trace, offer.waypoints.length);
		expect(path).toEqual(offer.waypoints);
		const report = checkMove(checkRequestFor(LAYOUT, PROFILE, s.pieces, { unit: 'a-u2', kind: 'move', paths: { 'a-u2-p1': path } }));
		expect(report.verdict).toBe('legal');
		expect(report.pieces['a-u2-p1'].cost).toBeLessThanOrEqual(5 + PROFILE.tolerance);
		// and a drop inside the reach offers nothing
		expect(offerFor('a-u2-p1', await routes.nearestLegal(20, 9))).toBeNull();
		routes.dispose();
	});

	it('says so when a piece can end nowhere', () => {
		expect(offerFor('a-u1-p1', { at: null, distanceIn: Infinity, route: null })).toEqual({ piece: 'a-u1-p1', kind: 'none' });
		expect(offerWords({ piece: 'a-u1-p1', kind: 'none' })).toBe('No legal end for a-u1-p1 within its allowance');
	});

	it('keys a map by the piece, kind, die, placed unit-mates and the table', () => {
		const s = ready();
		const base = pickKey(s.pieces, { pieceId: 'a-u1-p1', kind: 'dash', die: 3 });
		expect(pickKey(s.pieces, { pieceId: 'a-u1-p1', kind: 'dash', die: 3 })).toBe(base);
		expect(pickKey(s.pieces, { pieceId: 'a-u1-p1', kind: 'dash', die: 4 })).not.toBe(base);
		expect(pickKey(s.pieces, { pieceId: 'a-u1-p1', kind: 'dash', die: 3, placed: { 'a-u1-p2': { x: 12, y: 9 } } })).not.toBe(base);
		const moved = s.pieces.map((p) => (p.id === 'b-u1-p1' ? { ...p, at: { x: 11, y: 54, facing: 270 } } : p));
		expect(pickKey(moved, { pieceId: 'a-u1-p1', kind: 'dash', die: 3 })).not.toBe(base);
	});

	it('asks the finder with the dash die and the unit-mates where their drafts end', () => {
		const s = ready();
		const req = routeRequestFor(LAYOUT, PROFILE, s.pieces, { pieceId: 'a-u1-p1', kind: 'dash', die: 4, placed: { 'a-u1-p2': { x: 12, y: 9 } } });
		expect(req.die).toBe(4);
		expect(req.placed).toEqual({ 'a-u1-p2': { x: 12, y: 9 } });
		expect('move' in req.table).toBe(false);
		expect(req.table.pieces.map((p) => p.id)).toEqual(checkRequestFor(LAYOUT, PROFILE, s.pieces, { unit: 'a-u1', kind: 'move' }).pieces.map((p) => p.id));
		expect(routeRequestFor(LAYOUT, PROFILE, s.pieces, { pieceId: 'a-u1-p1', kind: 'move', die: 4 }).die).toBeUndefined();
	});
});

describe('paths and spacing', () => {
	it('keeps the finder’s route verbatim and simplifies only what was dragged after it', () => {
		// three nearly collinear points: simplification at 0.1 in would drop the middle one
		const route = [{ x: 1, y: 0.05 }, { x: 2, y: 0 }];
		expect(pathWith([{ x: 0, y: 0 }, ...route], 0)).toEqual([{ x: 2, y: 0 }]);
		expect(pathWith([{ x: 0, y: 0 }, ...route], 2)).toEqual(route);
		// dragged on from the route's end, then turned there
		const trace = [{ x: 0, y: 0 }, ...route, { x: 2.5, y: 0.01 }, { x: 3, y: 0 }, { x: 3, y: 0, facing: 45 }];
		// (the turn point stands for the end, as simplifyTrace gives it)
		expect(pathWith(trace, 2)).toEqual([...route, { x: 3, y: 0, facing: 45 }]);
		expect(pathWith([{ x: 0, y: 0 }], 0)).toEqual([]);
	});

	it('names the pieces whose spacing the live check breaks', () => {
		const s = ready();
		// a-u1-p3 from (14, 6) to (14, 10.5): 4.5 in from its mates, beyond the 2 in spacing
		const report = checkMove(checkRequestFor(LAYOUT, PROFILE, s.pieces, { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p3': [{ x: 14, y: 10.5 }] } }));
		const breaks = spacingBreaks(report.findings);
		expect(breaks.map((b) => b.piece)).toEqual(['a-u1-p3']);
		expect(breaks[0].limitIn).toBe(PROFILE.spacing);
		// nearest mate a-u1-p2 at (12, 6): √(2² + 4.5²) − 1.26 = 3.66 in edge to edge (hand-worked)
		expect(breaks[0].measuredIn).toBeCloseTo(Math.hypot(2, 4.5) - 32 / 25.4, 2);
		const legal = checkMove(checkRequestFor(LAYOUT, PROFILE, s.pieces, { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p3': [{ x: 14, y: 7 }] } }));
		expect(spacingBreaks(legal.findings)).toEqual([]);
	});

	it('names every piece of a group cut off, once each, and ignores warnings', () => {
		const f = (pieces: string[], severity: 'error' | 'warning' = 'error') => ({ code: 'spacing' as const, severity, pieces, measured: 3, limit: 2, message: 'm' });
		expect(spacingBreaks([f(['x', 'y']), f(['y']), f(['z'], 'warning')]).map((b) => b.piece)).toEqual(['x', 'y']);
	});
});

describe('drawing', () => {
	it('shades outer rings and marks holes with a dashed signal edge, never filled', () => {
		const outer = [0, 0, 4, 0, 4, 4, 0, 4];
		const hole = [1, 1, 1, 2, 2, 2, 2, 1];
		expect(ringArea(outer)).toBe(16);
		expect(ringArea(hole)).toBe(-1);
		const map = { status: 'ok' as const, allowanceIn: 6, rings: [outer, hole], areaIn2: 15, cellIn: 0.1, start: { x: 2, y: 0.5 } };
		const [o, h] = reachShading(map, { shaded: true });
		expect(o).toMatchObject({ kind: 'path', closed: true, fill: true, dashed: true, tone: 'ok' });
		expect(h).toMatchObject({ kind: 'path', closed: true, fill: false, dashed: true, tone: 'signal' });
		expect(reachShading(map, { shaded: false, tone: 'felt' })[0]).toMatchObject({ fill: false, tone: 'felt' });
	});

	it('words a route that is too far and one that has no way there', () => {
		const r = (over: Partial<RouteResult>): RouteResult => ({ reachable: false, status: 'ok', waypoints: [], costIn: 6.5, horizontalIn: 6.5, climbIn: 0, allowanceIn: 6, endLegal: true, ...over });
		expect(routeWords(r({}))).toBe('6.50 in of 6 — too far');
		expect(routeWords(r({ costIn: Infinity, reason: 'no route for x within the allowance of 6.00 in ends there' }))).toMatch(/^no route for x/);
		expect(routeWords(r({ reachable: true, costIn: 5.844, allowanceIn: 6.5 }))).toBe('5.84 in of 6.50');
		// the screen sets the figure apart from the words that follow it
		expect(routeParts(r({}))).toEqual({ cost: '6.50', rest: ' in of 6 — too far' });
		expect(routeParts(r({ costIn: Infinity, endLegal: false }))).toEqual({ cost: null, rest: 'no legal route ends here' });
	});
});
