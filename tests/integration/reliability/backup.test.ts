// Backup round trip: an admin exports a club (with its event, the event's game, its move log,
// a ruling request with a photo and the ruling) and a single game as one JSON file each, and
// imports each into an empty, freshly migrated database served by an app of our own. The
// restored app must answer the same game, the same log, the same replay page and the same
// standings as the original; importing twice is refused (409) and writes nothing.
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE, closeTestDb, testDb } from '../helpers';
import { call, clubEventFor, forward, gameInMovePhase, person, PASSWORD, type Json, type Person, type PlayedGame } from './world';
import { dropDatabase, migratedDatabase, Remote, SLOT, startApp, type AppProcess } from './processes';

const ADMIN_URL = (process.env.DATABASE_URL ?? '').replace(/\/[^/]+$/, '/postgres');
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

let game: PlayedGame;
let admin: Person;
let judge: Person;
let clubId: number;
let eventId: number;
let clubDoc: Json;
let gameDoc: Json;

interface Target {
	name: string;
	app: AppProcess;
	db: Knex;
	admin: Remote;
}
const targets: Target[] = [];

/** An empty, migrated database on the shared cluster, an app serving it, and an admin there. */
async function emptyTarget(n: number): Promise<Target> {
	const name = `inchwarden_restore_${SLOT}_${n}`;
	const url = process.env.DATABASE_URL!.replace(/\/[^/]+$/, `/${name}`);
	dropDatabase(ADMIN_URL, name);
	migratedDatabase(ADMIN_URL, url, name);
	const app = await startApp(3210 + SLOT * 2 + n, { DATABASE_URL: url });
	const db = knexFactory({ client: 'pg', connection: url, pool: { min: 0, max: 2 } });
	const who = new Remote(app.base);
	expect((await who.form('/sign-up', { email: `restorer-${n}@example.test`, displayName: 'Restoring Admin', password: PASSWORD })).status).toBe(303);
	const me = await who.call('GET', '/api/v1/session');
	await db('user_roles').insert({ user_id: me.json.user.id, role: 'admin' });
	const t = { name, app, db, admin: who };
	targets.push(t);
	return t;
}

const stripNonces = (html: string) => html.replace(/ nonce="[^"]*"/g, '');

beforeAll(async () => {
	const a = await person('backup-a');
	const b = await person('backup-b');
	admin = await person('backup-admin', ['admin']);
	judge = await person('backup-judge');
	const organiser = await person('backup-org', ['organiser']);
	game = await gameInMovePhase(a, b, 'Backup game');
	({ clubId, eventId } = await clubEventFor(game, organiser, judge));
	const g = (p: string) => `/api/v1/games/${game.id}${p}`;
	// A refused move, a legal one, its ruling request with a photo, and the judge's ruling.
	let r = await call(a.c, 'POST', g('/moves'), { seq: game.seq, unit: 'a-u1', kind: 'move', paths: forward(15) });
	expect(r.status).toBe(422);
	r = await call(a.c, 'POST', g('/moves'), { seq: r.json.seq, unit: 'a-u1', kind: 'move', paths: forward(11) });
	expect(r.status).toBe(201);
	const moveSeq = r.json.seq;
	const photo = await b.c.send('POST', '/api/v1/rulings/photos', PNG as unknown as string, { 'content-type': 'image/png', 'x-file-name': 'table.png' });
	expect(photo.status).toBe(201);
	const photoId = (await photo.json()).photo.id;
	const rr = await call(b.c, 'POST', '/api/v1/rulings', { gameId: game.id, seq: moveSeq, moveSeq, note: 'Was that 6 in?', photos: [photoId] });
	expect(rr.status, JSON.stringify(rr.json)).toBe(201);
	const list = await call(judge.c, 'GET', `/api/v1/rulings?game=${game.id}`);
	const requestId = list.json.requests[0].id;
	expect((await call(judge.c, 'POST', `/api/v1/rulings/${requestId}/take`)).status).toBe(200);
	const ruled = await call(judge.c, 'POST', `/api/v1/rulings/${requestId}/ruling`, { outcome: 'uphold', reason: 'Measured: 5.00 in of 6' });
	expect([200, 201]).toContain(ruled.status);
	await testDb()('event_pairings').where({ game_id: game.id }).update({ outcome: 'a', value_a: 3, value_b: 1, result_status: 'confirmed' });
}, 60_000);

