// Rounds of an event and their pairings. A round is paired as a draft (the organiser may swap
// players by hand), then published: from then on its pairings are fixed and each has a game.
import { db, use, type Db } from './index';
import { assignTables, tryPairRound, pairingProblems, swapPlayers, swissHistory, type TabledPair } from '$lib/pairings';
import { layoutSchema, DEFAULT_BOARD, LAYOUT_SCHEMA_VERSION, type Layout } from '$lib/schemas/layout';
import { profileSchema } from '$lib/schemas/check';
import { initialState } from '$lib/board/play/rules';
import { mail } from '$lib/server/mail';
import { entries } from './entries';
import { events, type EventRow } from './events';
import { games } from './games';
import { gamePlayers } from './game-players';
import { layouts } from './layouts';

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

// ---------------------------------------------------------------------------------------------
// Running rounds: pair the next round as a draft, swap by hand, publish (games and e-mails).


export type RoundOutcome = { ok: true; roundId: number; problems?: string[] } | { ok: false; status: 404 | 409; message: string };

/** What the next round is paired from: every earlier pairing (met = no rematch), scored or not. */
async function history(eventId: number, playerIds: string[], trx: Db) {
	const all = await forEvent(eventId, trx);
	return swissHistory(
		playerIds,
		all.map((p) => ({ a: p.playerA, b: p.playerB, outcome: p.resultStatus === 'confirmed' ? p.outcome : null }))
	);
}

/** Pairs the next round as a draft: Swiss over the entered players, tables and layouts dealt. */
export async function pairNext(eventId: number): Promise<RoundOutcome> {
	return db.transaction(async (trx): Promise<RoundOutcome> => {
		const ev = await events.lock(eventId, trx);
		if (!ev) return { ok: false, status: 404, message: 'No such event' };
		const event = (await events.find(eventId, trx))!;
		if (event.status === 'finished') return { ok: false, status: 409, message: 'The event is finished' };
		const done = await rounds(eventId, trx);
		if (done.some((r) => r.status === 'draft')) return { ok: false, status: 409, message: 'A draft round is waiting: publish it or discard it first' };
		if (done.length >= event.rounds) return { ok: false, status: 409, message: `All ${event.rounds} rounds are paired` };
		const open = await trx('event_pairings as p')
			.join('event_rounds as r', 'r.id', 'p.round_id')
			.where({ 'r.event_id': eventId })
			.whereNot('p.result_status', 'confirmed')
			.count<{ n: number }[]>({ n: '*' });
		if (Number(open[0].n) > 0) return { ok: false, status: 409, message: 'Every result of the last round must be confirmed before the next is paired' };
		const players = await entries.entrants(eventId, trx);
		if (players.length < 2) return { ok: false, status: 409, message: 'At least two entered players are needed' };
		const number = done.length + 1;
		// A round that cannot be paired cleanly is still drafted, with its problems shown, so the
		// organiser can mend it by swapping players before publishing.
		const { pairs } = tryPairRound(await history(eventId, players.map((p) => p.userId), trx), number);
		// Registration closes with the first pairing: the field is fixed from here on.
		if (event.status === 'open') await events.setStatus(eventId, 'closed', trx);
		const roundId = await addDraft(eventId, number, assignTables(pairs, event.layoutIds), trx);
		return { ok: true, roundId };
	});
}

/** Swaps two players in a draft round; the new pairing's problems (a rematch…) are shown, not hidden. */
export async function swapInDraft(roundId: number, first: string, second: string): Promise<RoundOutcome> {
	return db.transaction(async (trx): Promise<RoundOutcome> => {
		const round = await findRound(roundId, trx);
		if (!round) return { ok: false, status: 404, message: 'No such round' };
		if (round.status !== 'draft') return { ok: false, status: 409, message: 'A published round cannot be changed' };
		const current = await forRound(roundId, trx);
		const inRound = new Set(current.flatMap((p) => [p.playerA, p.playerB]).filter(Boolean));
		if (!inRound.has(first) || !inRound.has(second)) return { ok: false, status: 409, message: 'Both players must be in this round' };
		const event = (await events.find(round.eventId, trx))!;
		const swapped = swapPlayers(current.map((p) => ({ a: p.playerA, b: p.playerB })), first, second);
		// Keep the tables where they were: a swap moves players, not tables.
		const tabled = assignTables(swapped, event.layoutIds);
		await replaceDraft(roundId, tabled, trx);
		const earlier = (await forEvent(round.eventId, trx)).filter((p) => p.roundId !== roundId);
		const hist = swissHistory(
			[...inRound] as string[],
			earlier.map((p) => ({ a: p.playerA, b: p.playerB, outcome: p.resultStatus === 'confirmed' ? p.outcome : null }))
		);
		const names = new Map(current.flatMap((p) => [[p.playerA, p.playerAName], [p.playerB ?? '', p.playerBName ?? '']]));
		return { ok: true, roundId, problems: pairingProblems(hist, swapped, (id) => names.get(id) || id) };
	});
}

