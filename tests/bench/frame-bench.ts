// npm run bench:frame — frame time on the play screen while a piece is dragged on a table with
// 300 pieces, under 4× CPU throttling (Chrome DevTools Protocol), in Debian's Chromium. Frame
// times are the gaps between requestAnimationFrame timestamps collected in the page during the
// drag; long animation frames (> 50 ms) are counted too. A measurement, not a test: it prints
// p50 / p95 / max and whether p95 ≤ 16.7 ms (the issue's target). Needs the app running: the
// npm script brings one up (scripts/bench-frame.sh) and sets BENCH_BASE_URL.
import { existsSync, readFileSync } from 'node:fs';
import type { CDPSession, Page } from '@playwright/test';
import { toPx } from '../../src/lib/board/view';
import { baseUrl, launch, pct, setUpBenchGame, signIn, tablet } from './frame-browser';

const BASE = baseUrl('tests/bench/frame-bench.ts');
const THROTTLE = Number(process.env.BENCH_CPU_THROTTLE ?? 4);
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
/** pointer moves per drag: each about 0.02 in along the path, like a finger reported at 60 Hz */
const MOVES = 240;
const TARGET_MS = 16.7;
/** The dragged piece: middle of the front row of side A's third unit (frame-scene.ts). */
const PIECE = { id: 'a-u3-p3', unit: 'a-u3', unitName: 'Ashfield file 3', x: 21.5, y: 22.5 };

async function boardPoint(page: Page, x: number, y: number) {
	const canvas = page.getByTestId('board-canvas');
	const box = (await canvas.boundingBox())!;
	const [scale, offsetX, offsetY] = (await canvas.getAttribute('data-view'))!.split(' ').map(Number);
	const p = toPx({ scale, offsetX, offsetY }, { x, y });
	return { x: box.x + p.x, y: box.y + p.y, scale };
}

/** A gentle S-curve forward: 4.5 in ahead, swinging 0.8 in either side (about 5.3 in long). */
function pathPoint(t: number) {
	return { x: PIECE.x + 0.8 * Math.sin(t * 2 * Math.PI), y: PIECE.y + 4.5 * t };
}

/** One drag with the rAF collector running; answers the frame gaps (ms) seen during it. */
async function dragOnce(page: Page): Promise<{ gaps: number[]; longFrames: number[]; readout: string }> {
	const start = await boardPoint(page, PIECE.x, PIECE.y);
	const origin = await boardPoint(page, 0, 0);
	const scale = start.scale;
	await page.mouse.move(start.x, start.y);
	await page.mouse.down();
	await page.evaluate(() => {
		const w = window as unknown as { __bench: { stamps: number[]; long: number[]; on: boolean; obs?: PerformanceObserver } };
		w.__bench = { stamps: [], long: [], on: true };
		const tick = (t: number) => {
			if (!w.__bench.on) return;
			w.__bench.stamps.push(t);
			requestAnimationFrame(tick);
		};
		requestAnimationFrame(tick);
		try {
			w.__bench.obs = new PerformanceObserver((list) => {
				for (const e of list.getEntries()) w.__bench.long.push(e.duration);
			});
			w.__bench.obs.observe({ type: 'long-animation-frame' });
		} catch {
			// older engines have no long-animation-frame entries: the rAF gaps still tell
		}
	});
	const t0 = Date.now();
	for (let i = 1; i <= MOVES; i++) {
		const p = pathPoint(i / MOVES);
		await page.mouse.move(origin.x + p.x * scale, origin.y + p.y * scale);
		// pace like a touch screen (one report a frame); when the page is behind, go straight on
		const wait = t0 + (i * 1000) / 60 - Date.now();
		if (wait > 0) await new Promise((r) => setTimeout(r, wait));
	}
	const { stamps, long } = await page.evaluate(() => {
		const w = window as unknown as { __bench: { stamps: number[]; long: number[]; on: boolean; obs?: PerformanceObserver } };
		w.__bench.on = false;
		w.__bench.obs?.disconnect();
		return { stamps: w.__bench.stamps, long: w.__bench.long };
	});
	const readout = (await page.getByTestId('allowance-readout').innerText()).trim();
	await page.mouse.up();
	const gaps = stamps.slice(1).map((t, i) => t - stamps[i]);
	return { gaps, longFrames: long, readout };
}

// --- the DevTools trace of one drag -------------------------------------------------------------

interface TraceEvent {
	pid: number;
	tid: number;
	ts: number;
	dur?: number;
	ph: string;
	name: string;
	cat: string;
	args?: { name?: string };
}

