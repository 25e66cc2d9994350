// The one-tablet test game shared by the rules, live-check and reach tests: both rosters of
// fixtures.ts chosen, A's Lantern Guard in a row at y 6 (x 10, 12, 14) with its Beacon Crew alone
// at (20, 6), B's hounds at y 54, both deployments ended — round 1, side A to move.
import { chooseRoster, deploy, endTurn, initialState, type Ctx, type StepResult } from '$lib/board/play/rules';
import type { GameState, Side } from '$lib/schemas/game';
import { LAYOUT, PROFILE, UNITS_A, UNITS_B } from './fixtures';

export function ctx(state: GameState, sides: Side[] = ['a', 'b']): Ctx {
	return { state, layout: LAYOUT, profile: PROFILE, actor: 'u-both', actorSides: sides, nextSeq: 1 };
}

export function ok(r: StepResult): GameState {
	if (!r.ok) throw new Error(`refused: ${r.message}`);
	return r.state;
}

/** The ready game and how many log entries its set-up wrote (tests that count seqs go on from there). */
export function readyWithEntries(): { state: GameState; entries: number } {
	let entries = 0;
	const step = (r: StepResult): GameState => {
		entries += r.ok ? r.entries.length : 0;
		return ok(r);
	};
	let s = initialState('a');
	s = step(chooseRoster(ctx(s), 'a', { id: 1, name: 'A list', units: UNITS_A }));
	s = step(chooseRoster(ctx(s), 'b', { id: 2, name: 'B list', units: UNITS_B }));
	s = step(deploy(ctx(s), 'a', [
		{ piece: 'a-u1-p1', at: { x: 10, y: 6 } },
		{ piece: 'a-u1-p2', at: { x: 12, y: 6 } },
		{ piece: 'a-u1-p3', at: { x: 14, y: 6 } },
		{ piece: 'a-u2-p1', at: { x: 20, y: 6 } }
	]));
	s = step(endTurn(ctx(s)));
	s = step(deploy(ctx(s), 'b', [
		{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } },
		{ piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } }
	]));
	return { state: step(endTurn(ctx(s))), entries };
}

export function ready(): GameState {
	return readyWithEntries().state;
}
