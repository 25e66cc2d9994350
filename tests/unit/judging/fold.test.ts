// Folding the move log gives the exact state before and after every entry, and the planner of
// rulings works out what uphold, overturn and adjust do. The game is played with the table's own
// rule steps (as the server does), on the invented test table and rosters of the game tests.
import { describe, expect, it } from 'vitest';
import { chooseRoster, deploy, endTurn, initialState, propose, requestRuling, type Ctx, type StepResult } from '$lib/board/play/rules';
import type { GameState } from '$lib/schemas/game';
import type { LogEntry } from '$lib/schemas/ruling';
import { applyRuling, disagreements, foldLog, stateBefore } from '$lib/board/replay/fold';
import { loggedMove, measureMove, compareReports } from '$lib/board/replay/measure';
import { planRuling } from '$lib/board/replay/ruling';
import { LAYOUT, PROFILE, UNITS_A, UNITS_B } from '../games/fixtures';

/** Plays steps like the server's `act`: each appended entry gets the next seq. */
function table() {
	let state: GameState = initialState('a');
	const log: LogEntry[] = [];
	const run = (step: (ctx: Ctx) => StepResult) => {
		const r = step({ state, layout: LAYOUT, profile: PROFILE, actor: 'u-a', actorSides: ['a', 'b'], nextSeq: log.length + 1 });
		if (!r.ok && !('entries' in r)) throw new Error(r.message);
		for (const e of r.entries) {
			log.push({ seq: log.length + 1, kind: e.kind, actor: 'u-a', actorName: 'A', side: e.side, round: r.state.round, payload: e.payload, report: e.report ?? null, createdAt: new Date(0).toISOString() });
		}
		state = r.state;
		return r;
	};
	return { run, log, get state() { return state; }, set state(s: GameState) { state = s; } };
}

function playedGame() {
	const t = table();
	t.run((c) => chooseRoster(c, 'a', { id: 1, name: 'A list', units: UNITS_A }));
	t.run((c) => chooseRoster(c, 'b', { id: 2, name: 'B list', units: UNITS_B }));
	t.run((c) => deploy(c, 'a', [{ piece: 'a-u1-p1', at: { x: 10, y: 6 } }, { piece: 'a-u1-p2', at: { x: 12, y: 6 } }, { piece: 'a-u1-p3', at: { x: 14, y: 6 } }, { piece: 'a-u2-p1', at: { x: 20, y: 6 } }]));
	t.run((c) => endTurn(c));
	t.run((c) => deploy(c, 'b', [{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } }, { piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } }]));
	t.run((c) => endTurn(c));
	// 9 in against a 6 in allowance: refused and logged.
	t.run((c) => propose(c, { seq: 0, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 15 }], 'a-u1-p2': [{ x: 12, y: 15 }], 'a-u1-p3': [{ x: 14, y: 15 }] } }));
	// 5 in forward: legal, pending.
	t.run((c) => propose(c, { seq: 0, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 11 }], 'a-u1-p2': [{ x: 12, y: 11 }], 'a-u1-p3': [{ x: 14, y: 11 }] } }));
	t.run((c) => requestRuling(c, 'too far?'));
	return t;
}

