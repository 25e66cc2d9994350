// Open-loop load at a fixed arrival rate, for the "at N requests/s" figures of the load bench.
//
// Why not autocannon's `overallRate`: autocannon 8 gives each connection a quota per second and
// sends it back to back as soon as the second starts (httpClient.js `reqsMadeThisSecond`), so
// "500 req/s" is a burst at full speed followed by silence; and it corrects latencies for
// coordinated omission with an expected interval of `Math.ceil(1 / rate)` (run.js), which is
// 1 ms for any rate over 1 a second: every response of L ms is recorded as L samples
// (L, L−1, … 1), so one slow answer outweighs hundreds of quick ones. Flat-out runs (no rate)
// are unaffected, and the bench still uses autocannon for those.
//
// Here a request falls due every 1/rate s whatever the server does (open loop). It goes out
// on the first free lane (a keep-alive connection and, for commits, a game of its own); its
// latency is counted from when it was due, not from when it went out, so a stall counts against
// every request that fell due during it — the honest way to avoid coordinated omission.
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { monitorEventLoopDelay, performance } from 'node:perf_hooks';
import * as hdr from 'hdr-histogram-js';
import { DiskWatch, type DiskFigures } from './disk';

export interface PacedRequest {
	method: string;
	path: string;
	headers: Record<string, string>;
	body?: string;
}

export interface PacedOptions<Lane> {
	/** e.g. http://127.0.0.1:3000 */
	base: string;
	/** Requests per second offered. */
	rate: number;
	seconds: number;
	/** One context per lane; a lane carries one request at a time. */
	lanes: Lane[];
	request: (lane: Lane) => PacedRequest;
	onResponse?: (lane: Lane, status: number, body: string) => void;
}

export interface PacedResult {
	offered: number;
	/** Requests completed (answered or failed) per second over the run. */
	rps: number;
	requests: number;
	non2xx: number;
	errors: number;
	/** Latency from the moment each request fell due, in ms. */
	p50: number;
	p90: number;
	p99: number;
	max: number;
	/** The most requests waiting for a free lane at one moment (0–1: the client kept up). */
	maxQueued: number;
	/** When the slowest request fell due, in s from the start of the run. */
	maxAtS: number;
	/** This process's own longest event-loop delay, in ms: a stall of the load generator shows
	 * here, not as the server's latency. */
	clientMaxDelayMs: number;
	/** The whole machine over the run, from /proc/stat (null where there is none): the share of
	 * CPU time that was busy, and the share stolen — time the hypervisor gave this virtual
	 * machine's CPUs to someone else while they had work, a stall no process here can see; and
	 * the major page faults (a mapped page — code, a library — read back from disk after the
	 * kernel paged it out) and the file pages read back after eviction (`workingset_refault_file`:
	 * also what PostgreSQL reads through the page cache), each a stall of whoever needed it. */
	machine: { busyPct: number; stealPct: number; majorFaults: number; refaults: number } | null;
	/** The disks over the run, sampled every tick (./disk.ts): the longest stretch a request
	 * stayed in flight at a disk — a commit waits for its WAL write — or null without diskstats. */
	disk: DiskFigures | null;
}

/** The summed CPU times of the first line of /proc/stat (user … steal), the system's major
 * page faults and file pages read back after eviction so far (/proc/vmstat), or null. */
function cpuTimes(): { total: number; idle: number; steal: number; majorFaults: number; refaults: number } | null {
	try {
		const f = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1, 9).map(Number);
		const [user, nice, system, idle, iowait, irq, softirq, steal] = f;
		const vm = readFileSync('/proc/vmstat', 'utf8');
		const count = (name: string) => Number(new RegExp(`^${name} (\\d+)$`, 'm').exec(vm)?.[1] ?? NaN);
		return {
			total: user + nice + system + idle + iowait + irq + softirq + steal,
			idle: idle + iowait,
			steal,
			majorFaults: count('pgmajfault'),
			refaults: count('workingset_refault_file')
		};
	} catch {
		return null;
	}
}

