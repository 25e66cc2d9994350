// Knex seed: the lively part of the demo, written through the app's own entity modules and
// game actions so that the move log and the game state are exactly what the app writes: a
// game in progress between Ada and Tomas on "Fennmoor crossroads" (rosters chosen, both sides
// deployed, round 1 with Ada's first move accepted and her second awaiting Tomas), and the
// club's upcoming one-day event organised by Priya, judged by Jun, with Ada and Mira entered
// and paid. Runs only while the demo people exist and there are no games and no events yet.
import type { Knex } from 'knex';
import type { User } from 'lucia';
import './support/lib-alias';
import { DEMO_CLUB, DEMO_EVENT, DEMO_GAME, DEMO_PEOPLE } from './data/demo';
import type { Pose, Side } from '../src/lib/schemas/game';

type Placement = { piece: string; at: Pose };
const at = (x: number, y: number, facing: number): Pose => ({ x, y, facing });
const row = (unit: string, n: number, x0: number, pitch: number, y: number, facing: number, from = 1): Placement[] =>
	Array.from({ length: n }, (_, i) => ({ piece: `${unit}-p${from + i}`, at: at(x0 + i * pitch, y, facing) }));

/** Where each side puts its pieces (hand-placed inside the demo layout's zones: A y ≤ 12, B y ≥ 48). */
const DEPLOY: Record<Side, Placement[]> = {
	a: [
		// Lamplighter Warband: ten 32 mm pieces in two rows, the 40 mm leader in front
		...row('a-u1', 5, 16, 1.6, 9, 90),
		...row('a-u1', 5, 16, 1.6, 7.4, 90, 6),
		{ piece: 'a-u1-l1', at: at(19.2, 10.8, 90) },
		// Signal Mast Crew (support ring source)
		...row('a-u2', 3, 27, 1.8, 9, 90),
		// Brass Strider (5 × 3 in hull)
		{ piece: 'a-u3-p1', at: at(8, 8, 90) },
		// Kestrel Riders (75 × 42 mm ovals)
		...row('a-u4', 3, 34, 3.2, 9, 90)
	],
	b: [
		// Thorn Wardens: eight 28.5 mm pieces
		...row('b-u4', 5, 16, 1.6, 51, 270),
		...row('b-u4', 3, 17.6, 1.6, 52.6, 270, 6),
		// Briar Stalkers (60 × 35 mm ovals)
		...row('b-u1', 5, 26, 2.6, 51.5, 270),
		// Moth Swarm
		...row('b-u2', 3, 5, 1.8, 51, 270),
		// Root Colossus (170 × 105 mm oval, support ring source)
		{ piece: 'b-u3-p1', at: at(30, 56.5, 270) }
	]
};

/** Every piece of a unit straight ahead by dy inches (one waypoint each). */
function forward(placements: Placement[], unit: string, dy: number) {
	const paths: Record<string, Pose[]> = {};
	for (const p of placements.filter((q) => q.piece.startsWith(`${unit}-`))) paths[p.piece] = [{ x: p.at.x, y: p.at.y + dy, facing: p.at.facing }];
	return paths;
}