afterAll(async () => {
	for (const t of targets) {
		await t.app.stop();
		await t.db.destroy();
		dropDatabase(ADMIN_URL, t.name);
	}
	await closeTestDb();
});

describe('export', () => {
	it('is for admins only: 401 signed out, 403 for a player, 400 without a scope, 404 for no such club', async () => {
		expect((await call(new (await import('../helpers')).Client(), 'GET', `/api/v1/admin/backup?club=${clubId}`)).status).toBe(401);
		expect((await call(game.a.c, 'GET', `/api/v1/admin/backup?club=${clubId}`)).status).toBe(403);
		expect((await call(admin.c, 'GET', '/api/v1/admin/backup')).status).toBe(400);
		expect((await call(admin.c, 'GET', '/api/v1/admin/backup?club=abc')).status).toBe(400);
		expect((await call(admin.c, 'GET', '/api/v1/admin/backup?club=999999')).status).toBe(404);
	});

	it('answers a club as one JSON file with its events, games, log, rulings, photos and people', async () => {
		const res = await admin.c.send('GET', `/api/v1/admin/backup?club=${clubId}`, undefined, { accept: 'application/json' });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="inchwarden-club-\d+\.json"/);
		clubDoc = await res.json();
		expect(clubDoc).toMatchObject({ format: 'inchwarden-backup', version: 1, scope: { kind: 'club', id: clubId } });
		const t = clubDoc.tables;
		expect(t.clubs).toHaveLength(1);
		expect(t.events.map((e: Json) => e.id)).toEqual([eventId]);
		expect(t.games.map((x: Json) => x.id)).toEqual([game.id]);
		expect(t.game_moves.map((m: Json) => m.seq)).toEqual(Array.from({ length: t.game_moves.length }, (_, i) => i + 1));
		expect(t.game_moves.map((m: Json) => m.kind)).toEqual(expect.arrayContaining(['refused', 'move', 'ruling-request', 'ruling']));
		expect(t.ruling_requests).toHaveLength(1);
		expect(t.ruling_request_photos).toHaveLength(1);
		expect(Buffer.from(clubDoc.objects[t.uploads[0].id], 'base64').equals(PNG)).toBe(true);
		// The people in it, and nobody else; sessions and invitations are not records.
		const people = new Set(t.users.map((u: Json) => u.id));
		expect(people).toEqual(new Set([game.a.id, game.b.id, judge.id, t.clubs[0].created_by]));
		expect(t).not.toHaveProperty('sessions');
	});

	it('answers one game with exactly the game’s rows of the club backup', async () => {
		const res = await call(admin.c, 'GET', `/api/v1/admin/backup?game=${game.id}`);
		expect(res.status).toBe(200);
		gameDoc = res.json;
		expect(gameDoc.scope).toEqual({ kind: 'game', id: game.id });
		expect(gameDoc.tables).not.toHaveProperty('clubs');
		for (const table of ['games', 'game_players', 'game_moves', 'ruling_requests', 'ruling_request_photos', 'rosters', 'uploads']) {
			expect(gameDoc.tables[table], table).toEqual(clubDoc.tables[table]);
		}
	});
});

