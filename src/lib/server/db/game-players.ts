// The two sides of a game and who plays them, the e-mail invitations that fill a side (stored
// as token hashes, spent once by one atomic update), and the rosters a player may bring.
import type { Side } from '$lib/schemas/game';
import { use, type Db } from './index';

export interface GamePlayerRow {
	gameId: number;
	side: Side;
	userId: string | null;
	displayName: string | null;
	rosterId: number | null;
	rosterName: string | null;
}

export async function add(input: { gameId: number; side: Side; userId: string | null; rosterId?: number | null }, trx?: Db): Promise<void> {
	await use(trx)('game_players').insert({
		game_id: input.gameId,
		side: input.side,
		user_id: input.userId,
		roster_id: input.rosterId ?? null
	});
}

export async function forGame(gameId: number, trx?: Db): Promise<GamePlayerRow[]> {
	const rows: { side: Side; user_id: string | null; display_name: string | null; roster_id: number | null; roster_name: string | null }[] =
		await use(trx)('game_players as p')
			.leftJoin('users as u', 'u.id', 'p.user_id')
			.leftJoin('rosters as r', 'r.id', 'p.roster_id')
			.where('p.game_id', gameId)
			.select('p.side', 'p.user_id', 'u.display_name', 'p.roster_id', 'r.name as roster_name')
			.orderBy('p.side');
	return rows.map((r) => ({
		gameId,
		side: r.side,
		userId: r.user_id,
		displayName: r.display_name,
		rosterId: r.roster_id,
		rosterName: r.roster_name
	}));
}

/** The sides a user plays in a game: none, one, or both (one shared tablet). */
export async function sidesOf(gameId: number, userId: string, trx?: Db): Promise<Side[]> {
	const rows: { side: Side }[] = await use(trx)('game_players').where({ game_id: gameId, user_id: userId }).select('side').orderBy('side');
	return rows.map((r) => r.side);
}

export async function setRoster(gameId: number, side: Side, rosterId: number, trx?: Db): Promise<void> {
	await use(trx)('game_players').where({ game_id: gameId, side }).update({ roster_id: rosterId });
}

/** Seats the user on a side that nobody holds yet; false when it was taken meanwhile. */
export async function seat(gameId: number, side: Side, userId: string, trx?: Db): Promise<boolean> {
	const n = await use(trx)('game_players').where({ game_id: gameId, side }).whereNull('user_id').update({ user_id: userId });
	return n === 1;
}

// ---------------------------------------------------------------------------------------------
// Invitations

export interface InvitationRow {
	tokenHash: string;
	gameId: number;
	side: Side;
	email: string;
	invitedBy: string;
	expiresAt: Date;
	usedAt: Date | null;
}

export async function addInvitation(
	input: { tokenHash: string; gameId: number; side: Side; email: string; invitedBy: string; expiresAt: Date },
	trx?: Db
): Promise<void> {
	await use(trx)('game_invitations').insert({
		token_hash: input.tokenHash,
		game_id: input.gameId,
		side: input.side,
		email: input.email,
		invited_by: input.invitedBy,
		expires_at: input.expiresAt
	});
}

export async function findInvitation(tokenHash: string, trx?: Db): Promise<InvitationRow | null> {
	const r = await use(trx)('game_invitations')
		.where({ token_hash: tokenHash })
		.select('token_hash', 'game_id', 'side', 'email', 'invited_by', 'expires_at', 'used_at')
		.first();
	if (!r) return null;
	return { tokenHash: r.token_hash, gameId: r.game_id, side: r.side, email: r.email, invitedBy: r.invited_by, expiresAt: r.expires_at, usedAt: r.used_at };
}

/** The open invitation of a game's side (for its creator's eyes only: it holds an e-mail address). */
export async function openInvitation(gameId: number, side: Side, trx?: Db): Promise<{ email: string; expiresAt: Date } | null> {
	const r = await use(trx)('game_invitations')
		.where({ game_id: gameId, side })
		.whereNull('used_at')
		.orderBy('created_at', 'desc')
		.select('email', 'expires_at')
		.first();
	return r ? { email: r.email, expiresAt: r.expires_at } : null;
}

/** Spends the invitation if it is unused and unexpired at `now`; its game and side, or null. */
export async function spendInvitation(tokenHash: string, userId: string, now: Date, trx?: Db): Promise<{ gameId: number; side: Side } | null> {
	const rows: { game_id: number; side: Side }[] = await use(trx)('game_invitations')
		.where({ token_hash: tokenHash })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.update({ used_at: now, used_by: userId })
		.returning(['game_id', 'side']);
	return rows[0] ? { gameId: rows[0].game_id, side: rows[0].side } : null;
}

// ---------------------------------------------------------------------------------------------
// Rosters a player brings to a game (read only; the rosters module owns their editing)

export interface RosterForGame {
	id: number;
	ownerId: string;
	name: string;
	units: unknown;
}

/** A roster if `ownerId` owns it: a player brings only their own rosters to the table. */
export async function ownedRoster(rosterId: number, ownerId: string, trx?: Db): Promise<RosterForGame | null> {
	const r = await use(trx)('rosters').where({ id: rosterId, owner_id: ownerId }).select('id', 'owner_id', 'name', 'units').first();
	return r ? { id: r.id, ownerId: r.owner_id, name: r.name, units: r.units } : null;
}

export const gamePlayers = { add, forGame, sidesOf, setRoster, seat, addInvitation, findInvitation, openInvitation, spendInvitation, ownedRoster };