export async function seed(knex: Knex): Promise<void> {
	const people = await knex('users').whereIn('email', DEMO_PEOPLE.map((p) => p.email)).select('id', 'email', 'display_name');
	if (people.length !== DEMO_PEOPLE.length) return; // not the demo database
	const [{ games: gameCount }] = await knex('games').count<{ games: number }[]>({ games: '*' });
	const [{ events: eventCount }] = await knex('events').count<{ events: number }[]>({ events: '*' });
	if (Number(gameCount) > 0 || Number(eventCount) > 0) return; // never seed over real play

	// The app's modules import each other through `$lib/…`: loaded after the alias is registered.
	const { db, closeDb } = await import('../src/lib/server/db/index');
	const { games } = await import('../src/lib/server/db/games');
	const { gamePlayers } = await import('../src/lib/server/db/game-players');
	const { gameActions } = await import('../src/lib/server/db/game-actions');
	const { events } = await import('../src/lib/server/db/events');
	const { entries } = await import('../src/lib/server/db/entries');
	const rules = await import('../src/lib/board/play/rules');
	const { profileSchema } = await import('../src/lib/schemas/check');
	const { layoutSchema } = await import('../src/lib/schemas/layout');

	try {
		const userOf = (key: string): User => {
			const person = DEMO_PEOPLE.find((p) => p.key === key)!;
			const r = people.find((u) => u.email === person.email)!;
			return { id: r.id, email: r.email, displayName: r.display_name, roles: person.roles } as unknown as User;
		};
		const rosterId = async (owner: string, name: string): Promise<number> =>
			(await knex('rosters').where({ owner_id: userOf(owner).id, name }).first('id')).id as number;
		const layoutRow = await knex('layouts').where({ name: DEMO_GAME.layoutName }).first('id', 'doc');
		const layouts = await knex('layouts').orderBy('id').select('id');

		// --- the game in progress ----------------------------------------------------------
		const ada = userOf(DEMO_GAME.sides.a.player);
		const tomas = userOf(DEMO_GAME.sides.b.player);
		// Set up as the app does on creation (game row, one row per side), with Tomas already
		// seated as if he had followed the invitation link.
		const gameId = await db.transaction(async (trx) => {
			const id = await games.add(
				{ title: DEMO_GAME.title, createdBy: ada.id, layoutId: layoutRow.id, layout: layoutSchema.parse(layoutRow.doc), profile: profileSchema.parse({}), state: rules.initialState('a') },
				trx
			);
			await gamePlayers.add({ gameId: id, side: 'a', userId: ada.id }, trx);
			await gamePlayers.add({ gameId: id, side: 'b', userId: tomas.id }, trx);
			return id;
		});
		let seq = 0;
		const expect = (what: string, answer: { status: number; body: unknown }) => {
			const body = answer.body as { seq?: number; error?: { message: string } };
			if (answer.status >= 300 || typeof body.seq !== 'number') {
				throw new Error(`demo game: ${what} answered ${answer.status} (${body.error?.message ?? JSON.stringify(body)}); recreate the database and seed again`);
			}
			seq = body.seq;
		};
		expect('Ada brings her roster', await gameActions.chooseRosterFor(gameId, ada, seq, 'a', await rosterId('ada', DEMO_GAME.sides.a.roster)));
		expect('Tomas brings his roster', await gameActions.chooseRosterFor(gameId, tomas, seq, 'b', await rosterId('tomas', DEMO_GAME.sides.b.roster)));
		for (const [side, user] of [['a', ada], ['b', tomas]] as const) {
			expect(`side ${side} deploys`, await gameActions.act(gameId, user, seq, (ctx) => rules.deploy(ctx, side, DEPLOY[side])));
			expect(`side ${side} ends deployment`, await gameActions.act(gameId, user, seq, (ctx) => rules.endTurn(ctx)));
		}
		// Round 1, Ada's turn: the ring source first (the screen's advice), accepted by Tomas;
		// then the warband, which waits for Tomas's acceptance on his tablet.
		expect('Ada moves the Signal Mast Crew', await gameActions.act(gameId, ada, seq, (ctx) => rules.propose(ctx, { seq, unit: 'a-u2', kind: 'move', paths: forward(DEPLOY.a, 'a-u2', 4) }), 201));
		expect('Tomas accepts', await gameActions.act(gameId, tomas, seq, (ctx) => rules.accept(ctx)));
		expect('Ada moves the Lamplighter Warband', await gameActions.act(gameId, ada, seq, (ctx) => rules.propose(ctx, { seq, unit: 'a-u1', kind: 'move', paths: forward(DEPLOY.a, 'a-u1', 3) }), 201));

		// --- the club's upcoming event ------------------------------------------------------
		const club = await knex('clubs').where({ name: DEMO_CLUB.name }).first('id');
		const day = new Date(Date.now() + DEMO_EVENT.daysAhead * 86_400_000).toISOString().slice(0, 10);
		const eventId = await events.add({
			clubId: club.id,
			name: DEMO_EVENT.name,
			kind: 'one-day',
			startsOn: day,
			endsOn: day,
			venue: DEMO_EVENT.venue,
			profileName: 'Table Standard',
			profile: profileSchema.parse({}),
			rounds: DEMO_EVENT.rounds,
			capacity: DEMO_EVENT.capacity,
			entryFee: DEMO_EVENT.entryFeeCents,
			currency: DEMO_EVENT.currency,
			layoutIds: layouts.map((l) => l.id as number),
			judgeIds: DEMO_EVENT.judges.map((k) => userOf(k).id),
			createdBy: userOf(DEMO_EVENT.organiser).id
		});
		for (const e of DEMO_EVENT.entrants) {
			const who = userOf(e.player);
			const r = await entries.register(eventId, who.id, await rosterId(e.player, e.roster), DEMO_EVENT.entryFeeCents);
			if (!r.ok) throw new Error(`demo event: entering ${e.player} failed (${r.reason})`);
			// Demo data: marked paid here, as the provider's webhook would, with no provider involved.
			const session = `cs_demo_${e.player}`;
			await db.transaction(async (trx) => {
				await entries.addPayment({ entryId: r.entryId, sessionId: session, amountCents: DEMO_EVENT.entryFeeCents, currency: DEMO_EVENT.currency }, trx);
				if (!(await entries.markPaid(session, `pi_demo_${e.player}`, trx))) throw new Error(`demo event: the payment of ${e.player} was not marked paid`);
			});
		}
	} finally {
		await closeDb();
	}
}
