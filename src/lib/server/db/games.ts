// Games: the row holding the layout snapshot, the profile and the current state, read plainly
// or locked for a change. Changes go through `act`, which appends to the move log and rewrites
// the state in one transaction with the row locked, so the log and the table never disagree.
import type { Layout } from '$lib/schemas/layout';
import type { Profile } from '$lib/schemas/check';
import type { GameState, Side } from '$lib/schemas/game';
import { db, use, type Db } from './index';
import type { GamePlayerRow } from './game-players';

export interface GameRow {
	id: number;
	title: string;
	createdBy: string;
	layoutId: number | null;
	layout: Layout;
	profile: Profile;
	state: GameState;
	seq: number;
	createdAt: Date;
	updatedAt: Date;
}

const columns = {
	id: 'games.id',
	title: 'games.title',
	createdBy: 'games.created_by',
	layoutId: 'games.layout_id',
	layout: 'games.layout',
	profile: 'games.profile',
	state: 'games.state',
	seq: 'games.seq',
	createdAt: 'games.created_at',
	updatedAt: 'games.updated_at'
} as const;

export async function add(
	input: { title: string; createdBy: string; layoutId: number | null; layout: Layout; profile: Profile; state: GameState },
	trx?: Db
): Promise<number> {
	const [row] = await use(trx)('games')
		.insert({
			title: input.title,
			created_by: input.createdBy,
			layout_id: input.layoutId,
			layout: JSON.stringify(input.layout),
			profile: JSON.stringify(input.profile),
			state: JSON.stringify(input.state)
		})
		.returning('id');
	return row.id as number;
}

export async function find(id: number, trx?: Db): Promise<GameRow | null> {
	const row = await use(trx)('games').select(columns).where('games.id', id).first();
	return (row as GameRow | undefined) ?? null;
}

/** The row locked until the transaction ends: concurrent changes to one game queue up here. */
export async function lock(id: number, trx: Db): Promise<GameRow | null> {
	const row = await trx('games').select(columns).where('games.id', id).forUpdate().first();
	return (row as GameRow | undefined) ?? null;
}

/** The game and its players in one round trip (the read of every change, see `act`). */
export async function findWithPlayers(id: number, trx?: Db): Promise<{ game: GameRow; players: GamePlayerRow[] } | null> {
	const { rows } = await use(trx).raw(
		`with g as (select * from games where id = ?)
		select g.id, g.title, g.created_by, g.layout_id, g.layout, g.profile, g.state, g.seq, g.created_at, g.updated_at,
			coalesce((
				select json_agg(json_build_object('side', p.side, 'userId', p.user_id, 'displayName', u.display_name, 'rosterId', p.roster_id, 'rosterName', r.name) order by p.side)
				from game_players p left join users u on u.id = p.user_id left join rosters r on r.id = p.roster_id
				where p.game_id = g.id
			), '[]'::json) as players
		from g`,
		[id]
	);
	const r = rows[0];
	if (!r) return null;
	const game: GameRow = {
		id: r.id,
		title: r.title,
		createdBy: r.created_by,
		layoutId: r.layout_id,
		layout: r.layout,
		profile: r.profile,
		state: r.state,
		seq: r.seq,
		createdAt: r.created_at,
		updatedAt: r.updated_at
	};
	const players = (r.players as Omit<GamePlayerRow, 'gameId'>[]).map((p) => ({ gameId: id, ...p }));
	return { game, players };
}

/** Only ever called by `act` with the row locked and the log entries appended in the same transaction. */
export async function saveState(id: number, state: GameState, seq: number, trx: Db): Promise<void> {
	await trx('games').where({ id }).update({ state: JSON.stringify(state), seq, updated_at: db.fn.now() });
}

export interface GameListItem {
	id: number;
	title: string;
	seq: number;
	phase: GameState['phase'];
	round: number;
	activeSide: Side;
	mySides: Side[];
	opponent: string | null;
	updatedAt: Date;
}

/** The games a user plays in, newest activity first. */
export async function listForUser(userId: string, trx?: Db): Promise<GameListItem[]> {
	const rows: { id: number; title: string; seq: number; state: GameState; updated_at: Date; my_sides: Side[]; opponent: string | null }[] =
		await use(trx)('games as g')
			.whereExists(function () {
				this.select(1).from('game_players as gp').whereRaw('gp.game_id = g.id').andWhere('gp.user_id', userId);
			})
			.select(
				'g.id',
				'g.title',
				'g.seq',
				'g.state',
				'g.updated_at',
				use(trx).raw('(select array_agg(side order by side) from game_players where game_id = g.id and user_id = ?) as my_sides', [userId]),
				use(trx).raw(
					`(select u.display_name from game_players p join users u on u.id = p.user_id
					  where p.game_id = g.id and p.user_id <> ? limit 1) as opponent`,
					[userId]
				)
			)
			.orderBy('g.updated_at', 'desc')
			.limit(100);
	return rows.map((r) => ({
		id: r.id,
		title: r.title,
		seq: r.seq,
		phase: r.state.phase,
		round: r.state.round,
		activeSide: r.state.activeSide,
		mySides: r.my_sides ?? [],
		opponent: r.opponent,
		updatedAt: r.updated_at
	}));
}

export const games = { add, find, findWithPlayers, lock, saveState, listForUser };
