// /api/v1/layouts over real HTTP on the real test database: create, list, get, update with the
// version it was edited from (409 when stale), copy, delete; 401 signed out, 403 for another
// user, 400 with reasons for bad input.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, testDb } from '../helpers';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../../seeds/data/demo';
import { demoLayout } from '../../../src/lib/board/demo-layout';
import { emptyLayout, type SavedLayout } from '../../../src/lib/schemas/layout';

const person = (key: string) => DEMO_PEOPLE.find((p) => p.key === key)!;

async function signedIn(key: string): Promise<Client> {
	const c = new Client();
	const res = await c.send('POST', '/api/v1/session', JSON.stringify({ email: person(key).email, password: DEMO_PASSWORD }), {
		'content-type': 'application/json'
	});
	expect(res.status).toBe(200);
	return c;
}

const jsonHeaders = { 'content-type': 'application/json', accept: 'application/json' };
const call = async (c: Client, method: string, path: string, body?: unknown) => {
	const res = await c.send(method, path, body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body), jsonHeaders);
	const text = await res.text();
	return { status: res.status, body: text ? JSON.parse(text) : null };
};

let ada: Client;
let tomas: Client;
const created: number[] = [];

beforeAll(async () => {
	ada = await signedIn('ada');
	tomas = await signedIn('tomas');
});

afterAll(async () => {
	if (created.length) await testDb()('layouts').whereIn('id', created).delete();
	await closeTestDb();
});

async function create(c: Client, doc: unknown): Promise<SavedLayout> {
	const r = await call(c, 'POST', '/api/v1/layouts', { doc });
	expect(r.status).toBe(201);
	created.push(r.body.layout.id);
	return r.body.layout;
}

