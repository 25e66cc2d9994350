// The exact state of a game before and after every move-log entry, derived by folding the log
// from the initial state with the table's own rule steps (the same code that wrote it), plus
// the judge desk's rulings; and the comparison of the fold's end with the state the game row
// holds, so a replay that disagrees with the table says so instead of showing a wrong board.
// Pure: runs in the browser (stepping) and on the server (report, ruling, agreement check).
import { accept, deploy, endTurn, initialState, propose, roll, takeBack, type Ctx, type StepResult } from '../play/rules';
import { gamePieceSchema, type GamePiece, type GameState, type Pose, type Side } from '../../schemas/game';
import type { Layout } from '../../schemas/layout';
import type { Profile } from '../../schemas/check';
import { rulingPayloadSchema, type LogEntry } from '../../schemas/ruling';

export interface FoldContext {
	layout: Layout;
	profile: Profile;
	firstSide: Side;
	/**
	 * The pieces' fixed attributes (footprint, class, allowance…), from the game's current state:
	 * a 'roster' entry names the roster but does not copy its units, and rosters may be edited
	 * later. A piece's attributes never change during a game; only its position does.
	 */
	catalogue: readonly GamePiece[];
}

export interface FoldStep {
	entry: LogEntry;
	before: GameState;
	after: GameState;
	/** set when the entry could not be replayed by the rules as recorded */
	problem: string | null;
}

export interface Fold {
	initial: GameState;
	steps: FoldStep[];
	final: GameState;
	problems: { seq: number; message: string }[];
}

const clone = (s: GameState): GameState => structuredClone(s);

function stepCtx(state: GameState, fc: FoldContext, entry: LogEntry): Ctx {
	// Both sides: the fold replays what the server already allowed, it does not judge who may act.
	return { state, layout: fc.layout, profile: fc.profile, actor: entry.actor, actorSides: ['a', 'b'], nextSeq: entry.seq };
}

function outcome(r: StepResult): { state: GameState } | { problem: string } {
	if (r.ok) return { state: r.state };
	return { problem: r.message };
}

function rosterPieces(entry: LogEntry, fc: FoldContext, side: Side): GamePiece[] {
	const listed = entry.payload.pieces;
	if (Array.isArray(listed)) {
		const parsed = listed.map((p) => gamePieceSchema.safeParse(p));
		if (parsed.every((p) => p.success)) return parsed.map((p) => ({ ...p.data!, at: null }));
	}
	return fc.catalogue.filter((p) => p.side === side).map((p) => ({ ...structuredClone(p), at: null }));
}

/** Where the recorded paths put the pieces, applied directly (the fallback when a step refuses). */
function placeRecorded(state: GameState, placements: { piece: string; at: Pose }[]): GameState {
	const next = clone(state);
	for (const pl of placements) {
		const p = next.pieces.find((q) => q.id === pl.piece);
		if (p) p.at = { ...pl.at };
	}
	return next;
}

function applyEntry(state: GameState, entry: LogEntry, fc: FoldContext): { state: GameState; problem: string | null } {
	const p = entry.payload as Record<string, unknown>;
	const ctx = stepCtx(state, fc, entry);
	switch (entry.kind) {
		case 'roster': {
			const side = (entry.side ?? 'a') as Side;
			const next = clone(state);
			next.pieces = [...state.pieces.filter((q) => q.side !== side), ...rosterPieces(entry, fc, side)];
			const sides = new Set(next.pieces.map((q) => q.side));
			if (next.phase === 'setup' && sides.has('a') && sides.has('b')) next.phase = 'deploy';
			return { state: next, problem: null };
		}
		case 'deploy': {
			const placements = (p.placements as { piece: string; at: Pose }[]) ?? [];
			const r = outcome(deploy(ctx, (entry.side ?? state.activeSide) as Side, placements));
			if ('state' in r) return { state: r.state, problem: null };
			return { state: placeRecorded(state, placements), problem: `deployment replayed as recorded: ${r.problem}` };
		}
		case 'roll': {
			const r = outcome(roll(ctx, String(p.unit), Number(p.die)));
			return 'state' in r ? { state: r.state, problem: null } : { state, problem: r.problem };
		}
		case 'move': {
			const r = propose(ctx, {
				seq: entry.seq - 1,
				unit: String(p.unit),
				kind: p.kind as 'hold' | 'move' | 'dash' | 'withdraw',
				paths: (p.paths as Record<string, Pose[]>) ?? {}
			});
			if (r.ok) return { state: r.state, problem: null };
			return { state, problem: `the recorded move does not replay: ${r.message}` };
		}
		case 'refused':
			// Refused moves leave the pieces where they were; only their record matters.
			return { state, problem: null };
		case 'accept': {
			const r = outcome(accept(ctx));
			return 'state' in r ? { state: r.state, problem: null } : { state, problem: r.problem };
		}
		case 'take-back': {
			const r = outcome(takeBack(ctx));
			return 'state' in r ? { state: r.state, problem: null } : { state, problem: r.problem };
		}
		case 'ruling-request': {
			// Asking about the move awaiting acceptance lets it stand (play goes on); asking about
			// any earlier entry changes nothing on the table.
			if (state.pending && state.pending.seq === Number(p.moveSeq)) {
				const next = clone(state);
				next.pending = null;
				return { state: next, problem: null };
			}
			return { state, problem: null };
		}
		case 'end-turn': {
			const r = outcome(endTurn(ctx));
			return 'state' in r ? { state: r.state, problem: null } : { state, problem: r.problem };
		}
		case 'ruling': {
			const parsed = rulingPayloadSchema.safeParse(p);
			if (!parsed.success) return { state, problem: 'the ruling entry could not be read' };
			return { state: applyRuling(state, parsed.data), problem: null };
		}
		default:
			return { state, problem: `unknown kind of entry "${entry.kind}"` };
	}
}

