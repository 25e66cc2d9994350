// The game's own rules around the referee's check: who may act when, what each action does to
// the state kept in the game row, and which move-log entries it writes. Pure `step(state) →
// next` functions: the server runs them inside the locked transaction, the tests run them bare.
import { checkMove, endPose } from '../../referee';
import { checkRequestSchema, type CheckReport, type CheckRequest, type Profile } from '../../schemas/check';
import type { Layout } from '../../schemas/layout';
import type { Unit } from '../../schemas/roster';
import { otherSide, type GamePiece, type GameState, type MoveLogKind, type Pose, type ProposeMove, type Side } from '../../schemas/game';
import { expandRoster } from './pieces';
import { checkRequestFor } from './check-request';
import { boardRing, footprintInside, overlaps } from './zone';

export { checkRequestFor, liveCheckTable } from './check-request';

/** A log entry a step wants appended (the server gives it its seq). */
export interface NewEntry {
	kind: MoveLogKind;
	side: Side | null;
	payload: Record<string, unknown>;
	report?: CheckReport | null;
}

/** Who is acting, on what game. */
export interface Ctx {
	state: GameState;
	layout: Layout;
	profile: Profile;
	actor: string;
	/** the sides the actor plays (both when one tablet is shared) */
	actorSides: Side[];
	/** the seq the next appended entry will get */
	nextSeq: number;
}

export type Refusal = { ok: false; status: 400 | 403 | 409 | 422; message: string; issues?: unknown[] };
/** `status` 422 with entries: refused by the rules, and the refusal itself is logged. */
export type Outcome =
	| { ok: true; state: GameState; entries: NewEntry[]; report?: CheckReport }
	| { ok: false; status: 422; state: GameState; entries: NewEntry[]; report: CheckReport; message: string };
export type StepResult = Outcome | Refusal;

const refuse = (status: Refusal['status'], message: string, issues?: unknown[]): Refusal => ({ ok: false, status, message, issues });

export function initialState(firstSide: Side = 'a'): GameState {
	return {
		phase: 'setup',
		round: 0,
		activeSide: firstSide,
		firstSide,
		pieces: [],
		movedUnits: [],
		pending: null,
		die: null,
		summaries: null
	};
}

const clone = (s: GameState): GameState => structuredClone(s);
const sideName = (s: Side) => (s === 'a' ? 'side A' : 'side B');

function mustPlay(ctx: Ctx, side: Side): Refusal | null {
	if (!ctx.actorSides.includes(side)) return refuse(403, `Only the player of ${sideName(side)} may do that`);
	return null;
}

// ---------------------------------------------------------------------------------------------
// Setup: rosters

/** A side's roster becomes its pieces (all waiting in the roster panel). */
export function chooseRoster(ctx: Ctx, side: Side, roster: { id: number; name: string; units: Unit[] }): StepResult {
	const denied = mustPlay(ctx, side);
	if (denied) return denied;
	const s = ctx.state;
	if (s.phase === 'move') return refuse(409, 'Rosters are chosen before the first round');
	if (s.pieces.some((p) => p.side === side && p.at)) {
		return refuse(409, `${sideName(side)} has deployed already; its roster can no longer change`);
	}
	if (roster.units.length === 0) return refuse(400, 'That roster has no units');
	const next = clone(s);
	next.pieces = [...s.pieces.filter((p) => p.side !== side), ...expandRoster(side, roster.units)];
	const sides = new Set(next.pieces.map((p) => p.side));
	if (next.phase === 'setup' && sides.has('a') && sides.has('b')) next.phase = 'deploy';
	return {
		ok: true,
		state: next,
		entries: [
			{
				kind: 'roster',
				side,
				payload: { rosterId: roster.id, rosterName: roster.name, units: roster.units.length, pieces: next.pieces.filter((p) => p.side === side).length }
			}
		]
	};
}

// ---------------------------------------------------------------------------------------------
// Deployment