describe('folding the move log', () => {
	it('replays every entry and ends exactly at the state the steps produced', () => {
		const t = playedGame();
		const fold = foldLog(t.log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: t.state.pieces });
		expect(fold.problems).toEqual([]);
		expect(disagreements(fold.final, t.state)).toEqual([]);
		expect(fold.steps).toHaveLength(t.log.length);
	});

	it('shows the state before and after a move: the pieces start at the deployment and end 5 in on', () => {
		const t = playedGame();
		const fold = foldLog(t.log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: t.state.pieces });
		const moveSeq = t.log.find((e) => e.kind === 'move')!.seq;
		const step = fold.steps.find((s) => s.entry.seq === moveSeq)!;
		expect(step.before.pieces.find((p) => p.id === 'a-u1-p2')!.at).toMatchObject({ x: 12, y: 6 });
		expect(step.after.pieces.find((p) => p.id === 'a-u1-p2')!.at).toMatchObject({ x: 12, y: 11 });
		expect(step.after.pending?.seq).toBe(moveSeq);
		// The refused entry before it changed nothing.
		const refused = fold.steps.find((s) => s.entry.kind === 'refused')!;
		expect(disagreements(refused.after, refused.before)).toEqual([]);
	});

	it('reports a disagreement when the stored state is not what the log gives', () => {
		const t = playedGame();
		const tampered = structuredClone(t.state);
		tampered.pieces.find((p) => p.id === 'a-u1-p1')!.at = { x: 30, y: 30, facing: 0 };
		const fold = foldLog(t.log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: t.state.pieces });
		const d = disagreements(fold.final, tampered);
		expect(d).toHaveLength(1);
		expect(d[0]).toMatch(/a-u1-p1/);
	});
});

describe('measuring a logged move', () => {
	it('re-runs the engine from the logged state and agrees with the recorded report; costs are the path lengths', () => {
		const t = playedGame();
		const fold = foldLog(t.log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: t.state.pieces });
		const entry = t.log.find((e) => e.kind === 'move')!;
		const lm = loggedMove(entry)!;
		const m = measureMove(LAYOUT, PROFILE, stateBefore(fold, entry.seq)!, lm, lm.recorded);
		expect(m.differences).toEqual([]);
		// 5 in straight ahead (hand-worked: from y 6 to y 11).
		for (const p of m.pieces.filter((q) => q.id.startsWith('a-u1-p'))) expect(p.costIn).toBeCloseTo(5, 9);
		// Nearest enemy of a-u1-p1 (32 mm, at 10,11) is b-u1-p1 (60×35 mm oval facing 270 at 10,54):
		// centre gap 43 in minus 16 mm and 30 mm (half the oval's length along the line) = 43 − 46/25.4.
		const p1 = m.pieces.find((p) => p.id === 'a-u1-p1')!;
		expect(p1.nearestEnemy!.id).toBe('b-u1-p1');
		expect(p1.nearestEnemy!.distanceIn).toBeCloseTo(43 - 46 / 25.4, 2);
		// Pieces 2 in apart centre to centre with 32 mm bases: 2 − 32/25.4 ≈ 0.74 in, within spacing.
		const link = m.spacing.find((s) => s.from === 'a-u1-p1' && s.to === 'a-u1-p2')!;
		expect(link.within).toBe(true);
		expect(link.distanceIn).toBeCloseTo(2 - 32 / 25.4, 9);
	});

	it('says how a recorded report differs from the live one', () => {
		const t = playedGame();
		const entry = t.log.find((e) => e.kind === 'move')!;
		const forged = structuredClone(entry.report!);
		forged.verdict = 'illegal';
		forged.pieces['a-u1-p1'].cost = 4;
		const d = compareReports(entry.report!, forged);
		expect(d.some((x) => /verdict/.test(x))).toBe(true);
		expect(d.some((x) => /a-u1-p1: cost 4.00 in then, 5.00 in now/.test(x))).toBe(true);
	});
});

