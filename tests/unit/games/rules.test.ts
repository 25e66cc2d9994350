// The game's state transitions around the referee: rosters → deployment → rounds and turns,
// one move per unit per turn, dash dice, acceptance, take-back, ruling requests and who may act.
// Positions are an invented table (fixtures.ts); distances are hand-worked from them.
import { describe, expect, it } from 'vitest';
import { accept, checkRequestFor, chooseRoster, deploy, endTurn, initialState, liveCheckTable, propose, requestRuling, roll, takeBack, type Ctx, type StepResult } from '$lib/board/play/rules';
import { checkMove } from '$lib/referee';
import type { GameState, Side } from '$lib/schemas/game';
import { LAYOUT, PROFILE, UNITS_A, UNITS_B } from './fixtures';
import { readyWithEntries } from './ready-table';

let seq = 0;
function ctx(state: GameState, sides: Side[] = ['a', 'b'], actor = 'u-both'): Ctx {
	return { state, layout: LAYOUT, profile: PROFILE, actor, actorSides: sides, nextSeq: seq + 1 };
}
function ok(r: StepResult): GameState {
	if (!r.ok) throw new Error(`refused: ${r.message}`);
	seq += r.entries.length;
	return r.state;
}

/** Both rosters chosen, A's unit 1 deployed in a row at y 6, B's unit 1 at y 54, ended both
 * deployments (ready-table.ts); the seq count goes on from the entries that wrote. */
function ready(): GameState {
	const r = readyWithEntries();
	seq = r.entries;
	return r.state;
}

describe('setup and deployment', () => {
	it('enters deployment once both sides have a roster, and logs each choice', () => {
		let s = initialState('a');
		const r = chooseRoster(ctx(s), 'a', { id: 1, name: 'A list', units: UNITS_A });
		expect(r.ok && r.entries[0]).toMatchObject({ kind: 'roster', side: 'a', payload: { rosterId: 1, pieces: 4 } });
		s = ok(r);
		expect(s.phase).toBe('setup');
		s = ok(chooseRoster(ctx(s), 'b', { id: 2, name: 'B list', units: UNITS_B }));
		expect(s.phase).toBe('deploy');
		expect(s.pieces).toHaveLength(9);
	});

	it('refuses a roster for a side the actor does not play (403)', () => {
		const r = chooseRoster(ctx(initialState('a'), ['a'], 'u-a'), 'b', { id: 2, name: 'B', units: UNITS_B });
		expect(r).toMatchObject({ ok: false, status: 403 });
	});

	it('refuses a piece outside its zone, off the table, or on another piece (422), and a turn out of order (403)', () => {
		seq = 0;
		let s = ok(chooseRoster(ctx(initialState('a')), 'a', { id: 1, name: 'A', units: UNITS_A }));
		s = ok(chooseRoster(ctx(s), 'b', { id: 2, name: 'B', units: UNITS_B }));
		// y 11.5 puts the 32 mm base's edge 0.13 in beyond the zone's 12 in line.
		expect(deploy(ctx(s), 'a', [{ piece: 'a-u1-p1', at: { x: 10, y: 11.5 } }])).toMatchObject({ ok: false, status: 422 });
		expect(deploy(ctx(s), 'a', [{ piece: 'a-u1-p1', at: { x: 10, y: 11.3 } }]).ok).toBe(true);
		expect(deploy(ctx(s), 'a', [{ piece: 'a-u1-p1', at: { x: 0.2, y: 6 } }])).toMatchObject({ ok: false, status: 422 });
		const stacked = deploy(ctx(s), 'a', [
			{ piece: 'a-u1-p1', at: { x: 10, y: 6 } },
			{ piece: 'a-u1-p2', at: { x: 10.5, y: 6 } }
		]);
		expect(stacked).toMatchObject({ ok: false, status: 422 });
		expect(!stacked.ok && stacked.message).toMatch(/would stand on/);
		expect(deploy(ctx(s), 'b', [{ piece: 'b-u1-p1', at: { x: 10, y: 54 } }])).toMatchObject({ ok: false, status: 403 });
		expect(deploy(ctx(s), 'a', [{ piece: 'b-u1-p1', at: { x: 10, y: 6 } }])).toMatchObject({ ok: false, status: 400 });
	});

	it('after both deployments, round 1 begins with the first side active', () => {
		const s = ready();
		expect(s).toMatchObject({ phase: 'move', round: 1, activeSide: 'a', movedUnits: [] });
	});
});

