// Every change to a game: check the player and the seq the client saw, run the pure rule step,
// then append its log entries with gap-free seqs and save the new state in one statement that
// holds only if the game is still at that seq (see `act`). Also game creation (with the
// invitation e-mail), rosters, and joining by invitation.
import type { User } from 'lucia';
import { profileSchema } from '$lib/schemas/check';
import { layoutSchema, type Layout } from '$lib/schemas/layout';
import { unitsSchema } from '$lib/schemas/roster';
import type { CreateGame, GameView, Side } from '$lib/schemas/game';
import { initialState, chooseRoster, type Ctx, type StepResult } from '$lib/board/play/rules';
import { generateResetToken, hashToken, isResetTokenShape } from '$lib/server/auth/token';
import { mail } from '$lib/server/mail';
import { db, type Db } from './index';
import { games, type GameRow } from './games';
import { gamePlayers, type GamePlayerRow } from './game-players';
import { moves } from './moves';

/** Invitations stay usable for a week: long enough to arrange a game night. */
export const INVITATION_DAYS = 7;

/** What a route answers: a status and a JSON body. */
export interface Answer {
	status: number;
	body: unknown;
}

function err(status: number, message: string, opts: { issues?: unknown[]; game?: GameView } = {}): Answer {
	const error: { message: string; issues?: unknown[] } = { message };
	if (opts.issues) error.issues = opts.issues;
	return { status, body: opts.game ? { error, game: opts.game } : { error } };
}