describe('/api/v1/layouts', () => {
	it('answers 401 to a signed-out caller on every verb', async () => {
		const anon = new Client();
		expect((await call(anon, 'GET', '/api/v1/layouts')).status).toBe(401);
		expect((await call(anon, 'POST', '/api/v1/layouts', { doc: demoLayout() })).status).toBe(401);
		expect((await call(anon, 'GET', '/api/v1/layouts/1')).status).toBe(401);
		expect((await call(anon, 'PUT', '/api/v1/layouts/1', { doc: demoLayout(), version: 1 })).status).toBe(401);
		expect((await call(anon, 'DELETE', '/api/v1/layouts/1')).status).toBe(401);
	});

	it('creates a layout, stores it with its schema version, and returns it by id', async () => {
		const saved = await create(ada, { ...demoLayout(), name: 'Ada test crossroads' });
		expect(saved).toMatchObject({ name: 'Ada test crossroads', version: 1, terrainCount: 6, objectiveCount: 4 });
		const row = await testDb()('layouts').where({ id: saved.id }).first();
		expect(row).toMatchObject({ schema_version: 1, name: 'Ada test crossroads', version: 1 });
		expect(row.doc.terrain).toHaveLength(6);

		const got = await call(ada, 'GET', `/api/v1/layouts/${saved.id}`);
		expect(got.status).toBe(200);
		expect(got.body.layout.doc).toEqual({ ...demoLayout(), name: 'Ada test crossroads' });
	});

	it('fills the defaults of a minimal document (44 × 60 in, empty lists)', async () => {
		const saved = await create(ada, { schemaVersion: 1, name: 'Bare table' });
		expect(saved.doc).toEqual({ ...emptyLayout('Bare table') });
	});

	it('lists every saved layout to any signed-in user, the caller’s own first, without e-mail addresses', async () => {
		const mine = await create(tomas, { ...emptyLayout('Tomas list check') });
		const list = await call(tomas, 'GET', '/api/v1/layouts');
		expect(list.status).toBe(200);
		const names = list.body.layouts.map((l: SavedLayout) => l.name);
		expect(names).toContain('Ada test crossroads');
		expect(names).toContain('Tomas list check');
		expect(list.body.layouts[0].ownerId).toBe(list.body.layouts.find((l: SavedLayout) => l.id === mine.id).ownerId);
		// no owner's address, whatever other tests have named their layouts
		const listed = JSON.stringify(list.body.layouts.map((l: SavedLayout & Record<string, unknown>) => ({ ...l, name: '', doc: null })));
		for (const p of DEMO_PEOPLE) expect(listed).not.toContain(p.email);
		for (const l of list.body.layouts) expect(Object.keys(l).filter((k) => /mail/i.test(k))).toEqual([]);
		expect(list.body.layouts.find((l: SavedLayout) => l.name === 'Ada test crossroads').ownerName).toBe(person('ada').displayName);
	});

	it('updates with the current version, then refuses the same (now stale) version with 409 and the current layout', async () => {
		const saved = await create(ada, { ...emptyLayout('Versioned table') });
		const doc1 = { ...saved.doc, objectives: [{ id: 'o1', x: 10, y: 10 }] };
		const ok = await call(ada, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: doc1, version: 1 });
		expect(ok.status).toBe(200);
		expect(ok.body.layout).toMatchObject({ version: 2, objectiveCount: 1 });

		const stale = await call(ada, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: { ...saved.doc, name: 'Lost edit' }, version: 1 });
		expect(stale.status).toBe(409);
		expect(stale.body.error.message).toMatch(/saved elsewhere/);
		expect(stale.body.current).toMatchObject({ version: 2, name: 'Versioned table' });
		const row = await testDb()('layouts').where({ id: saved.id }).first();
		expect(row).toMatchObject({ name: 'Versioned table', version: 2 });
	});

	it('two saves racing from the same version: exactly one wins', async () => {
		const saved = await create(ada, { ...emptyLayout('Race table') });
		const [a, b] = await Promise.all([
			call(ada, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: { ...saved.doc, name: 'Race A' }, version: 1 }),
			call(ada, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: { ...saved.doc, name: 'Race B' }, version: 1 })
		]);
		expect([a.status, b.status].sort()).toEqual([200, 409]);
	});

	it('refuses another user’s update and delete with 403, and leaves the layout as it was', async () => {
		const saved = await create(ada, { ...emptyLayout('Ada only') });
		const put = await call(tomas, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: { ...saved.doc, name: 'Taken over' }, version: 1 });
		expect(put.status).toBe(403);
		expect((await call(tomas, 'DELETE', `/api/v1/layouts/${saved.id}`)).status).toBe(403);
		const row = await testDb()('layouts').where({ id: saved.id }).first();
		expect(row).toMatchObject({ name: 'Ada only', version: 1 });
		// but he may read it and reuse it as his own copy
		expect((await call(tomas, 'GET', `/api/v1/layouts/${saved.id}`)).status).toBe(200);
		const copy = await call(tomas, 'POST', '/api/v1/layouts', { copyOf: saved.id });
		expect(copy.status).toBe(201);
		created.push(copy.body.layout.id);
		expect(copy.body.layout).toMatchObject({ name: 'Ada only (copy)', version: 1 });
		expect(copy.body.layout.ownerId).not.toBe(saved.ownerId);
		const edit = await call(tomas, 'PUT', `/api/v1/layouts/${copy.body.layout.id}`, { doc: { ...copy.body.layout.doc, name: 'Tomas version' }, version: 1 });
		expect(edit.status).toBe(200);
	});

	it('answers 400 with reasons for bad documents, bad JSON, a missing version and a bad id', async () => {
		const badDoc = await call(ada, 'POST', '/api/v1/layouts', {
			doc: { schemaVersion: 1, name: 'Bad', terrain: [{ id: 'x', kind: 'block', outline: [[0, 0], [1, 0], [1, 1]] }] }
		});
		expect(badDoc.status).toBe(400);
		expect(badDoc.body.error.issues.some((i: { path: string[] }) => i.path.join('.') === 'doc.terrain.0.height')).toBe(true);

		const wrongVersion = await call(ada, 'POST', '/api/v1/layouts', { doc: { ...demoLayout(), schemaVersion: 9 } });
		expect(wrongVersion.status).toBe(400);

		expect((await call(ada, 'POST', '/api/v1/layouts', '{"doc": ')).status).toBe(400);

		const saved = await create(ada, { ...emptyLayout('For bad puts') });
		const noVersion = await call(ada, 'PUT', `/api/v1/layouts/${saved.id}`, { doc: saved.doc });
		expect(noVersion.status).toBe(400);
		expect(noVersion.body.error.issues[0].path).toEqual(['version']);

		expect((await call(ada, 'GET', '/api/v1/layouts/not-a-number')).status).toBe(400);
		expect((await call(ada, 'GET', '/api/v1/layouts/99999999')).status).toBe(404);
		expect((await call(ada, 'POST', '/api/v1/layouts', { copyOf: 99999999 })).status).toBe(404);
	});

	it('deletes one’s own layout (204), after which it is gone (404)', async () => {
		const saved = await create(ada, { ...emptyLayout('Short-lived') });
		expect((await call(ada, 'DELETE', `/api/v1/layouts/${saved.id}`)).status).toBe(204);
		expect((await call(ada, 'GET', `/api/v1/layouts/${saved.id}`)).status).toBe(404);
	});
});

describe('layout pages', () => {
	it('the edit page is the owner’s: another user gets 403, a signed-out visitor goes to sign-in', async () => {
		const saved = await create(ada, { ...emptyLayout('Page owner check') });
		expect((await ada.get(`/layouts/${saved.id}/edit`)).status).toBe(200);
		expect((await tomas.get(`/layouts/${saved.id}/edit`)).status).toBe(403);
		const anon = await new Client().get(`/layouts/${saved.id}/edit`);
		expect(anon.status).toBe(303);
		expect(anon.headers.get('location')).toMatch(/^\/sign-in/);
	});

	it('“Use a copy” from the list makes the copy the user’s own and opens it in the editor', async () => {
		const saved = await create(ada, { ...demoLayout(), name: 'Copy me' });
		const res = await tomas.post('/layouts?/copy', { id: String(saved.id) });
		expect(res.status).toBe(303);
		const m = res.headers.get('location')!.match(/^\/layouts\/(\d+)\/edit$/);
		expect(m).not.toBeNull();
		created.push(Number(m![1]));
		const row = await testDb()('layouts').where({ id: Number(m![1]) }).first();
		expect(row.name).toBe('Copy me (copy)');
		expect(row.doc.terrain).toHaveLength(6);
	});
});