describe('movement', () => {
	it('a legal move moves the pieces and waits for acceptance; the unit cannot move again this turn', () => {
		let s = ready();
		const r = propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 11 }], 'a-u1-p2': [{ x: 12, y: 11 }], 'a-u1-p3': [{ x: 14, y: 11 }] } });
		expect(r.ok).toBe(true);
		s = ok(r);
		expect(s.pieces.find((p) => p.id === 'a-u1-p2')!.at).toMatchObject({ x: 12, y: 11 });
		expect(s.pending).toMatchObject({ unit: 'a-u1', side: 'a', before: { 'a-u1-p2': { x: 12, y: 6 } } });
		expect(s.summaries).not.toBeNull();
		// A second move waits for the first to be accepted…
		expect(propose(ctx(s), { seq, unit: 'a-u2', kind: 'hold' })).toMatchObject({ ok: false, status: 409 });
		s = ok(accept(ctx(s, ['b'], 'u-b')));
		expect(s.pending).toBeNull();
		// …and the same unit never moves twice in one turn.
		const again = propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 12 }] } });
		expect(again).toMatchObject({ ok: false, status: 409 });
		expect(!again.ok && again.message).toMatch(/moved already/);
	});

	it('an illegal move is refused with the findings and logged as refused, the pieces staying put', () => {
		const s = ready();
		// 9 in for a 6 in allowance (hand-worked: y 6 → 15).
		const r = propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 15 }] } });
		expect(r.ok).toBe(false);
		if (r.ok || !('entries' in r)) throw new Error('expected a logged refusal');
		expect(r.status).toBe(422);
		expect(r.entries[0].kind).toBe('refused');
		expect(r.report.findings.map((f) => f.code)).toContain('over-allowance');
		expect(r.state.pieces.find((p) => p.id === 'a-u1-p1')!.at).toMatchObject({ x: 10, y: 6 });
		expect(r.state.movedUnits).toEqual([]);
	});

	it('only the active side moves (403), and the opponent, not the mover, accepts', () => {
		let s = ready();
		expect(propose(ctx(s, ['b'], 'u-b'), { seq, unit: 'b-u1', kind: 'hold' })).toMatchObject({ ok: false, status: 403 });
		expect(propose(ctx(s, ['a'], 'u-a'), { seq, unit: 'b-u1', kind: 'hold' })).toMatchObject({ ok: false, status: 403 });
		s = ok(propose(ctx(s, ['a'], 'u-a'), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 8 }] } }));
		expect(accept(ctx(s, ['a'], 'u-a'))).toMatchObject({ ok: false, status: 403 });
		expect(takeBack(ctx(s, ['b'], 'u-b'))).toMatchObject({ ok: false, status: 403 });
	});

	it('a take-back restores the positions, frees the unit and is itself an entry', () => {
		let s = ready();
		s = ok(propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 8 }] } }));
		const r = takeBack(ctx(s, ['a'], 'u-a'));
		expect(r.ok && r.entries[0]).toMatchObject({ kind: 'take-back', payload: { unit: 'a-u1' } });
		s = ok(r);
		expect(s.pieces.find((p) => p.id === 'a-u1-p1')!.at).toMatchObject({ x: 10, y: 6 });
		expect(s.movedUnits).toEqual([]);
		expect(s.pending).toBeNull();
		expect(accept(ctx(s))).toMatchObject({ ok: false, status: 409 });
	});

	it('a dash needs the server die first; the die is logged, spent by the dash, and survives a take-back', () => {
		let s = ready();
		expect(propose(ctx(s), { seq, unit: 'a-u1', kind: 'dash', paths: {} })).toMatchObject({ ok: false, status: 409 });
		const rolled = roll(ctx(s), 'a-u1', 3);
		expect(rolled.ok && rolled.entries[0]).toMatchObject({ kind: 'roll', payload: { unit: 'a-u1', die: 3 } });
		s = ok(rolled);
		expect(roll(ctx(s), 'a-u1', 5)).toMatchObject({ ok: false, status: 409 });
		expect(propose(ctx(s), { seq, unit: 'a-u2', kind: 'move', paths: {} })).toMatchObject({ ok: false, status: 409 });
		// 8 in on 6 + 3: legal as a dash.
		const dash = propose(ctx(s), { seq, unit: 'a-u1', kind: 'dash', paths: { 'a-u1-p1': [{ x: 10, y: 14 }], 'a-u1-p2': [{ x: 12, y: 14 }], 'a-u1-p3': [{ x: 14, y: 14 }] } });
		expect(dash.ok && dash.entries[0].payload).toMatchObject({ kind: 'dash', die: 3 });
		s = ok(dash);
		expect(s.die).toBeNull();
		s = ok(takeBack(ctx(s)));
		expect(s.die).toMatchObject({ unit: 'a-u1', value: 3 });
	});

	it('a ruling request records the note and lets play go on', () => {
		let s = ready();
		s = ok(propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 8 }] } }));
		const r = requestRuling(ctx(s, ['b'], 'u-b'), 'was the base clear of the crate?');
		expect(r.ok && r.entries[0]).toMatchObject({ kind: 'ruling-request', payload: { note: 'was the base clear of the crate?' } });
		s = ok(r);
		expect(s.pending).toBeNull();
		expect(takeBack(ctx(s))).toMatchObject({ ok: false, status: 409 });
	});

	it('end turn passes to the other side, then the round advances; not while a move waits', () => {
		let s = ready();
		s = ok(propose(ctx(s), { seq, unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 8 }] } }));
		expect(endTurn(ctx(s))).toMatchObject({ ok: false, status: 409 });
		s = ok(accept(ctx(s)));
		expect(endTurn(ctx(s, ['b'], 'u-b'))).toMatchObject({ ok: false, status: 403 });
		s = ok(endTurn(ctx(s)));
		expect(s).toMatchObject({ round: 1, activeSide: 'b', movedUnits: [] });
		s = ok(endTurn(ctx(s)));
		expect(s).toMatchObject({ round: 2, activeSide: 'a' });
		// a-u1 may move again in the new round
		expect(propose(ctx(s), { seq, unit: 'a-u1', kind: 'hold' }).ok).toBe(true);
	});
});

