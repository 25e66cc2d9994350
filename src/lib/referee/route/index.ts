// The route finder and reach map for one piece (docs/route-finder.md): shortest legal route to a
// point, the region of legal ends within the allowance, and the nearest legal end. Pure TypeScript.
export {
	RoutePlanner,
	findRoute,
	reachMap,
	nearestLegal,
	routeCost,
	type RouteResult,
	type ReachMap,
	type NearestResult,
	type ReachOptions,
	type RoutePoint
} from './planner';
export {
	buildConfigSpace,
	endClearance,
	MARGIN_IN,
	OVAL_SIDES,
	ARC_STEP_RAD,
	ARC_EXCESS,
	type RouteRequest,
	type RouteTable,
	type ConfigSpace,
	type Status
} from './config-space';
export { TangentGraph } from './tangent-graph';
