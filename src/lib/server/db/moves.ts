// The move log: append-only. There is deliberately no update or remove here, and the database
// refuses UPDATE, DELETE and TRUNCATE on game_moves by trigger. Each appended entry notifies the
// game's listeners, by trigger too (pg_notify is delivered on commit, so nobody hears of a
// rolled-back entry).
import type { CheckReport } from '$lib/schemas/check';
import type { GameState, MoveLogEntry, MoveLogKind, Side } from '$lib/schemas/game';
import { db, use, type Db } from './index';

/** One channel for all games; the payload names the game and the new seq (the trigger of
 * migration 20261201230000 sends it). */
export const GAME_CHANNEL = 'game_events';

export interface NewMove {
	gameId: number;
	seq: number;
	kind: MoveLogKind;
	actor: string;
	side: Side | null;
	round: number;
	payload: Record<string, unknown>;
	report?: CheckReport | null;
}

/** Appends one entry; the caller holds the game row's lock and names the next seq (gap-free). */
export async function append(entry: NewMove, trx: Db): Promise<void> {
	await trx('game_moves').insert({
		game_id: entry.gameId,
		seq: entry.seq,
		kind: entry.kind,
		actor: entry.actor,
		side: entry.side,
		round: entry.round,
		payload: JSON.stringify(entry.payload),
		report: entry.report ? JSON.stringify(entry.report) : null
	});
}

/**
 * Writes a change in one statement, if the game is still at `expectedSeq`: the game's new
 * state and seq, and the entries (which carry the next seqs in order, gap-free; `seq` is the
 * last of them). One statement is one transaction: both are written or neither. Answers
 * false, writing nothing, when another change got there first. A concurrent writer of the
 * same game waits for the row and then finds its seq moved on.
 */
export async function recordAt(gameId: number, expectedSeq: number, entries: NewMove[], state: GameState, seq: number): Promise<boolean> {
	if (entries.length === 0 || seq !== expectedSeq + entries.length) throw new Error('recordAt: entries must carry the next seqs');
	const values = entries.map(() => '(?::int, ?::int, ?::text, ?::text, ?::text, ?::int, ?::jsonb, ?::jsonb)').join(', ');
	const bindings = entries.flatMap((e) => [
		e.gameId,
		e.seq,
		e.kind,
		e.actor,
		e.side,
		e.round,
		JSON.stringify(e.payload),
		e.report ? JSON.stringify(e.report) : null
	]);
	const { rows } = await db.raw(
		`with saved as (
			update games set state = ?::jsonb, seq = ?, updated_at = now() where id = ? and seq = ? returning id
		), appended as (
			insert into game_moves (game_id, seq, kind, actor, side, round, payload, report)
			select v.* from (values ${values}) as v (game_id, seq, kind, actor, side, round, payload, report)
			where exists (select 1 from saved)
			returning seq
		)
		select (select count(*) from saved)::int as saved, (select count(*) from appended)::int as appended`,
		[JSON.stringify(state), seq, gameId, expectedSeq, ...bindings]
	);
	// Both or neither: the entries are inserted only where the update found the game at its seq.
	return (rows[0] as { saved: number }).saved === 1;
}

/** The log of a game in order, optionally only the entries after `afterSeq` (catching up). */
export async function list(gameId: number, afterSeq = 0, trx?: Db): Promise<MoveLogEntry[]> {
	const rows: {
		seq: number;
		kind: MoveLogKind;
		actor: string;
		actor_name: string | null;
		side: Side | null;
		round: number;
		payload: Record<string, unknown>;
		report: CheckReport | null;
		created_at: Date;
	}[] = await use(trx)('game_moves as m')
		.leftJoin('users as u', 'u.id', 'm.actor')
		.where('m.game_id', gameId)
		.andWhere('m.seq', '>', afterSeq)
		.select('m.seq', 'm.kind', 'm.actor', 'u.display_name as actor_name', 'm.side', 'm.round', 'm.payload', 'm.report', 'm.created_at')
		.orderBy('m.seq');
	return rows.map((r) => ({
		seq: r.seq,
		kind: r.kind,
		actor: r.actor,
		actorName: r.actor_name ?? 'unknown',
		side: r.side,
		round: r.round,
		payload: r.payload,
		report: r.report,
		createdAt: r.created_at.toISOString()
	}));
}

export const moves = { append, recordAt, list };
