// A small world for the reliability tests, built over real HTTP where the app can build it
// (accounts, a game played into its movement part) and in the test database where HTTP cannot
// (roles, a club with an event whose round pairs the game). Every person is fresh per call.
import { expect } from 'vitest';
import { Client, freshEmail, testDb, waitForMail } from '../helpers';
import { LAYOUT, UNITS_A, UNITS_B } from '../../unit/games/fixtures';

export const PASSWORD = 'long enough password';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type Json = Record<string, any>;

export async function call(c: Client, method: string, path: string, body?: unknown): Promise<{ status: number; json: Json; headers: Headers }> {
	const res = await c.send(method, path, body === undefined ? undefined : JSON.stringify(body), {
		'content-type': 'application/json',
		accept: 'application/json'
	});
	const text = await res.text();
	let json: Json = {};
	try {
		json = text ? JSON.parse(text) : {};
	} catch {
		json = { text };
	}
	return { status: res.status, json, headers: res.headers };
}

export interface Person {
	c: Client;
	email: string;
	id: string;
}

export async function person(tag: string, roles: ('judge' | 'organiser' | 'admin')[] = []): Promise<Person> {
	const c = new Client();
	const email = freshEmail(tag);
	const res = await c.signUp(email, PASSWORD, `${tag} person`);
	expect(res.status, `sign-up of ${tag}`).toBe(303);
	const me = await call(c, 'GET', '/api/v1/session');
	expect(me.status).toBe(200);
	const id = me.json.user.id as string;
	for (const role of roles) await testDb()('user_roles').insert({ user_id: id, role });
	return { c, email, id };
}

/** A second signed-in client (another tablet) for the same person. */
export async function secondTablet(p: Person): Promise<Client> {
	const c = new Client();
	expect((await c.signIn(p.email, PASSWORD)).status).toBe(303);
	return c;
}

export async function roster(ownerId: string, name: string, units: unknown): Promise<number> {
	const [row] = await testDb()('rosters').insert({ owner_id: ownerId, name, force: 'Test force', units: JSON.stringify(units) }).returning('id');
	return row.id;
}

export interface PlayedGame {
	id: number;
	seq: number;
	a: Person;
	b: Person;
}

/** A game between `a` (side A) and `b` (side B), set up, deployed, in round 1 with side A to move. */
export async function gameInMovePhase(a: Person, b: Person, title = 'Reliability game'): Promise<PlayedGame> {
	const rosterA = await roster(a.id, 'Alpha list', UNITS_A);
	const rosterB = await roster(b.id, 'Bravo list', UNITS_B);
	const created = await call(a.c, 'POST', '/api/v1/games', { title, layout: LAYOUT, opponent: { mode: 'invite', email: b.email }, rosterA });
	expect(created.status, JSON.stringify(created.json)).toBe(201);
	const id = created.json.id as number;
	const [message] = await waitForMail(b.email);
	const token = message.text.match(/\/games\/join\/([a-z2-7]+)/)![1];
	expect((await call(b.c, 'POST', '/api/v1/games/join', { token })).status).toBe(200);
	const g = (p: string) => `/api/v1/games/${id}${p}`;
	let seq = (await call(a.c, 'GET', g(''))).json.game.seq as number;
	const step = async (c: Client, path: string, body: Json) => {
		const r = await call(c, 'POST', g(path), { seq, ...body });
		expect(r.status, `${path}: ${JSON.stringify(r.json)}`).toBeLessThan(300);
		seq = r.json.seq;
	};
	await step(b.c, '/roster', { side: 'b', rosterId: rosterB });
	await step(a.c, '/deploy', {
		side: 'a',
		placements: [
			{ piece: 'a-u1-p1', at: { x: 10, y: 6 } },
			{ piece: 'a-u1-p2', at: { x: 12, y: 6 } },
			{ piece: 'a-u1-p3', at: { x: 14, y: 6 } },
			{ piece: 'a-u2-p1', at: { x: 20, y: 6 } }
		]
	});
	await step(a.c, '/end-turn', {});
	await step(b.c, '/deploy', {
		side: 'b',
		placements: [
			{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } },
			{ piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } },
			{ piece: 'b-u2-p1', at: { x: 30, y: 54 } },
			{ piece: 'b-u2-p2', at: { x: 32, y: 54 } },
			{ piece: 'b-u2-l1', at: { x: 34, y: 54 } }
		]
	});
	await step(b.c, '/end-turn', {});
	return { id, seq, a, b };
}

/** Side A's first unit moved straight forward to `y` (legal up to y = 12: a 6 in allowance). */
export const forward = (y: number, dx = 0) => ({ 'a-u1-p1': [{ x: 10 + dx, y }], 'a-u1-p2': [{ x: 12 + dx, y }], 'a-u1-p3': [{ x: 14 + dx, y }] });

/** A club (organiser + members), an event of it with a judge, and a round pairing the game. */
export async function clubEventFor(game: PlayedGame, organiser: Person, eventJudge: Person): Promise<{ clubId: number; eventId: number }> {
	const db = testDb();
	const [club] = await db('clubs').insert({ name: `Reliability club ${Date.now()}-${Math.random().toString(36).slice(2, 8)}`, town: 'Testford', created_by: organiser.id }).returning('id');
	await db('club_members').insert([
		{ club_id: club.id, user_id: organiser.id, role: 'organiser' },
		{ club_id: club.id, user_id: game.a.id, role: 'member' },
		{ club_id: club.id, user_id: game.b.id, role: 'member' }
	]);
	const [event] = await db('events')
		.insert({ club_id: club.id, name: 'Reliability open', starts_on: '2026-12-05', ends_on: '2026-12-05', created_by: organiser.id, status: 'closed' })
		.returning('id');
	await db('event_judges').insert({ event_id: event.id, user_id: eventJudge.id });
	const [round] = await db('event_rounds').insert({ event_id: event.id, number: 1, status: 'published', published_at: new Date() }).returning('id');
	await db('event_pairings').insert({ round_id: round.id, table_no: 1, player_a: game.a.id, player_b: game.b.id, game_id: game.id });
	return { clubId: club.id, eventId: event.id };
}
