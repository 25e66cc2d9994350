// `npm run bench`: times the engine's checkMove against the JSTS reference on a 300-piece,
// 20-terrain table, and confirms both give the same verdicts and findings on random moves.
import os from 'node:os';
import { checkMove, type CheckRequest } from '../../src/lib/referee/index';
import { referenceCheck, type Finding, type RefReport, type RefRequest } from './reference-check';
import { benchMove, makeTable, randomMove } from './scene';

const TABLE_SEED = 1;
const AGREEMENT_MOVES = 240;
const TARGET_RATIO = 20;
const TARGET_MEDIAN_MS = 1;
/** Not a hard target: the oval figure is reported, aiming at 2 ms or less. */
const AIM_OVAL_MS = 2;

const engine = (req: RefRequest) => checkMove(req as CheckRequest) as unknown as RefReport;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	const n = s.length;
	return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

/** Median wall time of one check, after warm-up runs that let the JIT settle. */
function time(check: (r: RefRequest) => unknown, req: RefRequest, warmup: number, runs: number): number {
	for (let i = 0; i < warmup; i++) check(req);
	const ms: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		check(req);
		ms.push(performance.now() - t0);
	}
	return median(ms);
}

/** Finding codes, each with every piece named under it: what the two checks must agree on. */
export function signature(findings: Finding[]): Record<string, string> {
	const byCode = new Map<string, Set<string>>();
	for (const f of findings) {
		const key = `${f.code}/${f.severity}`;
		if (!byCode.has(key)) byCode.set(key, new Set());
		for (const p of f.pieces) byCode.get(key)!.add(p);
	}
	return Object.fromEntries([...byCode].sort(([a], [b]) => a.localeCompare(b)).map(([k, v]) => [k, [...v].sort().join(',')]));
}

/** Differences between the two reports, as readable lines (none when they agree). */
export function compare(ref: RefReport, eng: RefReport): string[] {
	const out: string[] = [];
	if (ref.verdict !== eng.verdict) out.push(`verdict: reference ${ref.verdict}, engine ${eng.verdict}`);
	const a = signature(ref.findings);
	const b = signature(eng.findings);
	for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) {
		if (a[k] !== b[k]) out.push(`${k}: reference [${a[k] ?? ''}] engine [${b[k] ?? ''}]`);
	}
	// Costs decide over-allowance; a gap here is a disagreement even when no verdict flips yet.
	for (const id of new Set([...Object.keys(ref.pieces), ...Object.keys(eng.pieces)])) {
		const c0 = ref.pieces[id]?.cost;
		const c1 = eng.pieces[id]?.cost;
		if (!(Math.abs(c0 - c1) <= 0.01)) out.push(`cost of ${id}: reference ${c0?.toFixed(4)}, engine ${c1?.toFixed(4)}`);
	}
	return out;
}