/** A ruling's effect on the table: the pieces it names go where it says; a settled pending move is no longer pending. */
export function applyRuling(state: GameState, ruling: { changes: { piece: string; to: Pose }[]; settledPending: boolean }): GameState {
	const next = clone(state);
	for (const c of ruling.changes) {
		const piece = next.pieces.find((q) => q.id === c.piece);
		if (piece) piece.at = { ...c.to };
	}
	if (ruling.settledPending) next.pending = null;
	return next;
}

export function foldLog(entries: readonly LogEntry[], fc: FoldContext): Fold {
	const initial = initialState(fc.firstSide);
	const steps: FoldStep[] = [];
	const problems: Fold['problems'] = [];
	let state = initial;
	for (const entry of entries) {
		const { state: after, problem } = applyEntry(state, entry, fc);
		steps.push({ entry, before: state, after, problem });
		if (problem) problems.push({ seq: entry.seq, message: problem });
		state = after;
	}
	return { initial, steps, final: state, problems };
}

/** The state just before the entry with this seq (the initial state for seq 1). */
export function stateBefore(fold: Fold, seq: number): GameState | null {
	return fold.steps.find((s) => s.entry.seq === seq)?.before ?? null;
}

export function stepAt(fold: Fold, seq: number): FoldStep | null {
	return fold.steps.find((s) => s.entry.seq === seq) ?? null;
}

const CLOSE_IN = 1e-9;
const samePose = (a: Pose | null, b: Pose | null) =>
	a === null || b === null
		? a === b
		: Math.abs(a.x - b.x) <= CLOSE_IN && Math.abs(a.y - b.y) <= CLOSE_IN && Math.abs((a.facing ?? 0) - (b.facing ?? 0)) <= CLOSE_IN;

/** Where the fold's end and the stored state differ, in words; empty when they agree. */
export function disagreements(folded: GameState, stored: GameState): string[] {
	const out: string[] = [];
	for (const key of ['phase', 'round', 'activeSide', 'firstSide'] as const) {
		if (folded[key] !== stored[key]) out.push(`${key}: the log gives ${String(folded[key])}, the table holds ${String(stored[key])}`);
	}
	const units = (u: string[]) => [...u].sort().join(', ');
	if (units(folded.movedUnits) !== units(stored.movedUnits)) out.push(`units moved this turn: the log gives [${units(folded.movedUnits)}], the table holds [${units(stored.movedUnits)}]`);
	if ((folded.pending?.seq ?? null) !== (stored.pending?.seq ?? null)) out.push(`move awaiting acceptance: the log gives ${folded.pending ? `#${folded.pending.seq}` : 'none'}, the table holds ${stored.pending ? `#${stored.pending.seq}` : 'none'}`);
	if ((folded.die?.value ?? null) !== (stored.die?.value ?? null)) out.push(`die waiting: the log gives ${folded.die?.value ?? 'none'}, the table holds ${stored.die?.value ?? 'none'}`);
	const storedById = new Map(stored.pieces.map((p) => [p.id, p]));
	for (const p of folded.pieces) {
		const s = storedById.get(p.id);
		if (!s) out.push(`${p.id}: in the log, not on the table`);
		else if (!samePose(p.at, s.at)) out.push(`${p.id}: the log puts it at ${fmtPose(p.at)}, the table at ${fmtPose(s.at)}`);
		storedById.delete(p.id);
	}
	for (const id of storedById.keys()) out.push(`${id}: on the table, not in the log`);
	return out;
}

export const fmtPose = (p: Pose | null) => (p ? `(${p.x.toFixed(2)}, ${p.y.toFixed(2)}) in${p.facing ? `, facing ${p.facing.toFixed(0)}°` : ''}` : 'off the table');
