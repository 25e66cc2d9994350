// Load benchmark (npm run bench:load): the check API and the commit route of a running app,
// loaded from this process over loopback: autocannon flat out (closed loop: throughput), then
// an open-loop run at a fixed offered rate (./paced.ts: latency at that rate, counted from when
// each request fell due). Prints throughput, p50 and p99 and whether the targets hold:
// check ≥ 500 requests/s at p99 ≤ 10 ms, commit p99 ≤ 25 ms.
//
// `npm run bench:load` (scripts/bench-load.sh) brings up an app of its own with the demo on slot
// 7 and stops it afterwards; with BENCH_BASE_URL set it drives that app instead (`npm start`'s
// http://127.0.0.1:3000, or the test server of `npm test`). The bench signs in
// as a demo player (BENCH_EMAIL / BENCH_PASSWORD), saves a roster and sets up its own
// one-tablet games, so it never touches anyone's game.
import { cpus, loadavg } from 'node:os';
import autocannon from 'autocannon';
import { flushProbe, type FlushFigures } from './disk';
import { runPaced, type PacedResult } from './paced';
import { LAYOUT, UNITS_A } from '../unit/games/fixtures';

const BASE = (process.env.BENCH_BASE_URL ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
const EMAIL = process.env.BENCH_EMAIL ?? 'ada@demo.inchwarden.test';
const PASSWORD = process.env.BENCH_PASSWORD ?? 'tabletop-demo-1';
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CHECK_CONNECTIONS = Number(process.env.BENCH_CHECK_CONNECTIONS ?? 10);
const COMMIT_CONNECTIONS = Number(process.env.BENCH_COMMIT_CONNECTIONS ?? 4);
/** Offered rate of the open-loop commit run (a club night is far below this). */
const COMMIT_RATE = Number(process.env.BENCH_COMMIT_RATE ?? 100);
/** Lanes (keep-alive connections; for commits, games) of the open-loop runs. */
const PACED_LANES = Number(process.env.BENCH_PACED_LANES ?? 16);
/** Where the disk probe writes: the folder of PostgreSQL's data (bench-load.sh says), else here. */
const DISK_DIR = process.env.BENCH_DISK_DIR ?? '.';
/** BENCH_ONLY=check or commit: run one half only. */
const ONLY = process.env.BENCH_ONLY ?? '';

const TARGET = { checkRps: 500, checkP99Ms: 10, commitP99Ms: 25 };

// A check request of a small skirmish: two units a side, a crate, one three-leg move.
const foot = (id: string, side: string, unit: string, x: number, y: number) => ({
	id,
	side,
	unit,
	class: 'foot',
	allowance: 6,
	footprint: { shape: 'round', diameterMm: 32 },
	at: { x, y, facing: 90 }
});
const CHECK_BODY = JSON.stringify({
	board: { width: 44, depth: 60, terrain: [{ id: 'crate', kind: 'block', outline: [[20, 20], [24, 20], [24, 24], [20, 24]], height: 2 }] },
	pieces: [
		foot('a1', 'red', 'u1', 10, 10),
		foot('a2', 'red', 'u1', 12, 10),
		foot('a3', 'red', 'u1', 14, 10),
		foot('b1', 'red', 'u2', 30, 10),
		foot('c1', 'blue', 'u3', 10, 40),
		foot('c2', 'blue', 'u3', 12, 40),
		foot('d1', 'blue', 'u4', 30, 40)
	],
	move: {
		unit: 'u1',
		kind: 'move',
		paths: { a1: [{ x: 11, y: 12 }, { x: 12, y: 14 }], a2: [{ x: 13, y: 12 }, { x: 14, y: 14 }], a3: [{ x: 15, y: 12 }, { x: 16, y: 14 }] }
	}
});

let cookie = '';
async function api(method: string, path: string, body?: unknown): Promise<{ status: number; json: any }> { // eslint-disable-line @typescript-eslint/no-explicit-any
	const res = await fetch(BASE + path, {
		method,
		headers: { 'content-type': 'application/json', accept: 'application/json', origin: BASE, ...(cookie ? { cookie } : {}) },
		body: body === undefined ? undefined : JSON.stringify(body)
	});
	const set = res.headers.getSetCookie().find((c) => c.startsWith('inchwarden_session='));
	if (set) cookie = set.split(';')[0];
	const text = await res.text();
	return { status: res.status, json: text ? JSON.parse(text) : null };
}

function must(r: { status: number; json: unknown }, what: string, ok = [200, 201]): void {
	if (!ok.includes(r.status)) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.json).slice(0, 300)}`);
}

interface Table {
	id: number;
	seq: number;
	pending: boolean;
}

/** A one-tablet game in round 1, side A to move: the commits alternate move and take-back. */
async function newTable(rosterId: number, n: number): Promise<Table> {
	const g = await api('POST', '/api/v1/games', { title: `Load bench table ${n}`, layout: LAYOUT, opponent: { mode: 'shared' }, rosterA: rosterId, rosterB: rosterId });
	must(g, 'create a game');
	const id = g.json.id as number;
	let seq = (await api('GET', `/api/v1/games/${id}`)).json.game.seq as number;
	const step = async (path: string, body: object) => {
		const r = await api('POST', `/api/v1/games/${id}${path}`, { seq, ...body });
		must(r, path);
		seq = r.json.seq;
	};
	await step('/deploy', { side: 'a', placements: [{ piece: 'a-u1-p1', at: { x: 10, y: 6 } }, { piece: 'a-u1-p2', at: { x: 12, y: 6 } }, { piece: 'a-u1-p3', at: { x: 14, y: 6 } }] });
	await step('/end-turn', {});
	await step('/deploy', { side: 'b', placements: [{ piece: 'b-u1-p1', at: { x: 10, y: 54 } }, { piece: 'b-u1-p2', at: { x: 12, y: 54 } }, { piece: 'b-u1-p3', at: { x: 14, y: 54 } }] });
	await step('/end-turn', {});
	return { id, seq, pending: false };
}

const MOVE = { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 10 }], 'a-u1-p2': [{ x: 12, y: 10 }], 'a-u1-p3': [{ x: 14, y: 10 }] } };

interface Figures {
	rps: number;
	p50: number;
	p99: number;
	requests: number;
	non2xx: number;
	errors: number;
}

function figures(r: autocannon.Result): Figures {
	return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, requests: r.requests.total, non2xx: r.non2xx, errors: r.errors + r.timeouts };
}

function pacedFigures(r: PacedResult): Figures & Pick<PacedResult, 'max' | 'maxAtS' | 'maxQueued' | 'clientMaxDelayMs' | 'machine' | 'disk'> {
	return { rps: r.rps, p50: r.p50, p99: r.p99, requests: r.requests, non2xx: r.non2xx, errors: r.errors, max: r.max, maxAtS: r.maxAtS, maxQueued: r.maxQueued, clientMaxDelayMs: r.clientMaxDelayMs, machine: r.machine, disk: r.disk };
}

/** How busy the machine was during an open-loop run, how much of its CPU time was stolen, how
 * many pages had to be read back from disk, and the longest the disk held a request. */
function machineWords(m: PacedResult['machine'], d: PacedResult['disk']): string {
	const machine = m ? `, machine ${m.busyPct.toFixed(0)} % busy, ${m.stealPct.toFixed(1)} % stolen by the host, ${m.majorFaults} major page faults, ${m.refaults} file pages read back` : '';
	const disk = d ? `, the disk longest busy ${d.longestBusyMs.toFixed(0)} ms at a stretch (${d.busyOver20} over 20 ms)` : '';
	return machine + disk;
}

function flushWords(f: FlushFigures): string {
	const n = (x: number) => x.toFixed(2);
	return `p50 ${n(f.p50)} ms, p99 ${n(f.p99)} ms, p99.9 ${n(f.p999)} ms, max ${n(f.max)} ms; ${f.over20} of ${f.writes} over 20 ms`;
}

function run(opts: autocannon.Options): Promise<autocannon.Result> {
	return new Promise((resolve, reject) => {
		autocannon(opts, (err, result) => (err ? reject(err) : resolve(result)));
	});
}

/**
 * The generator's own garbage (a flat-out run leaves plenty) is collected before each measured
 * run when bench-load.sh gave it --expose-gc, so its collection does not stall the measured
 * window and count against the server; the app's own collections are left as they come.
 */
function settleClient(): void {
	(globalThis as { gc?: () => void }).gc?.();
}

function line(name: string, f: Figures, verdict: string): string {
	return `${name.padEnd(42)} ${f.rps.toFixed(0).padStart(6)} req/s   p50 ${f.p50.toFixed(2).padStart(6)} ms   p99 ${f.p99.toFixed(2).padStart(6)} ms   ${String(f.requests).padStart(6)} requests, ${f.non2xx} not 2xx, ${f.errors} errors   ${verdict}`;
}

async function main(): Promise<void> {
	try {
		await fetch(BASE + '/sign-in');
	} catch {
		console.error(`No app answers at ${BASE}: run \`npm run bench:load\` without BENCH_BASE_URL to bring one up, or start one (\`npm start\`).`);
		process.exit(2);
	}
	must(await api('POST', '/api/v1/session', { email: EMAIL, password: PASSWORD }), `sign in as ${EMAIL}`);
	const roster = await api('POST', '/api/v1/rosters', { name: 'Load bench list', force: 'Bench', units: [UNITS_A[0]] });
	must(roster, 'save a roster');
	const rosterId = roster.json.roster.id as number;
	console.log(`Inchwarden load bench against ${BASE}: ${SECONDS} s per run, autocannon ${CHECK_CONNECTIONS} connections (check), ${COMMIT_CONNECTIONS} (commit)\n`);

	const ok = (b: boolean) => (b ? 'target met' : 'TARGET MISSED');
	const json: Record<string, unknown> = {};
	const verdicts: string[] = [];
	const paced: string[] = [];

	if (ONLY !== 'commit') {
		const checkOpts = { url: `${BASE}/api/v1/check`, method: 'POST' as const, headers: { 'content-type': 'application/json' }, body: CHECK_BODY };
		await run({ ...checkOpts, connections: 4, duration: 2 }); // warm-up: JIT, pool
		settleClient();
		const checkMax = figures(await run({ ...checkOpts, connections: CHECK_CONNECTIONS, duration: SECONDS }));
		// Like the autocannon runs, each open-loop run follows a short one that is not counted
		// (new keep-alive connections, the driver's own code paths compiled).
		const checkPaced = {
			base: BASE,
			rate: TARGET.checkRps,
			lanes: Array.from({ length: PACED_LANES }, (_, i) => i),
			request: () => ({ method: 'POST', path: '/api/v1/check', headers: { 'content-type': 'application/json' }, body: CHECK_BODY })
		};
		await runPaced({ ...checkPaced, seconds: 1 });
		settleClient();
		const checkAtTarget = pacedFigures(
			await runPaced({
				base: BASE,
				rate: TARGET.checkRps,
				seconds: SECONDS,
				lanes: Array.from({ length: PACED_LANES }, (_, i) => i),
				request: () => ({ method: 'POST', path: '/api/v1/check', headers: { 'content-type': 'application/json' }, body: CHECK_BODY })
			})
		);
		const checkMet = checkAtTarget.rps >= TARGET.checkRps * 0.98 && checkAtTarget.p99 <= TARGET.checkP99Ms && checkAtTarget.non2xx === 0 && checkAtTarget.errors === 0;
		console.log(line(`check, as fast as it goes`, checkMax, checkMax.rps >= TARGET.checkRps ? `≥ ${TARGET.checkRps} req/s` : `< ${TARGET.checkRps} req/s`));
		console.log(line(`check, offered ${TARGET.checkRps} req/s (open loop)`, checkAtTarget, ok(checkMet) + ` (≥ ${TARGET.checkRps} req/s at p99 ≤ ${TARGET.checkP99Ms} ms)`));
		verdicts.push(`check: ${ok(checkMet)}`);
		paced.push(`check max ${checkAtTarget.max.toFixed(2)} ms (due at ${checkAtTarget.maxAtS.toFixed(2)} s), at most ${checkAtTarget.maxQueued} waiting for a lane, the client's own longest stall ${checkAtTarget.clientMaxDelayMs.toFixed(1)} ms${machineWords(checkAtTarget.machine, checkAtTarget.disk)}`);
		Object.assign(json, { checkMax, checkAtTarget });
	}

	if (ONLY !== 'check') {
		// Commits: every connection works its own game, naming the seq of the last answer.
		const tables: Table[] = [];
		for (let i = 0; i < Math.max(COMMIT_CONNECTIONS + 1, PACED_LANES); i++) tables.push(await newTable(rosterId, i));
		const free: Table[] = [];
		/** Between runs: requests cut off by the end of a run may have landed, so ask each game. */
		const resync = async () => {
			await new Promise((r) => setTimeout(r, 500));
			free.length = 0;
			for (const t of tables) {
				const g = (await api('GET', `/api/v1/games/${t.id}`)).json.game;
				t.seq = g.seq;
				t.pending = g.state.pending !== null;
				free.push(t);
			}
		};
		/** A commit's answer: the new seq, or the state a 409 carries (a request cut off at the
		 * end of a run may land later). */
		const learn = (t: Table, status: number, body: string) => {
			if (status === 200 || status === 201) {
				t.seq = JSON.parse(body).seq;
				t.pending = !t.pending;
			} else {
				const game = status === 409 ? JSON.parse(body).game : null;
				if (game) {
					t.seq = game.seq;
					t.pending = game.state.pending !== null;
				}
			}
		};
		const commitPath = (t: Table) => `/api/v1/games/${t.id}/${t.pending ? 'take-back' : 'moves'}`;
		const commitBody = (t: Table) => JSON.stringify(t.pending ? { seq: t.seq } : { seq: t.seq, ...MOVE });
		const commitRequest = {
			method: 'POST' as const,
			setupRequest: (req: any, ctx: any) => { // eslint-disable-line @typescript-eslint/no-explicit-any
				const t = free.shift()!;
				ctx.table = t;
				req.path = commitPath(t);
				req.body = commitBody(t);
				return req;
			},
			onResponse: (status: number, body: string, ctx: any) => { // eslint-disable-line @typescript-eslint/no-explicit-any
				learn(ctx.table, status, body);
				free.push(ctx.table);
			}
		};
		const commitOpts = { url: BASE, headers: { 'content-type': 'application/json', cookie, origin: BASE }, requests: [commitRequest] };
		await resync();
		await run({ ...commitOpts, connections: COMMIT_CONNECTIONS, duration: 2 });
		await resync();
		settleClient();
		const commitMax = figures(await run({ ...commitOpts, connections: COMMIT_CONNECTIONS, duration: SECONDS }));
		await resync();
		// Open loop: each lane is a game of its own, so no request waits for another's answer to
		// learn its seq.
		const lanes = free.splice(0, PACED_LANES);
		await runPaced({
			base: BASE,
			rate: COMMIT_RATE,
			seconds: 1,
			lanes,
			request: (t) => ({ method: 'POST', path: commitPath(t), headers: { 'content-type': 'application/json', accept: 'application/json', cookie, origin: BASE }, body: commitBody(t) }),
			onResponse: learn
		});
		settleClient();
		const commitAtRate = pacedFigures(
			await runPaced({
				base: BASE,
				rate: COMMIT_RATE,
				seconds: SECONDS,
				lanes,
				request: (t) => ({
					method: 'POST',
					path: commitPath(t),
					headers: { 'content-type': 'application/json', accept: 'application/json', cookie, origin: BASE },
					body: commitBody(t)
				}),
				onResponse: learn
			})
		);
		const commitMet = commitMax.p99 <= TARGET.commitP99Ms && commitMax.non2xx === 0 && commitAtRate.p99 <= TARGET.commitP99Ms && commitAtRate.non2xx === 0 && commitAtRate.errors === 0;
		console.log(line(`commit (move/take-back), flat out`, commitMax, ok(commitMax.p99 <= TARGET.commitP99Ms) + ` (p99 ≤ ${TARGET.commitP99Ms} ms)`));
		console.log(line(`commit, offered ${COMMIT_RATE} req/s (open loop)`, commitAtRate, ok(commitAtRate.p99 <= TARGET.commitP99Ms) + ` (p99 ≤ ${TARGET.commitP99Ms} ms)`));
		verdicts.push(`commit: ${ok(commitMet)}`);
		paced.push(`commit max ${commitAtRate.max.toFixed(2)} ms (due at ${commitAtRate.maxAtS.toFixed(2)} s), at most ${commitAtRate.maxQueued} waiting for a lane, the client's own longest stall ${commitAtRate.clientMaxDelayMs.toFixed(1)} ms${machineWords(commitAtRate.machine, commitAtRate.disk)}`);
		// The disk's own write-and-flush latency, measured here and now, after the runs (not to
		// disturb them): what every commit waits for at least once.
		const flush = await flushProbe(DISK_DIR);
		console.log(`the disk (${DISK_DIR}): 8 KB write + fdatasync, ${flush.writes} of them 5 ms apart: ${flushWords(flush)}`);
		Object.assign(json, { commitMax, commitAtRate, flush });
	}

	console.log(`\nopen-loop runs (latency from when each request fell due, ${PACED_LANES} lanes): ${paced.join('; ')}`);
	console.log(verdicts.join('; '));
	// Figures from a shared machine mean little without its load: say what it was.
	console.log(`machine: ${cpus().length} cores, load average ${loadavg().map((l) => l.toFixed(2)).join(' / ')} (1/5/15 min) at the end of the run`);
	if (process.env.BENCH_JSON) console.log(JSON.stringify(json));
}

main().catch((e) => {
	console.error(e);
	process.exit(1);
});
