// Rulings on the record: they are 'ruling' entries of the append-only move log (written through
// moves.append), so this module only reads them back; plus the e-mail recipients the desk
// writes to (addresses never leave the server) and the shareable links to turn reports.
import { rulingPayloadSchema, type RulingPayload } from '$lib/schemas/ruling';
import { use, type Db } from './index';

export interface RulingEntry {
	seq: number;
	round: number;
	createdAt: string;
	payload: RulingPayload;
}

/** The rulings of a game in log order. */
export async function forGame(gameId: number, trx?: Db): Promise<RulingEntry[]> {
	const rows: { seq: number; round: number; payload: unknown; created_at: Date }[] = await use(trx)('game_moves')
		.where({ game_id: gameId, kind: 'ruling' })
		.orderBy('seq')
		.select('seq', 'round', 'payload', 'created_at');
	const out: RulingEntry[] = [];
	for (const r of rows) {
		const p = rulingPayloadSchema.safeParse(r.payload);
		if (p.success) out.push({ seq: r.seq, round: r.round, createdAt: r.created_at.toISOString(), payload: p.data });
	}
	return out;
}

export interface Recipient {
	id: string;
	email: string;
	displayName: string;
}

/** Judges of an event. */
export async function eventJudgeRecipients(eventId: number, trx?: Db): Promise<Recipient[]> {
	return use(trx)('event_judges as j').join('users as u', 'u.id', 'j.user_id').where('j.event_id', eventId).select('u.id', 'u.email', 'u.display_name as displayName');
}

/** Everyone holding the site-wide judge role. */
export async function siteJudgeRecipients(trx?: Db): Promise<Recipient[]> {
	return use(trx)('user_roles as r').join('users as u', 'u.id', 'r.user_id').where('r.role', 'judge').select('u.id', 'u.email', 'u.display_name as displayName');
}

/** The seated players of a game, each once (one person on a shared tablet plays both sides). */
export async function playerRecipients(gameId: number, trx?: Db): Promise<Recipient[]> {
	return use(trx)('game_players as p')
		.join('users as u', 'u.id', 'p.user_id')
		.where('p.game_id', gameId)
		.distinct('u.id', 'u.email', 'u.display_name as displayName');
}

// ---------------------------------------------------------------------------------------------
// Shareable links to a turn report (only the token's hash is kept)

export async function addReportLink(input: { tokenHash: string; gameId: number; round: number; createdBy: string; expiresAt: Date }, trx?: Db): Promise<void> {
	await use(trx)('turn_report_links').insert({
		token_hash: input.tokenHash,
		game_id: input.gameId,
		round: input.round,
		created_by: input.createdBy,
		expires_at: input.expiresAt
	});
}

export async function findReportLink(tokenHash: string, trx?: Db): Promise<{ gameId: number; round: number; expiresAt: Date } | null> {
	const r = await use(trx)('turn_report_links').where({ token_hash: tokenHash }).select('game_id', 'round', 'expires_at').first();
	return r ? { gameId: r.game_id, round: r.round, expiresAt: r.expires_at } : null;
}

export const rulings = { forGame, eventJudgeRecipients, siteJudgeRecipients, playerRecipients, addReportLink, findReportLink };
