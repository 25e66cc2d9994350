// Results of pairings (a player reports, the opponent confirms, or an organiser or judge enters
// them), the confirmed results standings are computed from, and the club's archive of logged
// games with its statistics. Games and their move log are read here, never written.
import type { Knex } from 'knex';
import { profileSchema } from '$lib/schemas/check';
import type { ArchiveFilter } from '$lib/schemas/club';
import { computeStandings, type ResultIn, type StandingRow } from '$lib/pairings';
import { db, use, type Db } from './index';

type Outcome = 'a' | 'b' | 'draw';

export type ReportOutcome = { ok: true } | { ok: false; status: 403 | 404 | 409; message: string };

/** A player of the pairing reports (or corrects, before confirmation) the result. */
export async function report(pairingId: number, userId: string, r: { outcome: Outcome; valueA: number; valueB: number }): Promise<ReportOutcome> {
	return db.transaction(async (trx) => {
		const p = await trx('event_pairings as p')
			.join('event_rounds as r', 'r.id', 'p.round_id')
			.where('p.id', pairingId)
			.forUpdate('p')
			.select('p.player_a', 'p.player_b', 'p.result_status', 'r.status as round_status')
			.first();
		if (!p) return { ok: false, status: 404, message: 'No such pairing' };
		if (userId !== p.player_a && userId !== p.player_b) return { ok: false, status: 403, message: 'Only the two players of this pairing report its result' };
		if (p.player_b === null) return { ok: false, status: 409, message: 'A bye has no result to report' };
		if (p.round_status !== 'published') return { ok: false, status: 409, message: 'The round is not published yet' };
		if (p.result_status === 'confirmed') return { ok: false, status: 409, message: 'The result is already confirmed; ask an organiser to correct it' };
		await trx('event_pairings')
			.where({ id: pairingId })
			.update({ outcome: r.outcome, value_a: r.valueA, value_b: r.valueB, result_status: 'reported', reported_by: userId, reported_at: trx.fn.now(), confirmed_by: null, confirmed_at: null });
		return { ok: true };
	});
}

/** The opponent of the reporter confirms the reported result. */
export async function confirm(pairingId: number, userId: string): Promise<ReportOutcome> {
	return db.transaction(async (trx) => {
		const p = await trx('event_pairings').where({ id: pairingId }).forUpdate().select('player_a', 'player_b', 'result_status', 'reported_by').first();
		if (!p) return { ok: false, status: 404, message: 'No such pairing' };
		if (userId !== p.player_a && userId !== p.player_b) return { ok: false, status: 403, message: 'Only the two players of this pairing confirm its result' };
		if (p.result_status !== 'reported') return { ok: false, status: 409, message: p.result_status === 'confirmed' ? 'The result is already confirmed' : 'No result has been reported yet' };
		if (p.reported_by === userId) return { ok: false, status: 409, message: 'Your opponent confirms the result you reported' };
		await trx('event_pairings').where({ id: pairingId }).update({ result_status: 'confirmed', confirmed_by: userId, confirmed_at: trx.fn.now() });
		return { ok: true };
	});
}

/** An organiser or judge enters (or corrects) a result: it counts at once. */
export async function enter(pairingId: number, userId: string, r: { outcome: Outcome; valueA: number; valueB: number }): Promise<ReportOutcome> {
	return db.transaction(async (trx) => {
		const p = await trx('event_pairings as p')
			.join('event_rounds as r', 'r.id', 'p.round_id')
			.where('p.id', pairingId)
			.forUpdate('p')
			.select('p.player_b', 'r.status as round_status')
			.first();
		if (!p) return { ok: false, status: 404, message: 'No such pairing' };
		if (p.player_b === null) return { ok: false, status: 409, message: 'A bye has no result to enter' };
		if (p.round_status !== 'published') return { ok: false, status: 409, message: 'Publish the round before entering results' };
		await trx('event_pairings')
			.where({ id: pairingId })
			.update({ outcome: r.outcome, value_a: r.valueA, value_b: r.valueB, result_status: 'confirmed', reported_by: userId, reported_at: trx.fn.now(), confirmed_by: userId, confirmed_at: trx.fn.now() });
		return { ok: true };
	});
}

