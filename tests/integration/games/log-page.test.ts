// The move log page and its JSON download over real HTTP on the test database: a player reads
// every entry (200, the refused move's costs and findings in words), a stranger is refused (403),
// a signed-out visitor is sent to sign in; an unknown game is 404.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, freshEmail, testDb } from '../helpers';
import { LAYOUT, UNITS_A, UNITS_B } from '../../unit/games/fixtures';

const PASSWORD = 'long enough password';

async function call(c: Client, method: string, path: string, body?: unknown) {
	const res = await c.send(method, path, body === undefined ? undefined : JSON.stringify(body), { 'content-type': 'application/json', accept: 'application/json' });
	const text = await res.text();
	return { status: res.status, json: text ? JSON.parse(text) : {} };
}

async function person(tag: string) {
	const c = new Client();
	const email = freshEmail(tag);
	expect((await c.signUp(email, PASSWORD, `${tag} player`)).status).toBe(303);
	const me = await call(c, 'GET', '/api/v1/session');
	return { c, id: me.json.user.id as string };
}

let player: Awaited<ReturnType<typeof person>>;
let stranger: Awaited<ReturnType<typeof person>>;
let gameId: number;

beforeAll(async () => {
	[player, stranger] = [await person('logger'), await person('outsider')];
	const db = testDb();
	const [ra] = await db('rosters').insert({ owner_id: player.id, name: 'Log list A', force: 'Test force', units: JSON.stringify(UNITS_A) }).returning('id');
	const [rb] = await db('rosters').insert({ owner_id: player.id, name: 'Log list B', force: 'Test force', units: JSON.stringify(UNITS_B) }).returning('id');
	const made = await call(player.c, 'POST', '/api/v1/games', { title: 'Log page game', layout: LAYOUT, opponent: { mode: 'shared' } });
	expect(made.status).toBe(201);
	gameId = made.json.id;
	const g = (p: string) => `/api/v1/games/${gameId}${p}`;
	let seq = 0;
	const step = async (p: string, body: Record<string, unknown>, want = 200) => {
		const r = await call(player.c, 'POST', g(p), { seq, ...body });
		expect(r.status, JSON.stringify(r.json)).toBe(want);
		seq = r.json.seq ?? r.json.game?.seq ?? seq;
		return r;
	};
	await step('/roster', { side: 'a', rosterId: ra.id });
	await step('/roster', { side: 'b', rosterId: rb.id });
	await step('/deploy', { side: 'a', placements: [{ piece: 'a-u2-p1', at: { x: 20, y: 6 } }] });
	await step('/end-turn', {});
	await step('/deploy', { side: 'b', placements: [{ piece: 'b-u2-p1', at: { x: 20, y: 54, facing: 270 } }] });
	await step('/end-turn', {});
	// 7 in straight ahead for a 5 in piece: refused, and logged as refused with the report
	await step('/moves', { unit: 'a-u2', kind: 'move', paths: { 'a-u2-p1': [{ x: 20, y: 13 }] } }, 422);
});

afterAll(async () => {
	await closeTestDb();
});

describe('the move log page', () => {
	it('shows a player every entry, with the refused move in words', async () => {
		const res = await player.c.get(`/games/${gameId}/log`);
		expect(res.status).toBe(200);
		const html = await res.text();
		const rows = [...html.matchAll(/data-testid="log-row" data-seq="(\d+)" data-kind="([a-z-]+)"/g)].map((m) => [Number(m[1]), m[2]]);
		expect(rows).toEqual([[1, 'roster'], [2, 'roster'], [3, 'deploy'], [4, 'end-turn'], [5, 'deploy'], [6, 'end-turn'], [7, 'refused']]);
		expect(html).toContain('a-u2-p1: 7.00 in of 5');
		expect(html).toMatch(/✕ a-u2-p1.{0,8}s path costs 7\.00 in [^<]*it may move 5 in/);
		expect(html).toContain(`/games/${gameId}/replay?seq=7`);
	});

	it('refuses a stranger (403) and sends a signed-out visitor to sign in', async () => {
		expect((await stranger.c.get(`/games/${gameId}/log`)).status).toBe(403);
		const out = await new Client().get(`/games/${gameId}/log`);
		expect(out.status).toBe(303);
		expect(out.headers.get('location')).toMatch(/\/sign-in/);
		expect((await player.c.get(`/games/99999999/log`)).status).toBe(404);
	});

	it('downloads the log as JSON for a player only', async () => {
		const res = await player.c.get(`/games/${gameId}/log/download`, { accept: 'application/json' });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="move-log-game-\d+-to-7\.json"/);
		const body = await res.json();
		expect(body.game).toMatchObject({ id: gameId, title: 'Log page game', seq: 7 });
		expect(body.entries).toHaveLength(7);
		expect(body.entries[6]).toMatchObject({ seq: 7, kind: 'refused', verdict: 'illegal', costs: ['a-u2-p1: 7.00 in of 5'] });
		expect((await stranger.c.get(`/games/${gameId}/log/download`, { accept: 'application/json' })).status).toBe(403);
		expect((await new Client().get(`/games/${gameId}/log/download`, { accept: 'application/json' })).status).toBe(401);
	});
});
