// The disk under the database, as the load bench sees it: every commit of a move waits for
// PostgreSQL to write its WAL and flush it (synchronous_commit on, as shipped; on Linux the
// flush is fdatasync, PostgreSQL's default wal_sync_method — PostgreSQL 15 docs, "WAL
// Configuration"), so a slow write at the disk is a slow commit whatever the app does.
//
// - `flushProbe`: writes of 8 KB (PostgreSQL's WAL page size) each followed by fdatasync, in a
//   file in the given folder, one every few milliseconds: the disk's own write-and-flush
//   latency, with nothing of ours in the path.
// - `DiskWatch`: sampled from the open-loop driver's 1 ms tick, how long the disk at a stretch
//   had a request in flight (`/proc/diskstats`, "I/Os currently in progress"; Linux
//   Documentation/admin-guide/iostats.rst): a write the device is still holding after tens of
//   milliseconds is a stall of every commit waiting for it.
import { closeSync, fdatasyncSync, mkdtempSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

export interface FlushFigures {
	writes: number;
	p50: number;
	p99: number;
	p999: number;
	max: number;
	/** Writes that took longer than 20 ms (the commit target's budget is 25 ms). */
	over20: number;
}

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];

/** `count` writes of 8 KB, each flushed with fdatasync, `gapMs` apart, in `dir`; figures in ms. */
export async function flushProbe(dir: string, count = 1000, gapMs = 5): Promise<FlushFigures> {
	const folder = mkdtempSync(join(dir, 'disk-probe-'));
	const fd = openSync(join(folder, 'probe'), 'w+');
	const page = Buffer.alloc(8192, 7);
	const ms: number[] = [];
	try {
		// The file is laid out first, so each probe write rewrites a page and changes no size.
		for (let i = 0; i < 256; i++) writeSync(fd, page, 0, page.length, i * page.length);
		fdatasyncSync(fd);
		for (let i = 0; i < count; i++) {
			const t = performance.now();
			writeSync(fd, page, 0, page.length, (i % 256) * page.length);
			fdatasyncSync(fd);
			ms.push(performance.now() - t);
			await new Promise((r) => setTimeout(r, gapMs));
		}
	} finally {
		closeSync(fd);
		rmSync(folder, { recursive: true, force: true });
	}
	ms.sort((a, b) => a - b);
	return { writes: ms.length, p50: quantile(ms, 0.5), p99: quantile(ms, 0.99), p999: quantile(ms, 0.999), max: ms[ms.length - 1], over20: ms.filter((x) => x > 20).length };
}

export interface DiskFigures {
	/** The longest stretch with a request in flight at one disk, in ms (±1 ms of sampling). */
	longestBusyMs: number;
	/** Stretches over 20 ms. */
	busyOver20: number;
}

/** Whole disks only: partitions repeat their disk's requests; loop and RAM devices are no disk. */
const WHOLE_DISK = /^(sd[a-z]+|vd[a-z]+|xvd[a-z]+|hd[a-z]+|nvme\d+n\d+|mmcblk\d+)$/;

/** In-flight counts of the whole disks from a /proc/diskstats text. */
export function inFlight(text: string): Map<string, number> {
	const out = new Map<string, number>();
	for (const line of text.split('\n')) {
		const f = line.trim().split(/\s+/);
		if (f.length >= 14 && WHOLE_DISK.test(f[2])) out.set(f[2], Number(f[11]));
	}
	return out;
}

export class DiskWatch {
	private busySince = new Map<string, number>();
	private longest = 0;
	private over20 = 0;
	private readonly available: boolean;

	constructor(private readonly read: () => string = () => readFileSync('/proc/diskstats', 'utf8')) {
		let ok = true;
		try {
			this.read();
		} catch {
			ok = false;
		}
		this.available = ok;
	}

	/** Call often (every ~1 ms); `now` in ms. */
	sample(now = performance.now()): void {
		if (!this.available) return;
		for (const [disk, n] of inFlight(this.read())) {
			const since = this.busySince.get(disk);
			if (n > 0 && since === undefined) this.busySince.set(disk, now);
			else if (n === 0 && since !== undefined) {
				this.end(now - since);
				this.busySince.delete(disk);
			}
		}
	}

	private end(ms: number): void {
		this.longest = Math.max(this.longest, ms);
		if (ms > 20) this.over20++;
	}

	/** The figures so far (a stretch still open counts up to `now`), or null without diskstats. */
	figures(now = performance.now()): DiskFigures | null {
		if (!this.available) return null;
		let longest = this.longest;
		let over20 = this.over20;
		for (const since of this.busySince.values()) {
			longest = Math.max(longest, now - since);
			if (now - since > 20) over20++;
		}
		return { longestBusyMs: longest, busyOver20: over20 };
	}
}