/** The outlines a side may deploy into: its zones, or the whole table when it has none. */
export function deploymentRings(layout: Layout, side: Side): [number, number][][] {
	const zones = layout.zones.filter((z) => z.side === side).map((z) => z.outline.map(([x, y]) => [x, y] as [number, number]));
	return zones.length ? zones : [boardRing(layout.board)];
}

/** Why a piece may not stand at `at` during deployment, or null when it may. */
export function deploymentProblem(layout: Layout, profile: Profile, pieces: readonly GamePiece[], piece: GamePiece, at: Pose): string | null {
	const tol = profile.tolerance;
	if (!footprintInside(piece.footprint, at, boardRing(layout.board), tol)) return `${piece.id} would stand off the table`;
	if (!deploymentRings(layout, piece.side).some((ring) => footprintInside(piece.footprint, at, ring, tol))) {
		return `${piece.id} must stand wholly inside a deployment zone of ${sideName(piece.side)}`;
	}
	for (const other of pieces) {
		if (other.id === piece.id || !other.at) continue;
		if (overlaps(piece.footprint, at, other.footprint, other.at, tol)) return `${piece.id} would stand on ${other.id}`;
	}
	return null;
}

/** Puts pieces of the deploying side on the table (or moves them within the zone again). */
export function deploy(ctx: Ctx, side: Side, placements: { piece: string; at: Pose }[]): StepResult {
	const denied = mustPlay(ctx, side);
	if (denied) return denied;
	const s = ctx.state;
	if (s.phase !== 'deploy') return refuse(409, s.phase === 'setup' ? 'Both sides choose a roster before deployment' : 'Deployment is over');
	if (s.activeSide !== side) return refuse(403, `${sideName(s.activeSide)} is deploying now`);
	const next = clone(s);
	const byId = new Map(next.pieces.map((p) => [p.id, p]));
	const seen = new Set<string>();
	for (const pl of placements) {
		const piece = byId.get(pl.piece);
		if (!piece || piece.side !== side) return refuse(400, `"${pl.piece}" is not a piece of ${sideName(side)}`);
		if (seen.has(pl.piece)) return refuse(400, `"${pl.piece}" is placed twice`);
		seen.add(pl.piece);
		piece.at = { x: pl.at.x, y: pl.at.y, facing: pl.at.facing ?? piece.at?.facing ?? 0 };
	}
	// Checked after all placements land, so a whole unit can be put down (or shuffled) at once.
	const problems: string[] = [];
	for (const id of seen) {
		const piece = byId.get(id)!;
		const problem = deploymentProblem(ctx.layout, ctx.profile, next.pieces, piece, piece.at!);
		if (problem) problems.push(problem);
	}
	if (problems.length) {
		return refuse(
			422,
			problems[0],
			problems.map((m) => ({ path: ['placements'], message: m }))
		);
	}
	return {
		ok: true,
		state: next,
		entries: [{ kind: 'deploy', side, payload: { placements: placements.map((p) => ({ piece: p.piece, at: byId.get(p.piece)!.at })) } }]
	};
}

// ---------------------------------------------------------------------------------------------
// Movement

function unitPieces(s: GameState, unit: string): GamePiece[] {
	return s.pieces.filter((p) => p.unit === unit);
}

/** Refusals common to rolling and moving: the movement part, the active side, the unit. */
function movePrecheck(ctx: Ctx, unit: string): Refusal | null {
	const s = ctx.state;
	if (s.phase !== 'move') return refuse(409, 'The movement part has not begun: deployment comes first');
	const denied = mustPlay(ctx, s.activeSide);
	if (denied) return ctx.actorSides.length ? refuse(403, `It is ${sideName(s.activeSide)}'s turn`) : denied;
	const pieces = unitPieces(s, unit);
	if (pieces.length === 0) return refuse(400, `There is no unit "${unit}" in this game`);
	if (pieces[0].side !== s.activeSide) return refuse(403, `${unit} belongs to ${sideName(pieces[0].side)}; it is ${sideName(s.activeSide)}'s turn`);
	if (!pieces.some((p) => p.at)) return refuse(409, `${unit} is not on the table`);
	if (s.pending) return refuse(409, `Move #${s.pending.seq} waits for the opponent to accept it or for its take-back`);
	if (s.movedUnits.includes(unit)) return refuse(409, `${pieces[0].unitName} (${unit}) has moved already in this turn`);
	return null;
}