describe('planning a ruling', () => {
	function setup() {
		const t = playedGame();
		const fold = foldLog(t.log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: t.state.pieces });
		const entry = t.log.find((e) => e.kind === 'move')!;
		const refused = t.log.find((e) => e.kind === 'refused')!;
		return { t, fold, entry, refused };
	}
	const base = (s: ReturnType<typeof setup>, seq: number) => ({ layout: LAYOUT, profile: PROFILE, before: stateBefore(s.fold, seq)!, current: s.t.state, moveSeq: seq, allowIllegal: false });

	it('uphold moves nothing', () => {
		const s = setup();
		const r = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'uphold' });
		expect(r.ok && r.plan.changes).toEqual([]);
	});

	it('overturning a move puts its pieces back where they stood before it', () => {
		const s = setup();
		const r = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'overturn' });
		if (!r.ok) throw new Error(r.message);
		expect(r.plan.changes.map((c) => [c.piece, c.to.y])).toEqual([['a-u1-p1', 6], ['a-u1-p2', 6], ['a-u1-p3', 6]]);
		const after = applyRuling(s.t.state, r.plan);
		expect(after.pieces.find((p) => p.id === 'a-u1-p3')!.at).toMatchObject({ x: 14, y: 6 });
	});

	it('an adjustment is checked by the engine along the logged route with its end corrected', () => {
		const s = setup();
		const r = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'adjust', positions: { 'a-u1-p1': { x: 10, y: 10 } } });
		if (!r.ok) throw new Error(r.message);
		expect(r.plan.report!.verdict).toBe('legal');
		expect(r.plan.report!.pieces['a-u1-p1'].cost).toBeCloseTo(4, 9);
		expect(r.plan.changes).toEqual([{ piece: 'a-u1-p1', from: { x: 10, y: 11, facing: 0 }, to: { x: 10, y: 10, facing: 0 } }]);
	});

	it('an illegal adjustment is refused with the report unless the judge allows it', () => {
		const s = setup();
		const positions = { 'a-u1-p1': { x: 10, y: 14 } }; // 8 in against 6
		const refused = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'adjust', positions });
		expect(refused.ok).toBe(false);
		if (!refused.ok) {
			expect(refused.status).toBe(422);
			expect(refused.report!.findings.map((f) => f.code)).toContain('over-allowance');
		}
		const allowed = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'adjust', positions, allowIllegal: true });
		expect(allowed.ok && allowed.plan.allowsIllegal).toBe(true);
	});

	it('overturning a refusal allows the move as proposed', () => {
		const s = setup();
		const r = planRuling({ ...base(s, s.refused.seq), move: loggedMove(s.refused), outcome: 'overturn' });
		if (!r.ok) throw new Error(r.message);
		expect(r.plan.allowsIllegal).toBe(true);
		expect(r.plan.ruled['a-u1-p1']).toMatchObject({ x: 10, y: 15 });
	});

	it('only moves can be overturned or adjusted', () => {
		const s = setup();
		const deployEntry = s.t.log.find((e) => e.kind === 'deploy')!;
		const r = planRuling({ ...base(s, deployEntry.seq), move: loggedMove(deployEntry), outcome: 'overturn' });
		expect(r.ok).toBe(false);
	});

	it('the fold replays a ruling entry: positions change from that point on', () => {
		const s = setup();
		const r = planRuling({ ...base(s, s.entry.seq), move: loggedMove(s.entry), outcome: 'adjust', positions: { 'a-u1-p1': { x: 10, y: 10 } } });
		if (!r.ok) throw new Error(r.message);
		const payload = { requestId: 1, moveSeq: s.entry.seq, outcome: 'adjust', reason: 'r', allowIllegal: false, ruled: r.plan.ruled, changes: r.plan.changes, settledPending: false, judge: { id: 'j', name: 'J' }, signedAt: new Date(0).toISOString() };
		const log: LogEntry[] = [...s.t.log, { seq: s.t.log.length + 1, kind: 'ruling', actor: 'j', actorName: 'J', side: null, round: 1, payload, report: r.plan.report, createdAt: new Date(0).toISOString() }];
		const fold = foldLog(log, { layout: LAYOUT, profile: PROFILE, firstSide: 'a', catalogue: s.t.state.pieces });
		expect(fold.problems).toEqual([]);
		expect(fold.final.pieces.find((p) => p.id === 'a-u1-p1')!.at).toMatchObject({ x: 10, y: 10 });
		expect(stateBefore(fold, log.length)!.pieces.find((p) => p.id === 'a-u1-p1')!.at).toMatchObject({ x: 10, y: 11 });
		expect(disagreements(fold.final, applyRuling(s.t.state, payload))).toEqual([]);
	});
});