/** Confirmed results of the event's published rounds, for the standings. */
export async function confirmed(eventId: number, trx?: Db): Promise<ResultIn[]> {
	const rows: { number: number; player_a: string; player_b: string | null; outcome: Outcome; value_a: number; value_b: number }[] = await use(trx)('event_pairings as p')
		.join('event_rounds as r', 'r.id', 'p.round_id')
		.where({ 'r.event_id': eventId, 'r.status': 'published', 'p.result_status': 'confirmed' })
		.select('r.number', 'p.player_a', 'p.player_b', 'p.outcome', 'p.value_a', 'p.value_b')
		.orderBy('r.number');
	return rows.map((r) => ({ round: r.number, a: r.player_a, b: r.player_b, outcome: r.outcome, valueA: r.value_a ?? 0, valueB: r.value_b ?? 0 }));
}

/** Standings over everyone who entered or played (a player who withdrew keeps their games). */
export async function standings(eventId: number, trx?: Db): Promise<StandingRow[]> {
	const q = use(trx);
	const [entered, played, done] = await Promise.all([
		q('event_entries as x').join('users as u', 'u.id', 'x.user_id').where({ 'x.event_id': eventId, 'x.status': 'entered' }).select('x.user_id as id', 'u.display_name as name'),
		q('event_pairings as p')
			.join('event_rounds as r', 'r.id', 'p.round_id')
			.join('users as u', function () {
				this.on('u.id', '=', 'p.player_a').orOn('u.id', '=', 'p.player_b');
			})
			.where('r.event_id', eventId)
			.distinct('u.id as id', 'u.display_name as name'),
		confirmed(eventId, trx)
	]);
	const names = new Map<string, string>();
	for (const p of [...entered, ...played] as { id: string; name: string }[]) names.set(p.id, p.name);
	return computeStandings([...names].map(([id, name]) => ({ id, name })), done);
}

// ---------------------------------------------------------------------------------------------
// The archive: a club's logged games are those started for its events, and friendlies in which
// every seated player is a member of the club.

const DEFAULT_PROFILE = JSON.stringify(profileSchema.parse({}));

/** The profile a game was played under, in words: its event's, or the default, or "Custom". */
const profileLabel = `coalesce(e.profile_name, case when g.profile = ?::jsonb then 'Table Standard' else 'Custom' end)`;

function clubGames(q: Db, clubId: number, f: ArchiveFilter) {
	const b = q('games as g')
		.leftJoin('event_pairings as p', 'p.game_id', 'g.id')
		.leftJoin('event_rounds as r', 'r.id', 'p.round_id')
		.leftJoin('events as e', 'e.id', 'r.event_id')
		.where((w) =>
			w.where('e.club_id', clubId).orWhere((fr) =>
				fr
					.whereNull('e.id')
					.whereExists((s) => s.select(1).from('game_players as gp').whereRaw('gp.game_id = g.id').whereNotNull('gp.user_id'))
					.whereNotExists((s) =>
						s
							.select(1)
							.from('game_players as gp')
							.whereRaw('gp.game_id = g.id')
							.whereNotNull('gp.user_id')
							.whereNotIn('gp.user_id', q('club_members').select('user_id').where('club_id', clubId))
					)
			)
		);
	if (f.player) b.whereExists((s) => s.select(1).from('game_players as gp').whereRaw('gp.game_id = g.id').andWhere('gp.user_id', f.player!));
	if (f.event) b.andWhere('e.id', f.event);
	if (f.from) b.andWhereRaw('g.created_at::date >= ?::date', [f.from]);
	if (f.to) b.andWhereRaw('g.created_at::date <= ?::date', [f.to]);
	if (f.profile) b.andWhereRaw(`${profileLabel} = ?`, [DEFAULT_PROFILE, f.profile]);
	const ruled = (s: Knex.QueryBuilder) => s.select(1).from('game_moves as m').whereRaw('m.game_id = g.id').andWhere('m.kind', 'ruling-request');
	if (f.rulings === 'yes') b.whereExists(ruled);
	if (f.rulings === 'no') b.whereNotExists(ruled);
	return b;
}

export interface ArchiveGame {
	id: number;
	title: string;
	createdAt: Date;
	eventId: number | null;
	eventName: string | null;
	round: number | null;
	profile: string;
	players: string;
	moves: number;
	refused: number;
	/** ruling requests (disputes) raised at the table */
	rulings: number;
	/** rulings a judge gave */
	ruled: number;
}