describe('the live check table', () => {
	// a-u2-p1 (Beacon Crew) is a ring source 6 in from its edge; a-u1 stands 6–10 in from it.
	const moves: { unit: string; kind: 'move'; paths: Record<string, { x: number; y: number }[]> }[] = [
		{ unit: 'a-u1', kind: 'move' as const, paths: { 'a-u1-p1': [{ x: 10, y: 10 }], 'a-u1-p2': [{ x: 12, y: 10 }], 'a-u1-p3': [{ x: 14, y: 10 }] } },
		{ unit: 'a-u1', kind: 'move' as const, paths: { 'a-u1-p1': [{ x: 2, y: 6 }] } },
		{ unit: 'a-u1', kind: 'move' as const, paths: { 'a-u1-p3': [{ x: 14, y: 20 }] } },
		{ unit: 'a-u2', kind: 'move' as const, paths: { 'a-u2-p1': [{ x: 30, y: 9 }] } }
	];

	it('gives the same findings, costs and verdict as the whole request, without the ring summary', () => {
		const s = ready();
		const table = liveCheckTable(LAYOUT, PROFILE, s.pieces);
		expect(table.pieces.some((p) => p.ring)).toBe(false);
		let sawRings = false;
		for (const move of moves) {
			const full = checkMove(checkRequestFor(LAYOUT, PROFILE, s.pieces, move));
			const live = checkMove({ ...table, move });
			expect(live.verdict).toBe(full.verdict);
			expect(live.findings).toEqual(full.findings);
			expect(live.pieces).toEqual(full.pieces);
			expect(live.summaries.objectives).toEqual(full.summaries.objectives);
			expect(live.summaries.rings).toEqual([]);
			sawRings ||= full.summaries.rings.length > 0;
		}
		// the whole request does carry the ring, so the comparison above is not empty-handed
		expect(sawRings).toBe(true);
		// and at least one move of the list is illegal (the third: 14 in for a 6 in allowance)
		expect(moves.map((m) => checkMove({ ...table, move: m }).verdict)).toContain('illegal');
	});
});