/** A dash's die, rolled by the server (the value comes in: `crypto.randomInt` lives server side). */
export function roll(ctx: Ctx, unit: string, die: number): StepResult {
	const pre = movePrecheck(ctx, unit);
	if (pre) return pre;
	const s = ctx.state;
	if (s.die) return refuse(409, `A die (${s.die.value}) for ${s.die.unit} is waiting for its dash`);
	const next = clone(s);
	next.die = { unit, value: die, seq: ctx.nextSeq };
	return { ok: true, state: next, entries: [{ kind: 'roll', side: s.activeSide, payload: { unit, die, purpose: 'dash' } }] };
}

/**
 * Checks a proposed move with the engine (only this verdict counts) and, when legal, moves the
 * pieces and leaves it awaiting acceptance; an illegal one is logged as refused with its findings.
 */
export function propose(ctx: Ctx, move: ProposeMove): StepResult {
	const pre = movePrecheck(ctx, move.unit);
	if (pre) return pre;
	const s = ctx.state;
	if (s.die && s.die.unit !== move.unit) return refuse(409, `The die rolled for ${s.die.unit} must be spent on its dash first`);
	if (move.kind === 'dash' && !s.die) return refuse(409, 'Roll the die for the dash first: the server rolls it');
	if (s.die && move.kind !== 'dash' && move.kind !== 'hold') return refuse(409, `${move.unit} rolled for a dash: it dashes or holds`);
	const paths = move.kind === 'hold' ? undefined : move.paths;
	for (const id of Object.keys(paths ?? {})) {
		const p = s.pieces.find((q) => q.id === id);
		if (!p || p.unit !== move.unit) return refuse(400, `"${id}" is not a piece of ${move.unit}`);
		if (!p.at) return refuse(400, `"${id}" is not on the table`);
	}
	const die = move.kind === 'dash' ? s.die!.value : undefined;
	const request = checkRequestFor(ctx.layout, ctx.profile, s.pieces, { unit: move.unit, kind: move.kind, die, paths });
	const parsed = checkRequestSchema.safeParse(request);
	if (!parsed.success) {
		return refuse(400, 'The move does not fit the referee\'s request', parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	}
	let report: CheckReport;
	try {
		report = checkMove(request);
	} catch (e) {
		// A request the schema accepts should always check; if the engine still fails, say so
		// plainly rather than answer 500, and log nothing.
		return refuse(400, `The referee could not check this move: ${e instanceof Error ? e.message : String(e)}`);
	}
	const payload: Record<string, unknown> = { unit: move.unit, kind: move.kind, paths: paths ?? {} };
	if (die !== undefined) payload.die = die;

	if (report.verdict === 'illegal') {
		return {
			ok: false,
			status: 422,
			state: s,
			entries: [{ kind: 'refused', side: s.activeSide, payload, report }],
			report,
			message: report.findings.find((f) => f.severity !== 'warning')?.message ?? 'The referee refused the move'
		};
	}

	const next = clone(s);
	const before: Record<string, Pose> = {};
	for (const p of next.pieces) {
		if (p.unit !== move.unit || !p.at) continue;
		before[p.id] = { ...p.at };
		const path = paths?.[p.id];
		if (path) {
			const end = endPose(p.at, path);
			p.at = { x: end.x, y: end.y, facing: end.facingDeg };
		}
	}
	next.movedUnits = [...next.movedUnits, move.unit];
	next.die = null;
	next.summaries = report.summaries;
	// Holding moves nothing, so there is nothing to accept or dispute.
	next.pending =
		move.kind === 'hold'
			? null
			: { seq: ctx.nextSeq, unit: move.unit, kind: move.kind, side: s.activeSide, actor: ctx.actor, before, die, rollSeq: s.die?.seq };
	return { ok: true, state: next, entries: [{ kind: 'move', side: s.activeSide, payload, report }], report };
}

function pendingCheck(ctx: Ctx): Refusal | null {
	if (!ctx.state.pending) return refuse(409, 'No move is waiting for acceptance');
	return null;
}

/** The opponent agrees the move stands. */
export function accept(ctx: Ctx): StepResult {
	const none = pendingCheck(ctx);
	if (none) return none;
	const p = ctx.state.pending!;
	const denied = mustPlay(ctx, otherSide(p.side));
	if (denied) return refuse(403, `Only the player of ${sideName(otherSide(p.side))} accepts ${sideName(p.side)}'s moves`);
	const next = clone(ctx.state);
	next.pending = null;
	return { ok: true, state: next, entries: [{ kind: 'accept', side: otherSide(p.side), payload: { moveSeq: p.seq, unit: p.unit } }] };
}

/**
 * The opponent asks a judge to look at the move. The move stands on the table meanwhile (play
 * goes on; a judge's ruling, on the record later, can overturn it), so it can no longer be taken back.
 */
export function requestRuling(ctx: Ctx, note: string): StepResult {
	const none = pendingCheck(ctx);
	if (none) return none;
	const p = ctx.state.pending!;
	const denied = mustPlay(ctx, otherSide(p.side));
	if (denied) return refuse(403, `Only the player of ${sideName(otherSide(p.side))} may ask for a ruling on this move`);
	const next = clone(ctx.state);
	next.pending = null;
	return { ok: true, state: next, entries: [{ kind: 'ruling-request', side: otherSide(p.side), payload: { moveSeq: p.seq, unit: p.unit, note } }] };
}

/** The mover takes the move back before it is accepted: pieces return, the unit may move again. */
export function takeBack(ctx: Ctx): StepResult {
	const none = pendingCheck(ctx);
	if (none) return none;
	const p = ctx.state.pending!;
	const denied = mustPlay(ctx, p.side);
	if (denied) return refuse(403, `Only the player of ${sideName(p.side)} may take this move back`);
	const next = clone(ctx.state);
	for (const piece of next.pieces) {
		const back = p.before[piece.id];
		if (back) piece.at = { ...back };
	}
	next.movedUnits = next.movedUnits.filter((u) => u !== p.unit);
	// The die stays rolled: taking a dash back does not buy a new roll.
	if (p.die !== undefined) next.die = { unit: p.unit, value: p.die, seq: p.rollSeq ?? p.seq };
	next.pending = null;
	next.summaries = null;
	return { ok: true, state: next, entries: [{ kind: 'take-back', side: p.side, payload: { moveSeq: p.seq, unit: p.unit, restored: p.before } }] };
}

/** The active side is done: the other side deploys or moves; after both, the round advances. */
export function endTurn(ctx: Ctx): StepResult {
	const s = ctx.state;
	if (s.phase === 'setup') return refuse(409, 'Both sides choose a roster first');
	const denied = mustPlay(ctx, s.activeSide);
	if (denied) return refuse(403, `It is ${sideName(s.activeSide)}'s turn`);
	if (s.pending) return refuse(409, `Move #${s.pending.seq} waits for the opponent to accept it or for its take-back`);
	if (s.die) return refuse(409, `The die rolled for ${s.die.unit} waits for its dash (or hold)`);
	if (s.phase === 'deploy' && !s.pieces.some((p) => p.side === s.activeSide && p.at)) {
		return refuse(409, `${sideName(s.activeSide)} deploys at least one unit first`);
	}
	const next = clone(s);
	const second = s.activeSide !== s.firstSide;
	if (s.phase === 'deploy') {
		if (second) {
			next.phase = 'move';
			next.round = 1;
			next.activeSide = s.firstSide;
		} else next.activeSide = otherSide(s.activeSide);
	} else {
		next.activeSide = otherSide(s.activeSide);
		if (second) next.round = s.round + 1;
	}
	next.movedUnits = [];
	next.summaries = null;
	return {
		ok: true,
		state: next,
		entries: [{ kind: 'end-turn', side: s.activeSide, payload: { phase: s.phase, round: s.round, next: { phase: next.phase, round: next.round, side: next.activeSide } } }]
	};
}