export async function archive(clubId: number, f: ArchiveFilter, trx?: Db): Promise<ArchiveGame[]> {
	const q = use(trx);
	return clubGames(q, clubId, f)
		.select(
			'g.id',
			'g.title',
			'g.created_at as createdAt',
			'e.id as eventId',
			'e.name as eventName',
			'r.number as round',
			q.raw(`${profileLabel} as profile`, [DEFAULT_PROFILE]),
			q.raw(
				`coalesce((select string_agg(coalesce(u.display_name, 'open seat'), ' v ' order by gp.side) from game_players gp left join users u on u.id = gp.user_id where gp.game_id = g.id), '') as players`
			),
			q.raw("(select count(*) from game_moves m where m.game_id = g.id and m.kind = 'move')::int as moves"),
			q.raw("(select count(*) from game_moves m where m.game_id = g.id and m.kind = 'refused')::int as refused"),
			q.raw("(select count(*) from game_moves m where m.game_id = g.id and m.kind = 'ruling-request')::int as rulings"),
			q.raw("(select count(*) from game_moves m where m.game_id = g.id and m.kind = 'ruling')::int as ruled")
		)
		.orderBy('g.created_at', 'desc')
		.limit(500);
}

/** Everything the archive's filters offer: the club's events and members, and the profiles seen. */
export async function archiveChoices(clubId: number, trx?: Db): Promise<{ events: { id: number; name: string }[]; profiles: string[] }> {
	const q = use(trx);
	const evs = await q('events').where({ club_id: clubId }).select('id', 'name').orderBy('starts_on', 'desc');
	const profiles = await clubGames(q, clubId, {}).distinct(q.raw(`${profileLabel} as profile`, [DEFAULT_PROFILE]));
	return { events: evs, profiles: profiles.map((p: { profile: string }) => p.profile).sort() };
}

export interface Statistics {
	findings: { code: string; count: number }[];
	refusedBy: { code: string; count: number }[];
	rulingsPerEvent: { eventId: number | null; eventName: string; rulings: number; ruled: number; games: number }[];
	perGame: { id: number; title: string; moves: number; refused: number; rulings: number; ruled: number }[];
}

export async function statistics(clubId: number, f: ArchiveFilter, trx?: Db): Promise<Statistics> {
	const q = use(trx);
	const ids = clubGames(q, clubId, f).select('g.id');
	const findingCounts = (kinds: string[]) =>
		q('game_moves as m')
			.crossJoin(q.raw("jsonb_array_elements(coalesce(m.report->'findings', '[]'::jsonb)) as f"))
			.whereIn('m.game_id', ids.clone())
			.whereIn('m.kind', kinds)
			.select(q.raw("f->>'code' as code"), q.raw('count(*)::int as count'))
			.groupByRaw("f->>'code'")
			.orderBy([{ column: 'count', order: 'desc' }, { column: 'code' }]);
	const [findings, refusedBy, perGame] = await Promise.all([
		findingCounts(['move', 'refused']),
		// A warning never refuses a move: only the errors say why it was refused.
		findingCounts(['refused']).whereRaw("coalesce(f->>'severity', 'error') = 'error'"),
		archive(clubId, f, trx)
	]);
	const byEvent = new Map<string, Statistics['rulingsPerEvent'][number]>();
	for (const g of perGame) {
		const key = String(g.eventId ?? 'none');
		const row = byEvent.get(key) ?? { eventId: g.eventId, eventName: g.eventName ?? 'Friendly games', rulings: 0, ruled: 0, games: 0 };
		row.rulings += g.rulings;
		row.ruled += g.ruled;
		row.games += 1;
		byEvent.set(key, row);
	}
	return {
		findings,
		refusedBy,
		rulingsPerEvent: [...byEvent.values()].sort((a, b) => b.rulings - a.rulings || a.eventName.localeCompare(b.eventName)),
		perGame: perGame.map((g) => ({ id: g.id, title: g.title, moves: g.moves, refused: g.refused, rulings: g.rulings, ruled: g.ruled }))
	};
}

/** The newest logged games of the club, for its page. */
export async function recentGames(clubId: number, trx?: Db): Promise<ArchiveGame[]> {
	return (await archive(clubId, {}, trx)).slice(0, 10);
}

export const results = { report, confirm, enter, confirmed, standings, archive, archiveChoices, statistics, recentGames };