/**
 * The DevTools timeline's categories plus Blink's and the compositor's own (canvas hand-over,
 * layer updates); not V8's detailed ones, whose overhead would swamp the drag being measured.
 */
const TRACE_CATEGORIES = ['toplevel', 'devtools.timeline', 'disabled-by-default-v8.gc', 'v8.execute', 'blink', 'cc'];

async function traceDrag(page: Page, cdp: CDPSession): Promise<TraceEvent[]> {
	const events: TraceEvent[] = [];
	const onData = (e: { value: Record<string, unknown>[] }) => events.push(...(e.value as unknown as TraceEvent[]));
	cdp.on('Tracing.dataCollected', onData);
	const complete = new Promise<void>((resolve) => cdp.once('Tracing.tracingComplete', () => resolve()));
	await cdp.send('Tracing.start', {
		transferMode: 'ReportEvents',
		traceConfig: { recordMode: 'recordAsMuchAsPossible', includedCategories: TRACE_CATEGORIES }
	});
	await dragOnce(page);
	await cdp.send('Tracing.end');
	await complete;
	cdp.off('Tracing.dataCollected', onData);
	return events;
}

/** Each trace event name's kind, the way the DevTools performance panel groups them. */
function kindOf(name: string): string {
	if (/GC|Sweep|Marking|Scavenge|BlinkGC/i.test(name)) return 'garbage collection';
	if (/^(UpdateLayoutTree|RecalculateStyles|ParseAuthorStyleSheet|StyleRecalc|Document::updateStyle|StyleEngine)/.test(name)) return 'style';
	if (/^(Layout|UpdateLayout|LocalFrameView::layout|LayoutView|InvalidateLayout|ScheduleStyleInvalidationTracking)/.test(name)) return 'layout';
	if (/HitTest/.test(name)) return 'hit test';
	if (/^(Paint|PrePaint|PaintImage|UpdateLayer|UpdateLayerTree|Layerize|Commit|CompositeLayers|LocalFrameView::RunPaintLifecyclePhase|LocalFrameView::RunPrePaintLifecyclePhase|LocalFrameView::RunCompositingInputsLifecyclePhase|PaintController|PaintArtifactCompositor|cc::|LayerTreeHost|ProxyMain|Canvas|Draw|Raster|ImageDecode|Decode)/.test(name) || /Canvas|Paint|Raster/.test(name)) return 'paint, canvas, compositing';
	if (/^(FunctionCall|EvaluateScript|V8\.|v8\.|TimerFire|FireAnimationFrame|EventDispatch|RunMicrotasks|FireIdleCallback|ProfileCall|CpuProfiler|V8Console|XHRReadyStateChange|EventTiming|ResourceReceivedData|ParseHTML|Document::)/.test(name)) return 'script';
	return 'other (task overhead, input routing, messages)';
}

/** Self time (µs) of each complete event, its children's time taken out. */
function selfTimes(events: TraceEvent[]): { ev: TraceEvent; self: number; depth: number }[] {
	const out: { ev: TraceEvent; self: number; depth: number }[] = [];
	const sorted = events.filter((e) => e.ph === 'X' && typeof e.dur === 'number').sort((a, b) => a.ts - b.ts || b.dur! - a.dur!);
	const stack: { ev: TraceEvent; self: number; depth: number }[] = [];
	for (const ev of sorted) {
		while (stack.length && stack[stack.length - 1].ev.ts + stack[stack.length - 1].ev.dur! <= ev.ts) stack.pop();
		const parent = stack[stack.length - 1];
		const row = { ev, self: ev.dur!, depth: stack.length };
		if (parent && ev.ts + ev.dur! <= parent.ev.ts + parent.ev.dur! + 1) parent.self -= ev.dur!;
		out.push(row);
		stack.push(row);
	}
	return out;
}

/** B/E pairs on one thread as complete events. */
function pairUp(events: TraceEvent[]): TraceEvent[] {
	const out: TraceEvent[] = [];
	const open: TraceEvent[] = [];
	for (const e of [...events].sort((a, b) => a.ts - b.ts)) {
		if (e.ph === 'X') out.push(e);
		else if (e.ph === 'B') open.push(e);
		else if (e.ph === 'E') {
			const b = open.pop();
			if (b) out.push({ ...b, ph: 'X', dur: e.ts - b.ts });
		}
	}
	return out;
}

