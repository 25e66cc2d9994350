// Messages between the play screen's route client and the route worker: one planner per picked-up
// piece and move kind, then questions about it. Plain data only (structured clone).
import type { NearestResult, ReachMap, RouteRequest, RouteResult } from '$lib/referee/route';

export type RouteAsk =
	| { id: number; type: 'prepare'; request: RouteRequest }
	| { id: number; type: 'reach'; cellIn?: number }
	| { id: number; type: 'route'; x: number; y: number }
	| { id: number; type: 'nearest'; x: number; y: number };

export type RouteAnswer =
	| { id: number; type: 'prepared'; status: ReachMap['status']; reason?: string; allowanceIn: number }
	| { id: number; type: 'reach'; map: ReachMap }
	| { id: number; type: 'route'; route: RouteResult }
	| { id: number; type: 'nearest'; nearest: NearestResult }
	| { id: number; type: 'error'; message: string };