export function runPaced<Lane>(opts: PacedOptions<Lane>): Promise<PacedResult> {
	const { base, rate, seconds, lanes } = opts;
	const url = new URL(base);
	const agent = new http.Agent({ keepAlive: true, maxSockets: lanes.length });
	// Microseconds, three significant digits, up to 60 s.
	const histogram = hdr.build({ lowestDiscernibleValue: 1, highestTrackableValue: 60_000_000, numberOfSignificantValueDigits: 3 });
	const total = Math.round(rate * seconds);
	const intervalMs = 1000 / rate;
	const free = [...lanes];
	const queue: number[] = []; // due times (performance.now()) of requests waiting for a lane
	let scheduled = 0;
	let answered = 0;
	let non2xx = 0;
	let errors = 0;
	let maxQueued = 0;
	let start = 0;
	let lastAnswer = 0;
	let worst = { ms: 0, dueAt: 0 };

	const delay = monitorEventLoopDelay({ resolution: 5 });
	const disk = new DiskWatch();
	let cpuAtStart: ReturnType<typeof cpuTimes> = null;
	return new Promise((resolve) => {
		const finish = () => {
			clearInterval(timer);
			delay.disable();
			agent.destroy();
			const spanS = Math.max(seconds, (lastAnswer - start) / 1000);
			const ms = (q: number) => histogram.getValueAtPercentile(q) / 1000;
			const cpuAtEnd = cpuTimes();
			const span = cpuAtStart && cpuAtEnd ? cpuAtEnd.total - cpuAtStart.total : 0;
			resolve({
				offered: rate,
				rps: answered / spanS,
				requests: answered,
				non2xx,
				errors,
				p50: ms(50),
				p90: ms(90),
				p99: ms(99),
				max: histogram.maxValue / 1000,
				maxQueued,
				maxAtS: (worst.dueAt - start) / 1000,
				clientMaxDelayMs: delay.max / 1e6,
				machine:
					cpuAtStart && cpuAtEnd && span > 0
						? {
								busyPct: (100 * (span - (cpuAtEnd.idle - cpuAtStart.idle))) / span,
								stealPct: (100 * (cpuAtEnd.steal - cpuAtStart.steal)) / span,
								majorFaults: cpuAtEnd.majorFaults - cpuAtStart.majorFaults,
								refaults: cpuAtEnd.refaults - cpuAtStart.refaults
							}
						: null,
				disk: disk.figures()
			});
			histogram.destroy();
		};
		const send = (lane: Lane, dueAt: number) => {
			const r = opts.request(lane);
			const req = http.request(
				{ agent, host: url.hostname, port: url.port, method: r.method, path: r.path, headers: r.body === undefined ? r.headers : { ...r.headers, 'content-length': Buffer.byteLength(r.body) } },
				(res) => {
					const chunks: Buffer[] = [];
					res.on('data', (c: Buffer) => chunks.push(c));
					res.on('end', () => {
						const status = res.statusCode ?? 0;
						if (status < 200 || status >= 300) non2xx++;
						done(lane, dueAt, status, Buffer.concat(chunks).toString('utf8'));
					});
				}
			);
			req.setTimeout(30_000, () => req.destroy(new Error('no answer within 30 s')));
			req.on('error', () => {
				errors++;
				done(lane, dueAt, 0, '');
			});
			req.end(r.body);
		};
		const done = (lane: Lane, dueAt: number, status: number, body: string) => {
			const now = performance.now();
			lastAnswer = now;
			histogram.recordValue(Math.max(1, Math.round((now - dueAt) * 1000)));
			if (now - dueAt > worst.ms) worst = { ms: now - dueAt, dueAt };
			answered++;
			opts.onResponse?.(lane, status, body);
			const next = queue.shift();
			if (next !== undefined) send(lane, next);
			else free.push(lane);
			if (answered >= total) finish();
		};
		const tick = () => {
			const now = performance.now();
			disk.sample(now);
			while (scheduled < total && start + scheduled * intervalMs <= now) {
				const dueAt = start + scheduled * intervalMs;
				scheduled++;
				const lane = free.shift();
				if (lane !== undefined) send(lane, dueAt);
				else queue.push(dueAt);
			}
			maxQueued = Math.max(maxQueued, queue.length);
		};
		delay.enable();
		cpuAtStart = cpuTimes();
		start = performance.now();
		// Node's timers fire about every millisecond at best; requests keep their exact due times
		// however late the tick that sends them, so timer jitter counts as latency, not hidden.
		const timer = setInterval(tick, 1);
		tick();
	});
}