function summariseTrace(events: TraceEvent[]): string {
	const threadNames = new Map<string, string>();
	for (const e of events) if (e.ph === 'M' && e.name === 'thread_name') threadNames.set(`${e.pid}:${e.tid}`, e.args?.name ?? '?');
	const byThread = new Map<string, TraceEvent[]>();
	for (const e of events) {
		if (e.ph !== 'X' && e.ph !== 'B' && e.ph !== 'E') continue;
		const k = `${e.pid}:${e.tid}`;
		const list = byThread.get(k);
		if (list) list.push(e);
		else byThread.set(k, [e]);
	}
	// the page's main thread: the renderer main thread with the most events
	let main = '';
	for (const [k, list] of byThread) if (threadNames.get(k) === 'CrRendererMain' && (!main || list.length > byThread.get(main)!.length)) main = k;
	if (!main) return 'trace: no renderer main thread found';
	const rows = selfTimes(pairUp(byThread.get(main)!));
	const tops = rows.filter((r) => r.depth === 0);
	const span = tops.length ? tops[tops.length - 1].ev.ts + tops[tops.length - 1].ev.dur! - tops[0].ev.ts : 0;
	const busy = tops.reduce((a, r) => a + r.ev.dur!, 0);
	const byName = new Map<string, { us: number; n: number }>();
	const byKind = new Map<string, number>();
	for (const r of rows) {
		const v = byName.get(r.ev.name) ?? { us: 0, n: 0 };
		v.us += r.self;
		v.n += 1;
		byName.set(r.ev.name, v);
		byKind.set(kindOf(r.ev.name), (byKind.get(kindOf(r.ev.name)) ?? 0) + r.self);
	}
	const ms = (us: number) => `${(us / 1000).toFixed(0).padStart(6)} ms`;
	const share = (us: number) => `${((100 * us) / busy).toFixed(1).padStart(5)} %`;
	const lines = [`trace of one more drag (not counted): main thread busy ${ms(busy).trim()} of ${ms(span).trim()}; self time by kind:`];
	for (const [k, us] of [...byKind].sort((a, b) => b[1] - a[1])) lines.push(`  ${share(us)}  ${ms(us)}  ${k}`);
	lines.push('  by trace event (top 16):');
	for (const [name, v] of [...byName].sort((a, b) => b[1].us - a[1].us).slice(0, 16)) lines.push(`  ${share(v.us)}  ${ms(v.us)}  ${name} ×${v.n}`);
	// what the longest tasks were made of (the long frames)
	const longest = [...tops].sort((a, b) => b.ev.dur! - a.ev.dur!).slice(0, 5);
	const taskHist = [16.7, 33.3, 50, 100].map((lim) => `${tops.filter((r) => r.ev.dur! / 1000 > lim).length} over ${lim} ms`);
	lines.push(`  main-thread tasks: ${tops.length}; ${taskHist.join(', ')}; the five longest:`);
	for (const t of longest) {
		const end = t.ev.ts + t.ev.dur!;
		const inner = new Map<string, number>();
		for (const r of rows) if (r.ev.ts >= t.ev.ts && r.ev.ts < end && r !== t) inner.set(r.ev.name, (inner.get(r.ev.name) ?? 0) + r.self);
		const parts = [...inner].sort((a, b) => b[1] - a[1]).slice(0, 5).map(([n, us]) => `${n} ${(us / 1000).toFixed(1)}`);
		lines.push(`    ${(t.ev.dur! / 1000).toFixed(1)} ms at +${((t.ev.ts - tops[0].ev.ts) / 1000).toFixed(0)} ms: ${parts.join(', ')}`);
	}
	// the other threads of the page's process and the compositor: busy time, to see what competes
	lines.push('  other threads, busy (top-level events):');
	const others: [string, number][] = [];
	for (const [k, list] of byThread) {
		if (k === main) continue;
		const top = selfTimes(pairUp(list)).filter((r) => r.depth === 0);
		const us = top.reduce((a, r) => a + r.ev.dur!, 0);
		if (us > 50_000) others.push([`${threadNames.get(k) ?? k} (pid ${k.split(':')[0]})`, us]);
	}
	for (const [name, us] of others.sort((a, b) => b[1] - a[1]).slice(0, 8)) lines.push(`  ${ms(us)}  ${name}`);
	return lines.join('\n');
}

/** The build's client manifest (set by the wrapper), to name hashed chunks by their source. */
const sources = new Map<string, string>();
if (process.env.BENCH_CLIENT_MANIFEST && existsSync(process.env.BENCH_CLIENT_MANIFEST)) {
	const m = JSON.parse(readFileSync(process.env.BENCH_CLIENT_MANIFEST, 'utf8')) as Record<string, { file: string; name?: string; src?: string }>;
	for (const [key, v] of Object.entries(m)) sources.set(`/${v.file}`, v.src ?? v.name ?? key);
}
const sourceOf = (path: string) => (sources.has(path) ? `  ← ${sources.get(path)}` : '');

