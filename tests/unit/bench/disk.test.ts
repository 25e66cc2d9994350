// The load bench's disk figures (tests/bench/disk.ts): reading /proc/diskstats (field 12, "I/Os
// currently in progress", Linux Documentation/admin-guide/iostats.rst) and timing how long a
// disk stays busy; and the write-and-flush probe on a real file.
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DiskWatch, flushProbe, inFlight } from '../../bench/disk';

// Lines as this kernel prints them (6.x: 20 fields), a partition, a RAM disk and a loop device.
const line = (name: string, inProgress: number) =>
	` 254       0 ${name} 402363 52620 11998794 12702147 2396941 883610 51098888 1496885 ${inProgress} 1081032 14458284 680107 835 18337960 174971 828244 84281`;
const stats = (vda: number, nvme = 0) => [line('vda', vda), line('vda1', 9), line('zram0', 5), line('loop0', 3), line('nvme0n1', nvme)].join('\n');

describe('inFlight', () => {
	it('reads the in-progress count of whole disks only', () => {
		expect([...inFlight(stats(2, 1))]).toEqual([
			['vda', 2],
			['nvme0n1', 1]
		]);
	});
});

describe('DiskWatch', () => {
	it('times each stretch a disk has requests in flight, and counts those over 20 ms', () => {
		let text = stats(0);
		const watch = new DiskWatch(() => text);
		watch.sample(0);
		text = stats(1);
		watch.sample(10); // busy from 10 ms
		text = stats(3);
		watch.sample(25);
		text = stats(0);
		watch.sample(45); // 35 ms busy
		text = stats(1);
		watch.sample(50);
		text = stats(0);
		watch.sample(55); // 5 ms busy
		expect(watch.figures(60)).toEqual({ longestBusyMs: 35, busyOver20: 1 });
	});

	it('counts a stretch still open at the end up to then', () => {
		let text = stats(0);
		const watch = new DiskWatch(() => text);
		watch.sample(0);
		text = stats(0, 4);
		watch.sample(100);
		expect(watch.figures(150)).toEqual({ longestBusyMs: 50, busyOver20: 1 });
	});

	it('is null where there is no diskstats', () => {
		const watch = new DiskWatch(() => {
			throw new Error('ENOENT');
		});
		watch.sample(0);
		expect(watch.figures(1)).toBeNull();
	});
});

describe('flushProbe', () => {
	const dir = mkdtempSync(join(tmpdir(), 'disk-test-'));
	afterAll(() => rmSync(dir, { recursive: true, force: true }));

	it('times real writes and flushes and leaves nothing behind', async () => {
		const f = await flushProbe(dir, 20, 0);
		expect(f.writes).toBe(20);
		expect(f.p50).toBeGreaterThan(0);
		expect(f.p50).toBeLessThanOrEqual(f.p99);
		expect(f.p99).toBeLessThanOrEqual(f.max);
		expect(f.over20 > 0).toBe(f.max > 20);
		expect(readdirSync(dir)).toEqual([]);
	});
});
