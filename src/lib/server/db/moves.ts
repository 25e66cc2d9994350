// The move log: append-only. There is deliberately no update or remove here, and the database
// refuses UPDATE, DELETE and TRUNCATE on game_moves by trigger. Each append also notifies the
// game's listeners (pg_notify is delivered on commit, so nobody hears of a rolled-back entry).
import type { CheckReport } from '$lib/schemas/check';
import type { GameState, MoveLogEntry, MoveLogKind, Side } from '$lib/schemas/game';
import { use, type Db } from './index';

/** One channel for all games; the payload names the game and the new seq. */
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
	await trx.raw('select pg_notify(?, ?)', [GAME_CHANNEL, `${entry.gameId}:${entry.seq}`]);
}

/**
 * Writes a change in one statement (one round trip): the entries, each notified, and the game's
 * new state and seq. The caller holds the game row's lock; `entries` carry the next seqs in
 * order, gap-free, and `seq` is the last of them (or the current seq when there are none).
 */
export async function record(gameId: number, entries: NewMove[], state: GameState, seq: number, trx: Db): Promise<void> {
	if (entries.length === 0) {
		await trx('games').where({ id: gameId }).update({ state: JSON.stringify(state), seq, updated_at: trx.fn.now() });
		return;
	}
	const values = entries.map(() => '(?, ?, ?, ?, ?, ?, ?::jsonb, ?::jsonb)').join(', ');
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
	// Data-modifying CTEs always run to completion; the select only fires the notifications
	// (delivered on commit, so nobody hears of a rolled-back entry).
	await trx.raw(
		`with appended as (
			insert into game_moves (game_id, seq, kind, actor, side, round, payload, report) values ${values}
			returning game_id, seq
		), saved as (
			update games set state = ?::jsonb, seq = ?, updated_at = now() where id = ? returning id
		)
		select pg_notify(?, a.game_id || ':' || a.seq) from appended a cross join saved order by a.seq`,
		[...bindings, JSON.stringify(state), seq, gameId, GAME_CHANNEL]
	);
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

export const moves = { append, record, list };
