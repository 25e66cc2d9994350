// npm run bench:route — the route finder on the full table (300 pieces, 20 terrain pieces):
// reach map and route for one piece, against the fine grid reference (0.01 in cells, 16
// neighbours) in the same run. Prints medians and the ratio; targets: reach map ≤ 20 ms median
// and ≥ 50× faster than the grid. Figures, not pass/fail: a loaded machine runs slower.
import { RoutePlanner } from '../../src/lib/referee/route';
import { gridReach } from '../unit/route/grid-reference';
import { makeTable, rng } from './scene';

const median = (xs: number[]) => {
	const s = [...xs].sort((a, b) => a - b);
	return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const ms = (v: number) => `${v.toFixed(2)} ms`;

const table = makeTable({ seed: 7 });
console.log(`table: ${table.board.width} × ${table.board.depth} in, ${table.pieces.length} pieces, ${table.board.terrain?.length ?? 0} terrain pieces`);

// one piece of the timed 20-piece unit, plus pieces of other shapes and classes for breadth
// the grid is slow (seconds a run): it runs three times for the main case, once for the dash
const cases: { id: string; kind: 'move' | 'dash' | 'withdraw'; die?: number; label: string; grid?: number }[] = [
	{ id: 'b-20.1', kind: 'move', label: 'foot, 32 mm, move 6', grid: 3 },
	{ id: 'b-20.1', kind: 'dash', die: 3, label: 'foot, 32 mm, dash 6+3', grid: 1 },
	{ id: 'r-60.5', kind: 'move', label: 'foot, 25 mm, move 6 (crowded unit)' },
	{ id: 'r-3.1', kind: 'move', label: 'vehicle, hull, move 10' },
	{ id: 'b-10c.2', kind: 'move', label: 'beast, oval 60×35, move 8' }
];

const RUNS = 25;
const summary: string[] = [];
for (const c of cases) {
	const piece = table.pieces.find((p) => p.id === c.id)!;
	const req = { table, pieceId: c.id, kind: c.kind, die: c.die };
	// warm up the JIT once, then time fresh planners (a pick-up builds one)
	new RoutePlanner(req).reachMap();
	const reachTimes: number[] = [];
	let plan!: RoutePlanner;
	for (let i = 0; i < RUNS; i++) {
		const t0 = performance.now();
		plan = new RoutePlanner(req);
		plan.reachMap();
		reachTimes.push(performance.now() - t0);
	}
	const map = plan.reachMap();
	// routes to random points within the allowance, on the prepared planner (drag frames)
	const r = rng(99);
	const routeTimes: number[] = [];
	let reached = 0;
	for (let i = 0; i < 200; i++) {
		const a = r() * 2 * Math.PI;
		const d = Math.sqrt(r()) * plan.space.allowanceIn;
		const t0 = performance.now();
		const route = plan.findRoute(piece.at.x + d * Math.cos(a), piece.at.y + d * Math.sin(a));
		routeTimes.push(performance.now() - t0);
		if (route.reachable) reached++;
	}
	const stats = plan.graph.stats;
	console.log(`\n${c.label} (${c.id}, ${c.kind})`);
	console.log(`  reach map: median ${ms(median(reachTimes))} (min ${ms(Math.min(...reachTimes))}), ${map.rings.length} rings, ${map.areaIn2.toFixed(2)} in², cell ${map.cellIn.toFixed(3)} in`);
	console.log(`  graph: ${stats.circles} circles, ${stats.nodes} nodes, ${stats.settled} settled`);
	console.log(`  route to a point: median ${ms(median(routeTimes))} on the prepared planner; ${reached}/200 points reachable`);
	const gridRuns = c.grid ?? 0;
	if (gridRuns > 0) {
		const gridTimes: number[] = [];
		for (let i = 0; i < gridRuns; i++) {
			const t0 = performance.now();
			gridReach(table, c.id, c.kind, c.die, plan.limitIn * 1.0143, 0.01).areaIn2(plan.limitIn * 1.0143);
			gridTimes.push(performance.now() - t0);
		}
		const ratio = median(gridTimes) / median(reachTimes);
		console.log(`  grid reference (0.01 in, 16 neighbours): median of ${gridRuns} ${ms(median(gridTimes))} → reach map is ${ratio.toFixed(0)}× faster`);
		summary.push(`${c.label}: reach map ${ms(median(reachTimes))}, grid ${ms(median(gridTimes))}, ratio ${ratio.toFixed(0)}×`);
	} else summary.push(`${c.label}: reach map ${ms(median(reachTimes))}${piece.footprint.shape === 'round' ? '' : ' (the grid reference is for round bases)'}`);
}
console.log('\nsummary (targets: reach map ≤ 20 ms median, ≥ 50× the grid)');
for (const s of summary) console.log(`  ${s}`);