/** The problems of a draft (rematches, repeated byes) as the organiser should see them. */
export async function draftProblems(roundId: number, trx?: Db): Promise<string[]> {
	const round = await findRound(roundId, trx);
	if (!round) return [];
	const current = await forRound(roundId, trx);
	const names = new Map(current.flatMap((p) => [[p.playerA, p.playerAName], [p.playerB ?? '', p.playerBName ?? '']]));
	const earlier = (await forEvent(round.eventId, trx)).filter((p) => p.roundId !== roundId);
	const ids = current.flatMap((p) => [p.playerA, p.playerB]).filter((x): x is string => !!x);
	const hist = swissHistory(ids, earlier.map((p) => ({ a: p.playerA, b: p.playerB, outcome: p.resultStatus === 'confirmed' ? p.outcome : null })));
	// Name people, not ids, in what the organiser reads.
	return pairingProblems(hist, current.map((p) => ({ a: p.playerA, b: p.playerB })), (id) => names.get(id) || id);
}

function blankLayout(name: string): Layout {
	return layoutSchema.parse({ schemaVersion: LAYOUT_SCHEMA_VERSION, name, board: DEFAULT_BOARD, terrain: [], objectives: [], zones: [] });
}

function origin(): string {
	return (process.env.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

export type PublishOutcome = { ok: true; games: number; mailed: number; mailFailed: number } | { ok: false; status: 404 | 409; message: string };

/**
 * Publishes a draft: each pairing gets its game (the table's layout snapshot, the event's
 * profile, both players seated), all in one transaction; then every player is e-mailed.
 */
export async function publish(roundId: number): Promise<PublishOutcome> {
	const done = await db.transaction(async (trx): Promise<PublishOutcome | { ok: true; event: EventRow; list: Pairing[]; number: number }> => {
		const round = await findRound(roundId, trx);
		if (!round) return { ok: false, status: 404, message: 'No such round' };
		if (!(await markPublished(roundId, trx))) return { ok: false, status: 409, message: 'This round is already published' };
		const event = (await events.find(round.eventId, trx))!;
		const profile = profileSchema.parse(event.profile ?? {});
		const list = await forRound(roundId, trx);
		for (const p of list) {
			if (p.playerB === null) continue;
			const saved = p.layoutId ? await layouts.find(p.layoutId, trx) : null;
			const parsed = saved ? layoutSchema.safeParse(saved.doc) : null;
			const layout = parsed?.success ? parsed.data : blankLayout(`${event.name} table ${p.table}`);
			const gameId = await games.add(
				{ title: `${event.name} · round ${round.number} · table ${p.table}`, createdBy: p.playerA, layoutId: saved ? p.layoutId : null, layout, profile, state: initialState('a') },
				trx
			);
			await gamePlayers.add({ gameId, side: 'a', userId: p.playerA }, trx);
			await gamePlayers.add({ gameId, side: 'b', userId: p.playerB }, trx);
			await setGame(p.id, gameId, trx);
			p.gameId = gameId;
		}
		return { ok: true, event, list, number: round.number };
	});
	if (!done.ok || !('event' in done)) return done as PublishOutcome;

	// E-mail after the commit: a slow or failed mail must not undo a published round.
	const { event, list, number } = done;
	const emails = new Map(
		(await entries.list(event.id, { withEmail: true })).map((e) => [e.userId, e.email!])
	);
	let mailed = 0;
	let mailFailed = 0;
	const table = list.map((p) => (p.playerB ? `Table ${p.table}: ${p.playerAName} v ${p.playerBName}` : `Bye: ${p.playerAName}`)).join('\n');
	for (const p of list) {
		for (const [me, them] of [[p.playerA, p.playerBName], [p.playerB, p.playerAName]] as const) {
			if (!me) continue;
			const to = emails.get(me);
			if (!to) continue;
			const mine = p.playerB
				? `You play ${them} at table ${p.table}. Your game is ready on the table screen:\n${origin()}/games/${p.gameId}`
				: 'You have the bye this round: it counts as a win.';
			try {
				await mail.send({
					to,
					subject: `${event.name}: round ${number} pairings`,
					text: `Round ${number} of ${event.name} is paired.\n\n${mine}\n\nAll pairings:\n${table}\n\nEvent page: ${origin()}/events/${event.id}\n`
				});
				mailed++;
			} catch (e) {
				console.error('pairing mail failed', e);
				mailFailed++;
			}
		}
	}
	return { ok: true, games: list.filter((p) => p.playerB).length, mailed, mailFailed };
}

export const rounding = { pairNext, swapInDraft, draftProblems, publish };