describe('import into an empty database', () => {
	async function sameAnswers(t: Target, withClub: boolean): Promise<void> {
		// The players sign in on the restored app with their own passwords.
		const a2 = new Remote(t.app.base);
		expect((await a2.form('/sign-in', { email: game.a.email, password: PASSWORD })).status).toBe(303);
		for (const path of [`/api/v1/games/${game.id}`, `/api/v1/games/${game.id}/log`, `/api/v1/rulings?game=${game.id}`]) {
			const before = await call(game.a.c, 'GET', path);
			const after = await a2.call('GET', path);
			expect(after.status, path).toBe(200);
			if (!withClub && path.startsWith('/api/v1/rulings')) {
				// A game's own backup carries no event: the request is the same, with no event named.
				const noEvent = (j: Json) => j.requests.map(({ event, ...r }: Json) => (void event, r));
				expect(after.json.requests.every((r: Json) => r.event === null)).toBe(true);
				expect(noEvent(after.json), path).toEqual(noEvent(before.json));
			} else expect(after.json, path).toEqual(before.json);
		}
		// The replay page: the same markup (only the per-response script nonces differ).
		const before = await game.a.c.get(`/games/${game.id}/replay`);
		const after = await a2.raw('GET', `/games/${game.id}/replay`, undefined, { accept: 'text/html' });
		expect(after.status).toBe(200);
		const [html1, html2] = [stripNonces(await before.text()), stripNonces(await after.text())];
		if (withClub) expect(html2).toBe(html1);
		else {
			// A game's own backup carries no event: the page's data names none; all else is the same.
			const withoutEvent = html1.replace(/event:\{id:\d+,name:"[^"]*",round:\d+,table:(?:\d+|null)\}/g, 'event:null');
			expect(withoutEvent).not.toBe(html1);
			expect(html2).toBe(withoutEvent);
		}
		// The evidence photo's bytes came along.
		const photoId = clubDoc.tables.uploads[0].id;
		const photo = await a2.raw('GET', `/api/v1/rulings/photos/${photoId}`);
		expect(photo.status).toBe(200);
		expect(Buffer.from(await photo.arrayBuffer()).equals(PNG)).toBe(true);
		if (withClub) {
			const s1 = await call(game.a.c, 'GET', `/api/v1/events/${eventId}/standings`);
			const s2 = await a2.call('GET', `/api/v1/events/${eventId}/standings`);
			expect(s2.status).toBe(200);
			expect(s2.json).toEqual(s1.json);
		}
	}

	it('a club: the same game, log, ruling requests, replay and standings; a second import is 409 and writes nothing', async () => {
		const t = await emptyTarget(0);
		expect((await t.admin.call('POST', '/api/v1/admin/backup', { ...clubDoc, format: 'other' })).status).toBe(400);
		const imported = await t.admin.call('POST', '/api/v1/admin/backup', clubDoc);
		expect(imported.status, `${JSON.stringify(imported.json)}\n${t.app.output().slice(-1500)}`).toBe(201);
		expect(imported.json.imported.game_moves).toBe(clubDoc.tables.game_moves.length);
		await sameAnswers(t, true);
		// The restored log is still append-only and its seqs continue from the restored ones.
		const count = async () => Number((await t.db('game_moves').count<{ n: string }[]>({ n: '*' }))[0].n);
		const n = await count();
		const again = await t.admin.call('POST', '/api/v1/admin/backup', clubDoc);
		expect(again.status).toBe(409);
		expect(again.json.error.message).toMatch(/already holds/);
		expect(await count()).toBe(n);
		// New rows after the restored ones get fresh ids (the serial sequences were moved on).
		const [club] = await t.db('clubs').insert({ name: 'Made after the restore', town: '' }).returning('id');
		expect(club.id).toBeGreaterThan(clubId);
	}, 60_000);

	it('a single game: the same game, log, ruling requests and replay', async () => {
		const t = await emptyTarget(1);
		const imported = await t.admin.call('POST', '/api/v1/admin/backup', gameDoc);
		expect(imported.status, `${JSON.stringify(imported.json)}\n${t.app.output().slice(-1500)}`).toBe(201);
		await sameAnswers(t, false);
	}, 60_000);
});