function origin(): string {
	return (process.env.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

/** The game as a player sees it. E-mail addresses of invitations only reach the game's creator. */
export function toView(game: GameRow, players: GamePlayerRow[], userId: string, invitations: Partial<Record<Side, string>> = {}): GameView {
	return {
		id: game.id,
		title: game.title,
		seq: game.seq,
		layout: game.layout,
		profile: game.profile,
		state: game.state,
		players: players.map((p) => ({
			side: p.side,
			userId: p.userId,
			displayName: p.displayName,
			rosterId: p.rosterId,
			rosterName: p.rosterName,
			...(game.createdBy === userId ? { invited: invitations[p.side] ?? null } : {})
		})),
		mySides: players.filter((p) => p.userId === userId).map((p) => p.side)
	};
}

/** The game's view for a user who plays in it, or null (no such game, or not theirs). */
export async function viewFor(gameId: number, userId: string, trx?: Db): Promise<GameView | null> {
	const game = await games.find(gameId, trx);
	if (!game) return null;
	const players = await gamePlayers.forGame(gameId, trx);
	if (!players.some((p) => p.userId === userId)) return null;
	const invitations: Partial<Record<Side, string>> = {};
	if (game.createdBy === userId) {
		for (const p of players) {
			if (p.userId) continue;
			const inv = await gamePlayers.openInvitation(gameId, p.side, trx);
			if (inv) invitations[p.side] = inv.email;
		}
	}
	return toView(game, players, userId, invitations);
}

/** Whether the game exists at all (to tell 404 from 403). */
export async function exists(gameId: number): Promise<boolean> {
	return (await games.find(gameId)) !== null;
}

/**
 * Runs one change. Answers 404 (no game), 403 (not a player of it, or the step's refusal),
 * 409 with the current state when `expectedSeq` is stale, the step's refusal, or 200/201/422
 * with the new state. Nothing is written unless the whole change is.
 *
 * Optimistic, as the API is: the game is read as it stands, the pure step runs, and one
 * statement writes the entries and the new state only if the game is still at the seq the step
 * saw (moves.recordAt). A change that lost the race to another answers 409 like a stale seq.
 * Three round trips to the database in all (session, read, write) instead of a transaction's
 * BEGIN, lock, writes and COMMIT: every round trip is a wait for a busy machine's scheduler.
 */
export async function act(
	gameId: number,
	user: User,
	expectedSeq: number,
	step: (ctx: Ctx, db: Db) => StepResult | Promise<StepResult>,
	okStatus = 200
): Promise<Answer> {
	const found = await games.findWithPlayers(gameId);
	if (!found) return err(404, 'No such game');
	const { game, players } = found;
	const actorSides = players.filter((p) => p.userId === user.id).map((p) => p.side);
	if (actorSides.length === 0) return err(403, 'Only the players of this game may act in it');
	const stale = async (): Promise<Answer> => {
		const now = (await games.findWithPlayers(gameId)) ?? found;
		return err(409, `The game has moved on (you saw #${expectedSeq}, it is at #${now.game.seq}): here is the current state`, {
			game: toView(now.game, now.players, user.id)
		});
	};
	if (expectedSeq !== game.seq) {
		return err(409, `The game has moved on (you saw #${expectedSeq}, it is at #${game.seq}): here is the current state`, {
			game: toView(game, players, user.id)
		});
	}
	const ctx: Ctx = { state: game.state, layout: game.layout, profile: game.profile, actor: user.id, actorSides, nextSeq: game.seq + 1 };
	const result = await step(ctx, db);
	if (!result.ok && !('entries' in result)) return err(result.status, result.message, { issues: result.issues });

	const entries = result.entries.map((e, i) => ({
		gameId,
		seq: game.seq + 1 + i,
		kind: e.kind,
		actor: user.id,
		side: e.side,
		round: result.state.round,
		payload: e.payload,
		report: e.report ?? null
	}));
	const seq = game.seq + entries.length;
	if (!(await moves.recordAt(gameId, game.seq, entries, result.state, seq))) return stale();
	const view = toView({ ...game, state: result.state, seq }, players, user.id);
	if (!result.ok) {
		// Refused by the referee: the refusal is on the record, the pieces stay where they were.
		return { status: 422, body: { error: { message: result.message }, report: result.report, seq, game: view } };
	}
	return { status: okStatus, body: { seq, report: result.report ?? null, game: view } };
}

/** The layout a new game plays on: a saved one (looked up by the caller) or a document. */
export async function createGame(
	input: CreateGame,
	user: User,
	savedLayout: (id: number) => Promise<Layout | null>
): Promise<Answer> {
	let layout: Layout;
	if (input.layoutId !== undefined) {
		const saved = await savedLayout(input.layoutId);
		if (!saved) return err(400, `There is no saved layout #${input.layoutId}`);
		layout = saved;
	} else if (input.layout) {
		layout = input.layout;
	} else {
		return err(400, 'Choose a saved layout or send one', { issues: [{ path: ['layoutId'], message: 'a layout is needed' }] });
	}
	// Re-parse the snapshot: a saved layout may predate a schema change, and a game must hold a valid one.
	const snap = layoutSchema.safeParse(layout);
	if (!snap.success) return err(400, 'The layout is not valid', { issues: snap.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })) });
	const profile = profileSchema.parse(input.profile ?? {});
	if (input.opponent.mode === 'invite' && input.opponent.email === user.email.trim().toLowerCase()) {
		return err(400, 'Invite someone else, or choose one tablet for both sides', { issues: [{ path: ['opponent', 'email'], message: 'that is your own address' }] });
	}
	const shared = input.opponent.mode === 'shared';

	const token = shared ? null : generateResetToken();
	const answer = await db.transaction(async (trx): Promise<Answer> => {
		const state = initialState(input.firstSide);
		const gameId = await games.add({ title: input.title, createdBy: user.id, layoutId: input.layoutId ?? null, layout: snap.data, profile, state }, trx);
		await gamePlayers.add({ gameId, side: 'a', userId: user.id }, trx);
		await gamePlayers.add({ gameId, side: 'b', userId: shared ? user.id : null }, trx);
		if (token && input.opponent.mode === 'invite') {
			await gamePlayers.addInvitation(
				{ tokenHash: hashToken(token), gameId, side: 'b', email: input.opponent.email, invitedBy: user.id, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) },
				trx
			);
		}
		// Rosters named at creation go through the same step as a later choice, so they are logged.
		for (const [side, rosterId] of [['a', input.rosterA], ['b', input.rosterB]] as const) {
			if (rosterId === undefined) continue;
			if (side === 'b' && !shared) return err(400, "Side B's roster is chosen by the invited player", { issues: [{ path: ['rosterB'], message: 'chosen by the opponent' }] });
			const r = await rosterStep(gameId, user, side, rosterId, trx);
			if (r.status !== 200) throw new RollbackWith(r);
		}
		return { status: 201, body: { id: gameId } };
	}).catch((e) => {
		if (e instanceof RollbackWith) return e.answer;
		throw e;
	});
	if (answer.status === 201 && token && input.opponent.mode === 'invite') {
		const link = `${origin()}/games/join/${token}`;
		await mail.send({
			to: input.opponent.email,
			subject: `${user.displayName} invites you to a game on Inchwarden`,
			text:
				`Hello,\n\n${user.displayName} has set up a game, "${input.title}", and invites you to play side B.\n\n` +
				`To join, open:\n\n${link}\n\n` +
				`The link works once and expires in ${INVITATION_DAYS} days. Sign in or create an account when asked.\n`
		});
	}
	return answer;
}

/** Aborts a transaction with an answer (knex rolls back on a thrown error). */
class RollbackWith extends Error {
	constructor(readonly answer: Answer) {
		super('rollback');
	}
}

