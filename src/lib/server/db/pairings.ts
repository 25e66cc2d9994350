// Rounds of an event and their pairings. A round is paired as a draft (the organiser may swap
// players by hand), then published: from then on its pairings are fixed and each has a game.
import type { TabledPair } from '$lib/pairings';
import { use, type Db } from './index';

export type RoundStatus = 'draft' | 'published';

export interface Round {
	id: number;
	eventId: number;
	number: number;
	status: RoundStatus;
	publishedAt: Date | null;
}

export interface Pairing {
	id: number;
	roundId: number;
	round: number;
	table: number | null;
	layoutId: number | null;
	playerA: string;
	playerAName: string;
	playerB: string | null;
	playerBName: string | null;
	gameId: number | null;
	outcome: 'a' | 'b' | 'draw' | null;
	valueA: number | null;
	valueB: number | null;
	resultStatus: 'none' | 'reported' | 'confirmed';
	reportedBy: string | null;
}

const roundColumns = ['id', 'event_id as eventId', 'number', 'status', 'published_at as publishedAt'];

export async function rounds(eventId: number, trx?: Db): Promise<Round[]> {
	return use(trx)('event_rounds').where({ event_id: eventId }).select(roundColumns).orderBy('number');
}

export async function findRound(id: number, trx?: Db): Promise<Round | null> {
	return ((await use(trx)('event_rounds').where({ id }).select(roundColumns).first()) as Round | undefined) ?? null;
}

/** A new draft round with its pairings; the caller has checked that no draft is open. */
export async function addDraft(eventId: number, number: number, pairs: readonly TabledPair[], trx: Db): Promise<number> {
	const [round] = await trx('event_rounds').insert({ event_id: eventId, number, status: 'draft' }).returning('id');
	await insertPairs(round.id, pairs, trx);
	return round.id as number;
}

async function insertPairs(roundId: number, pairs: readonly TabledPair[], trx: Db) {
	for (const p of pairs) {
		await trx('event_pairings').insert({
			round_id: roundId,
			table_no: p.table,
			layout_id: p.layoutId,
			player_a: p.a,
			player_b: p.b,
			// A bye is a result in itself: a win, confirmed, with no game to play.
			...(p.b === null ? { outcome: 'a', value_a: 0, value_b: 0, result_status: 'confirmed' } : {})
		});
	}
}

/** A draft's pairings replaced (after a swap), under the round's lock. */
export async function replaceDraft(roundId: number, pairs: readonly TabledPair[], trx: Db): Promise<boolean> {
	const round = await trx('event_rounds').where({ id: roundId }).forUpdate().first();
	if (!round || round.status !== 'draft') return false;
	await trx('event_pairings').where({ round_id: roundId }).delete();
	await insertPairs(roundId, pairs, trx);
	return true;
}

export async function removeDraft(roundId: number, trx?: Db): Promise<boolean> {
	const n = await use(trx)('event_rounds').where({ id: roundId, status: 'draft' }).delete();
	return n > 0;
}

/** Locks the round; true when it was a draft and is now published. */
export async function markPublished(roundId: number, trx: Db): Promise<boolean> {
	const n = await trx('event_rounds').where({ id: roundId, status: 'draft' }).update({ status: 'published', published_at: trx.fn.now() });
	return n > 0;
}

export async function setGame(pairingId: number, gameId: number, trx: Db): Promise<void> {
	await trx('event_pairings').where({ id: pairingId }).update({ game_id: gameId });
}

function base(trx?: Db) {
	return use(trx)('event_pairings as p')
		.join('event_rounds as r', 'r.id', 'p.round_id')
		.join('users as ua', 'ua.id', 'p.player_a')
		.leftJoin('users as ub', 'ub.id', 'p.player_b')
		.select(
			'p.id',
			'p.round_id as roundId',
			'r.number as round',
			'p.table_no as table',
			'p.layout_id as layoutId',
			'p.player_a as playerA',
			'ua.display_name as playerAName',
			'p.player_b as playerB',
			'ub.display_name as playerBName',
			'p.game_id as gameId',
			'p.outcome',
			'p.value_a as valueA',
			'p.value_b as valueB',
			'p.result_status as resultStatus',
			'p.reported_by as reportedBy'
		);
}

/** Byes sort last in a round: table numbers first, then the bye. */
export async function forRound(roundId: number, trx?: Db): Promise<Pairing[]> {
	return base(trx).where('p.round_id', roundId).orderByRaw('p.table_no asc nulls last').orderBy('p.id');
}

export async function forEvent(eventId: number, trx?: Db): Promise<Pairing[]> {
	return base(trx).where('r.event_id', eventId).orderBy('r.number').orderByRaw('p.table_no asc nulls last').orderBy('p.id');
}

export async function find(id: number, trx?: Db): Promise<(Pairing & { eventId: number; roundStatus: RoundStatus }) | null> {
	const row = await base(trx).where('p.id', id).select('r.event_id as eventId', 'r.status as roundStatus').first();
	return row ?? null;
}

/** The event and round a game was started for, if any (the archive and the play screen link back). */
export async function forGame(gameId: number, trx?: Db): Promise<{ eventId: number; round: number; table: number | null } | null> {
	const row = await use(trx)('event_pairings as p')
		.join('event_rounds as r', 'r.id', 'p.round_id')
		.where('p.game_id', gameId)
		.select('r.event_id as eventId', 'r.number as round', 'p.table_no as table')
		.first();
	return row ?? null;
}

export const pairings = { rounds, findRound, addDraft, replaceDraft, removeDraft, markPublished, setGame, forRound, forEvent, find, forGame };