const fmt = (v: number) => `${v.toFixed(2)} ms`;

const browser = await launch();
try {
	const { page } = await tablet(browser, BASE);
	await signIn(page, 'ada');
	const tag = Date.now().toString(36);
	const { id, game } = await setUpBenchGame(page, tag);
	const onTable = game.state.pieces.filter((p) => p.at).length;
	await page.goto(`/games/${id}`);
	await page.getByTestId('board-canvas').waitFor();
	await page.waitForFunction(() => document.querySelector('[data-testid="board-canvas"]')?.getAttribute('data-ready') === 'yes');
	await page.evaluate(() => window.scrollTo(0, 0));

	const cdp = await page.context().newCDPSession(page);
	await cdp.send('Emulation.setCPUThrottlingRate', { rate: THROTTLE });

	// Pick the unit in the move panel (the drag would pick it too), then drag one of its pieces.
	await page.getByRole('button', { name: new RegExp(`^${PIECE.unitName}\\b`) }).click();
	await page.evaluate(() => window.scrollTo(0, 0));

	console.log(`table: ${onTable} pieces on the table (game #${id}), CPU throttled ${THROTTLE}×, ${MOVES} pointer moves a drag, ${RUNS} drags`);
	// The same collector on the page left alone: rAF timestamps are coarsened and the frame clock
	// of a GPU-less headless Chromium wobbles, so some gaps of an idle page read 16.8 ms. What
	// share they take says how near a p95 of 16.7 ms can come at all.
	const idle = await page.evaluate(
		() =>
			new Promise<number[]>((done) => {
				const stamps: number[] = [];
				const tick = (t: number) => {
					stamps.push(t);
					if (stamps.length < 301) requestAnimationFrame(tick);
					else done(stamps.slice(1).map((v, i) => v - stamps[i]));
				};
				requestAnimationFrame(tick);
			})
	);
	const idleSorted = [...idle].sort((a, b) => a - b);
	const over = (gaps: number[], ms: number) => gaps.filter((g) => g > ms).length;
	console.log(
		`  idle page, ${idle.length} frames: p50 ${fmt(pct(idleSorted, 0.5))}, p95 ${fmt(pct(idleSorted, 0.95))}; ` +
			`${over(idle, 16.75)} gaps over 16.75 ms (${((100 * over(idle, 16.75)) / idle.length).toFixed(1)} %), ${over(idle, 25)} over 25 ms`
	);
	const all: number[] = [];
	let long: number[] = [];
	for (let run = 1; run <= RUNS; run++) {
		const r = await dragOnce(page);
		const sorted = [...r.gaps].sort((a, b) => a - b);
		console.log(
			`  drag ${run}: ${r.gaps.length} frames, p50 ${fmt(pct(sorted, 0.5))}, p95 ${fmt(pct(sorted, 0.95))}, max ${fmt(sorted[sorted.length - 1])}; ` +
				`long frames (> 50 ms): ${r.longFrames.length}; readout: ${r.readout.split('\n')[0]}`
		);
		if (!r.readout.includes(`${PIECE.id}:`)) throw new Error(`the drag did not reach the live check (readout: "${r.readout}")`);
		all.push(...r.gaps);
		long = long.concat(r.longFrames);
		// back to the start for the next drag
		await page.getByRole('button', { name: 'Reset' }).click();
		await page.evaluate(() => window.scrollTo(0, 0));
	}
	const sorted = all.sort((a, b) => a - b);
	const p95 = pct(sorted, 0.95);
	const missed = sorted.filter((g) => g > 1.5 * (1000 / 60)).length;
	console.log(
		`frame time while dragging (all drags, ${sorted.length} frames): p50 ${fmt(pct(sorted, 0.5))}, p95 ${fmt(p95)}, max ${fmt(sorted[sorted.length - 1])}; ` +
			`${missed} frames over 25 ms; ${long.length} long animation frames${long.length ? ` (longest ${fmt(Math.max(...long))})` : ''}`
	);
	// the verdict compares the figure as measured, to the hundredth (a gap of 16.7000001 ms is 16.70)
	console.log(`target p95 ≤ ${TARGET_MS} ms: ${Number(p95.toFixed(2)) <= TARGET_MS ? 'met' : 'NOT met'}`);
	// The same gaps counted in display intervals. rAF fires once per interval of the frame clock
	// (the idle page's median gap), and its timestamps are coarsened, so one interval reads
	// 16.6-16.8 ms; a gap counts as n intervals when it is more than n-1 intervals and 5 % (about
	// 0.8 ms: a 17.6 ms gap is two), so only the clock's own wobble is forgiven, never a late frame.
	const interval = pct(idleSorted, 0.5);
	const intervals = sorted.map((g) => Math.max(1, Math.ceil(g / interval - 0.05)));
	const p95Intervals = pct([...intervals].sort((a, b) => a - b), 0.95);
	const oneInterval = intervals.filter((n) => n === 1).length;
	console.log(
		`in display intervals of ${fmt(interval)} (the idle page's median gap): p95 ${p95Intervals} interval${p95Intervals === 1 ? '' : 's'} = ${fmt(p95Intervals * (1000 / 60))} at 60 Hz; ` +
			`${oneInterval} of ${intervals.length} frames (${((100 * oneInterval) / intervals.length).toFixed(1)} %) within one; ` +
			`target p95 ≤ ${TARGET_MS} ms read so: ${p95Intervals === 1 ? 'met' : 'NOT met'}`
	);
	// the issue's other reading of the same target: frames that took two frame intervals or more
	const share = (100 * missed) / sorted.length;
	console.log(`frames over 25 ms (two frame intervals or more): ${share.toFixed(1)} % of frames; fewer than 5 %: ${share < 5 ? 'met' : 'NOT met'}`);

	// Where the main thread's time goes: one more drag (not counted above) under the sampling
	// profiler, self time summed by script (named by the build's client manifest when known).
	await cdp.send('Profiler.enable');
	await cdp.send('Profiler.setSamplingInterval', { interval: 500 });
	await cdp.send('Profiler.start');
	await dragOnce(page);
	const { profile } = await cdp.send('Profiler.stop');
	const selfUs = new Map<string, number>();
	const byId = new Map(profile.nodes.map((n) => [n.id, n]));
	profile.samples!.forEach((nodeId, i) => {
		const n = byId.get(nodeId)!;
		const url = n.callFrame.url ? new URL(n.callFrame.url, BASE).pathname : n.callFrame.functionName || '(native)';
		selfUs.set(url, (selfUs.get(url) ?? 0) + (profile.timeDeltas![i] ?? 0));
	});
	const total = [...selfUs.values()].reduce((a, b) => a + b, 0);
	console.log('main-thread time during a profiled drag, by script (self time):');
	for (const [where, us] of [...selfUs].sort((a, b) => b[1] - a[1]).slice(0, 8)) {
		console.log(`  ${((100 * us) / total).toFixed(1).padStart(5)} %  ${(us / 1000).toFixed(0).padStart(6)} ms  ${where}${sourceOf(where)}`);
	}
	// The same samples by function: self time, and total time (the function or anything it
	// called; a function on the stack twice counts once), named by script and line:column.
	const parent = new Map<number, number>();
	for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
	const fnName = (id: number) => {
		const f = byId.get(id)!.callFrame;
		const file = f.url ? new URL(f.url, BASE).pathname.split('/').pop() : '';
		return `${f.functionName || '(anonymous)'}${file ? ` ${file}:${f.lineNumber + 1}:${f.columnNumber + 1}` : ''}`;
	};
	const fnSelf = new Map<string, number>();
	const fnTotal = new Map<string, number>();
	profile.samples!.forEach((nodeId, i) => {
		const dt = profile.timeDeltas![i] ?? 0;
		const own = fnName(nodeId);
		fnSelf.set(own, (fnSelf.get(own) ?? 0) + dt);
		const onStack = new Set<string>();
		for (let id: number | undefined = nodeId; id !== undefined; id = parent.get(id)) onStack.add(fnName(id));
		for (const f of onStack) fnTotal.set(f, (fnTotal.get(f) ?? 0) + dt);
	});
	const row = (f: string, us: number) => `  ${((100 * us) / total).toFixed(1).padStart(5)} %  ${(us / 1000).toFixed(0).padStart(6)} ms  ${f}`;
	console.log('  by function, self time (top 14):');
	for (const [f, us] of [...fnSelf].sort((a, b) => b[1] - a[1]).slice(0, 14)) console.log(row(f, us));
	console.log('  by function, total time (top 20, without the root and idle):');
	for (const [f, us] of [...fnTotal].filter(([f]) => !/^\((root|idle|program)\)/.test(f)).sort((a, b) => b[1] - a[1]).slice(0, 20)) console.log(row(f, us));

	// What the sampling profiler cannot split — style, layout, paint, canvas work, garbage
	// collection — a DevTools trace of one more drag can: self time by trace event on the page's
	// main thread, by kind, and what the longest main-thread tasks were made of.
	console.log(summariseTrace(await traceDrag(page, cdp)));
} finally {
	await browser.close();
}