function main(): number {
	const table = makeTable({ seed: TABLE_SEED });
	const units = [...new Set(table.pieces.map((p) => p.unit))];
	const size = (u: string) => table.pieces.filter((p) => p.unit === u).length;
	const unit20 = units.find((u) => size(u) === 20)!;
	const unit60 = units.find((u) => size(u) === 60)!;
	const unit1 = units.find((u) => size(u) === 1)!;
	const unitOval = units.find((u) => size(u) === 20 && table.pieces.find((p) => p.unit === u)!.footprint.shape === 'oval')!;
	console.log(`table: ${table.pieces.length} pieces, ${table.board.terrain!.length} terrain pieces, seed ${TABLE_SEED}`);

	const move20 = benchMove(table, unit20, 90);
	const ref20 = referenceCheck(move20);
	const eng20 = engine(move20);
	console.log(`timed move: unit ${unit20} (${size(unit20)} pieces) 3 in by two waypoints; verdicts reference ${ref20.verdict}, engine ${eng20.verdict}`);
	const engMs = time(engine, move20, 300, 1000);
	const refMs = time(referenceCheck, move20, 2, 15);
	const ratio = refMs / engMs;
	console.log(`engine median    ${engMs.toFixed(3)} ms   (1000 runs after 300 warm-up)`);
	console.log(`reference median ${refMs.toFixed(1)} ms   (15 runs after 2 warm-up)`);
	console.log(`ratio            ${ratio.toFixed(1)}x`);
	const ms1 = time(engine, benchMove(table, unit1, 90), 300, 1000);
	const ms60 = time(engine, benchMove(table, unit60, 90), 100, 300);
	const msOval = time(engine, benchMove(table, unitOval, 90), 200, 600);
	console.log(`engine median, 1-piece unit ${unit1}:   ${ms1.toFixed(3)} ms`);
	console.log(`engine median, 60-piece unit ${unit60}: ${ms60.toFixed(3)} ms`);
	console.log(`engine median, 20-piece oval unit ${unitOval}: ${msOval.toFixed(3)} ms (aim ${AIM_OVAL_MS} ms, not a hard target)`);

	let agree = 0;
	const verdicts = { legal: 0, illegal: 0 };
	const codes = new Map<string, number>();
	const disagreements: string[] = [];
	const timedCases: RefRequest[] = [move20];
	for (let i = 0; i < AGREEMENT_MOVES; i++) {
		const req = randomMove(table, units[i % units.length], 10_000 + i);
		timedCases.push(req);
	}
	timedCases.forEach((req, i) => {
		const ref = referenceCheck(req);
		const eng = engine(req);
		verdicts[ref.verdict]++;
		for (const c of new Set(ref.findings.map((f) => f.code))) codes.set(c, (codes.get(c) ?? 0) + 1);
		const diff = compare(ref, eng);
		if (diff.length === 0) {
			agree++;
			return;
		}
		const label = i === 0 ? 'timed move' : `random move seed ${10_000 + i - 1}`;
		disagreements.push(
			[`${label}: unit ${req.move.unit}, ${req.move.kind}`, ...diff.map((d) => `    ${d}`), `    move: ${JSON.stringify(req.move)}`].join('\n')
		);
	});
	console.log(`agreement: ${agree} of ${timedCases.length} moves (the timed move and ${AGREEMENT_MOVES} random ones)`);
	console.log(`verdicts (reference): ${verdicts.legal} legal, ${verdicts.illegal} illegal`);
	console.log(`finding codes seen (moves with each): ${[...codes].sort().map(([c, n]) => `${c} ${n}`).join(', ')}`);
	for (const d of disagreements) console.log(`DISAGREEMENT ${d}`);

	const [load1] = os.loadavg();
	console.log('');
	console.log(`SUMMARY (load average ${load1.toFixed(2)}; medians of one checkMove on the ${table.pieces.length}-piece table)`);
	console.log(`  1-piece unit        ${ms1.toFixed(3)} ms`);
	console.log(`  20-piece round unit ${engMs.toFixed(3)} ms   target <= ${TARGET_MEDIAN_MS} ms: ${engMs <= TARGET_MEDIAN_MS ? 'met' : 'MISSED'}`);
	console.log(`  20-piece oval unit  ${msOval.toFixed(3)} ms   aim <= ${AIM_OVAL_MS} ms: ${msOval <= AIM_OVAL_MS ? 'met' : 'not met'} (not a hard target)`);
	console.log(`  60-piece round unit ${ms60.toFixed(3)} ms`);
	console.log(`  reference / engine  ${ratio.toFixed(1)}x   target >= ${TARGET_RATIO}x: ${ratio >= TARGET_RATIO ? 'met' : 'MISSED'}`);
	console.log(`  agreement           ${agree} of ${timedCases.length} moves, ${disagreements.length} disagreement(s)`);

	const failures: string[] = [];
	if (disagreements.length) failures.push(`${disagreements.length} disagreement(s)`);
	if (agree < 200) failures.push(`only ${agree} agreeing moves, 200 needed`);
	if (ratio < TARGET_RATIO) failures.push(`engine only ${ratio.toFixed(1)}x faster than the reference (target ${TARGET_RATIO}x)`);
	if (engMs > TARGET_MEDIAN_MS) failures.push(`engine median ${engMs.toFixed(3)} ms over the ${TARGET_MEDIAN_MS} ms target`);
	if (failures.length) {
		console.log(`FAILED: ${failures.join('; ')}`);
		return 1;
	}
	console.log('OK: targets met and the two checks agree');
	return 0;
}

process.exitCode = main();