async function rosterStep(gameId: number, user: User, side: Side, rosterId: number, trx: Db): Promise<Answer> {
	const game = await games.lock(gameId, trx);
	if (!game) return err(404, 'No such game');
	return chooseRosterIn(game, user, side, rosterId, trx);
}

async function chooseRosterIn(game: GameRow, user: User, side: Side, rosterId: number, trx: Db): Promise<Answer> {
	const players = await gamePlayers.forGame(game.id, trx);
	const actorSides = players.filter((p) => p.userId === user.id).map((p) => p.side);
	const roster = await gamePlayers.ownedRoster(rosterId, user.id, trx);
	if (!roster) return err(400, 'Choose one of your own rosters', { issues: [{ path: ['rosterId'], message: 'not one of your rosters' }] });
	const units = unitsSchema.safeParse(roster.units);
	if (!units.success) return err(400, 'That roster has units the table cannot use', { issues: units.error.issues.map((i) => ({ path: ['units', ...i.path.map(String)], message: i.message })) });
	const ctx: Ctx = { state: game.state, layout: game.layout, profile: game.profile, actor: user.id, actorSides, nextSeq: game.seq + 1 };
	const r = chooseRoster(ctx, side, { id: roster.id, name: roster.name, units: units.data });
	if (!r.ok) return err(r.status, r.message);
	let seq = game.seq;
	for (const e of r.entries) {
		seq += 1;
		await moves.append({ gameId: game.id, seq, kind: e.kind, actor: user.id, side: e.side, round: r.state.round, payload: e.payload }, trx);
	}
	await gamePlayers.setRoster(game.id, side, roster.id, trx);
	await games.saveState(game.id, r.state, seq, trx);
	const fresh = await gamePlayers.forGame(game.id, trx);
	return { status: 200, body: { seq, game: toView({ ...game, state: r.state, seq }, fresh, user.id) } };
}

/** A player picks the roster for their side (before that side deploys). */
export async function chooseRosterFor(gameId: number, user: User, expectedSeq: number, side: Side, rosterId: number): Promise<Answer> {
	return db.transaction(async (trx) => {
		const game = await games.lock(gameId, trx);
		if (!game) return err(404, 'No such game');
		const players = await gamePlayers.forGame(gameId, trx);
		if (!players.some((p) => p.userId === user.id)) return err(403, 'Only the players of this game may act in it');
		if (expectedSeq !== game.seq) {
			return err(409, `The game has moved on (you saw #${expectedSeq}, it is at #${game.seq}): here is the current state`, { game: toView(game, players, user.id) });
		}
		return chooseRosterIn(game, user, side, rosterId, trx);
	});
}

/** The invitation behind a link, for the join page (no e-mail address in it). */
export async function invitationFor(token: string): Promise<{ gameId: number; title: string; invitedBy: string; side: Side; usable: boolean } | null> {
	if (!isResetTokenShape(token)) return null;
	const inv = await gamePlayers.findInvitation(hashToken(token));
	if (!inv) return null;
	const game = await games.find(inv.gameId);
	if (!game) return null;
	const players = await gamePlayers.forGame(inv.gameId);
	const inviter = players.find((p) => p.userId === inv.invitedBy)?.displayName ?? 'The organiser';
	return { gameId: inv.gameId, title: game.title, invitedBy: inviter, side: inv.side, usable: !inv.usedAt && inv.expiresAt > new Date() };
}

/** Spends the link and seats the user on the invited side. */
export async function join(token: string, user: User): Promise<Answer> {
	if (!isResetTokenShape(token)) return err(404, 'This invitation link is not known');
	return db
		.transaction(async (trx): Promise<Answer> => {
			const inv = await gamePlayers.findInvitation(hashToken(token), trx);
			if (!inv) return err(404, 'This invitation link is not known');
			const players = await gamePlayers.forGame(inv.gameId, trx);
			if (players.some((p) => p.userId === user.id)) return err(409, 'You play in this game already');
			const spent = await gamePlayers.spendInvitation(inv.tokenHash, user.id, new Date(), trx);
			if (!spent) return err(410, 'This invitation has been used or has expired');
			if (!(await gamePlayers.seat(spent.gameId, spent.side, user.id, trx))) throw new RollbackWith(err(409, 'That side has a player already'));
			return { status: 200, body: { id: spent.gameId, side: spent.side } };
		})
		.catch((e) => {
			if (e instanceof RollbackWith) return e.answer;
			throw e;
		});
}

export const gameActions = { act, createGame, chooseRosterFor, viewFor, exists, invitationFor, join, toView };
