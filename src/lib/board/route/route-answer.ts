// The worker's side of the protocol as a pure function over a planner slot, so the worker and the
// in-thread fallback (no Worker: tests, old browsers) answer in exactly the same way.
import { RoutePlanner } from '$lib/referee/route';
import type { RouteAnswer, RouteAsk } from './route-protocol';

export interface PlannerSlot {
	planner: RoutePlanner | null;
}

export function answer(slot: PlannerSlot, ask: RouteAsk): RouteAnswer {
	try {
		if (ask.type === 'prepare') {
			slot.planner = new RoutePlanner(ask.request);
			const p = slot.planner;
			return { id: ask.id, type: 'prepared', status: p.status, reason: p.space.reason, allowanceIn: p.space.allowanceIn };
		}
		const p = slot.planner;
		if (!p) return { id: ask.id, type: 'error', message: 'no piece is picked up' };
		if (ask.type === 'reach') return { id: ask.id, type: 'reach', map: p.reachMap(ask.cellIn === undefined ? {} : { cellIn: ask.cellIn }) };
		if (ask.type === 'route') return { id: ask.id, type: 'route', route: p.findRoute(ask.x, ask.y) };
		return { id: ask.id, type: 'nearest', nearest: p.nearestLegal(ask.x, ask.y) };
	} catch (e) {
		return { id: ask.id, type: 'error', message: e instanceof Error ? e.message : String(e) };
	}
}
