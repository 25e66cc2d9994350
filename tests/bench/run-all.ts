// npm run bench: every benchmark that needs no running app, one after the other — the engine
// check bench, then the route finder bench — each in its own process (so one's JIT and memory
// do not colour the other's figures), and where the two that need the app are run from.
import { spawnSync } from 'node:child_process';
import { loadavg, cpus } from 'node:os';

const benches = [
	{ name: 'engine check (checkMove vs the JSTS reference)', file: 'tests/bench/check-bench.ts' },
	{ name: 'route finder (reach map and route vs the grid)', file: 'tests/bench/route-bench.ts' }
];

const load = () => loadavg().map((v) => v.toFixed(2)).join(' ');
console.log(`load average ${load()} on ${cpus().length} cores`);
const failed: string[] = [];
for (const b of benches) {
	console.log(`\n── ${b.name}: ${b.file}`);
	const r = spawnSync('node_modules/.bin/tsx', [b.file], { stdio: 'inherit' });
	if (r.status !== 0) failed.push(`${b.file} (exit ${r.status ?? r.signal})`);
}
console.log(`\nload average ${load()} after`);
console.log('\nThe benchmarks that need the app built and running bring it up themselves:');
console.log('  npm run bench:frame   frame time while dragging on a 300-piece table (4× CPU throttling), and the play page\'s JavaScript gzipped');
console.log('  npm run bench:load    the server under concurrent load');
if (failed.length) {
	console.error(`\nfailed: ${failed.join(', ')}`);
	process.exit(1);
}
