// Games over real HTTP on the real test database: create with an e-mailed invitation, join,
// rosters, deployment, the move flow (legal, refused, dash, accept, take-back, one move per unit
// per turn), who may act (403), stale seqs (409), live events, and the append-only move log.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, freshEmail, testDb, waitForMail } from '../helpers';
import { LAYOUT, UNITS_A, UNITS_B } from '../../unit/games/fixtures';

const PASSWORD = 'long enough password';

interface Json {
	[k: string]: any; // eslint-disable-line @typescript-eslint/no-explicit-any
}

async function call(c: Client, method: string, path: string, body?: unknown): Promise<{ status: number; json: Json }> {
	const res = await c.send(method, path, body === undefined ? undefined : JSON.stringify(body), {
		'content-type': 'application/json',
		accept: 'application/json'
	});
	const text = await res.text();
	return { status: res.status, json: text ? JSON.parse(text) : {} };
}

async function person(tag: string): Promise<{ c: Client; email: string; id: string }> {
	const c = new Client();
	const email = freshEmail(tag);
	expect((await c.signUp(email, PASSWORD, `${tag} player`)).status).toBe(303);
	const me = await call(c, 'GET', '/api/v1/session');
	return { c, email, id: me.json.user.id };
}

async function roster(ownerId: string, name: string, units: unknown): Promise<number> {
	const [row] = await testDb()('rosters').insert({ owner_id: ownerId, name, force: 'Test force', units: JSON.stringify(units) }).returning('id');
	return row.id;
}

/** Reads server-sent events until one carries a seq ≥ `want`. */
async function waitForEvent(res: Response, want: number, timeoutMs = 5000): Promise<number> {
	const reader = res.body!.getReader();
	const dec = new TextDecoder();
	let buf = '';
	const until = Date.now() + timeoutMs;
	try {
		for (;;) {
			const left = until - Date.now();
			if (left <= 0) throw new Error(`no event with seq ≥ ${want} within ${timeoutMs} ms; got: ${buf}`);
			const chunk = await Promise.race([reader.read(), new Promise<never>((_, rej) => setTimeout(() => rej(new Error(`no event with seq ≥ ${want}; got: ${buf}`)), left))]);
			if (chunk.done) throw new Error('the stream ended');
			buf += dec.decode(chunk.value, { stream: true });
			for (const m of buf.matchAll(/event: seq\ndata: (\{[^\n]*\})/g)) {
				const seq = JSON.parse(m[1]).seq as number;
				if (seq >= want) return seq;
			}
		}
	} finally {
		await reader.cancel().catch(() => undefined);
	}
}

let a: Awaited<ReturnType<typeof person>>;
let b: Awaited<ReturnType<typeof person>>;
let stranger: Awaited<ReturnType<typeof person>>;
let gameId: number;
let seq: number;
let rosterA: number;
let rosterB: number;

const g = (path = '') => `/api/v1/games/${gameId}${path}`;

beforeAll(async () => {
	[a, b, stranger] = [await person('alpha'), await person('bravo'), await person('stranger')];
	rosterA = await roster(a.id, 'Alpha list', UNITS_A);
	rosterB = await roster(b.id, 'Bravo list', UNITS_B);
});

afterAll(async () => {
	await closeTestDb();
});

describe('setting a game up', () => {
	it('refuses a signed-out visitor (401) and a bad body (400 with the issues)', async () => {
		expect((await call(new Client(), 'POST', '/api/v1/games', { title: 'x' })).status).toBe(401);
		const bad = await call(a.c, 'POST', '/api/v1/games', { title: '', opponent: { mode: 'invite', email: 'not-an-address' }, layout: LAYOUT });
		expect(bad.status).toBe(400);
		expect(bad.json.error.issues.map((i: Json) => i.path.join('.'))).toEqual(expect.arrayContaining(['title', 'opponent.email']));
	});

	it('creates a game and e-mails the invitation link to the opponent through the fake SMTP server', async () => {
		const res = await call(a.c, 'POST', '/api/v1/games', { title: 'Integration skirmish', layout: LAYOUT, opponent: { mode: 'invite', email: b.email }, rosterA });
		expect(res.status).toBe(201);
		gameId = res.json.id;
		const [message] = await waitForMail(b.email);
		expect(message.subject).toContain('invites you to a game');
		const link = message.text.match(/https?:\/\/\S+\/games\/join\/([a-z2-7]+)/);
		expect(link, message.text).not.toBeNull();
		// Only a hash of the token is stored.
		const stored = await testDb()('game_invitations').where({ game_id: gameId }).first();
		expect(stored.token_hash).not.toBe(link![1]);
		expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);

		const view = await call(a.c, 'GET', g());
		expect(view.status).toBe(200);
		expect(view.json.game.layout.name).toBe('Test table');
		expect(view.json.game.profile.keepOut).toBe(1);
		expect(view.json.game.state).toMatchObject({ phase: 'setup', round: 0, activeSide: 'a' });
		expect(view.json.game.players.find((p: Json) => p.side === 'b').invited).toBe(b.email);
		seq = view.json.game.seq;
		expect(seq).toBe(1); // the roster choice of side A is the first log entry

		// The invitee joins with the link; it works once.
		const joined = await call(b.c, 'POST', '/api/v1/games/join', { token: link![1] });
		expect(joined).toMatchObject({ status: 200, json: { id: gameId, side: 'b' } });
		expect((await call(stranger.c, 'POST', '/api/v1/games/join', { token: link![1] })).status).toBe(410);
	});

	it('keeps strangers out (403) and shows the invitee no e-mail address', async () => {
		expect((await call(stranger.c, 'GET', g())).status).toBe(403);
		expect((await call(stranger.c, 'GET', g('/log'))).status).toBe(403);
		expect((await call(stranger.c, 'GET', g('/events'))).status).toBe(403);
		expect((await call(stranger.c, 'GET', '/api/v1/games/999999')).status).toBe(404);
		const view = await call(b.c, 'GET', g());
		expect(view.json.game.mySides).toEqual(['b']);
		expect(JSON.stringify(view.json)).not.toContain(a.email);
		expect(view.json.game.players.every((p: Json) => !('invited' in p))).toBe(true);
	});

	it('each player brings their own roster; the pieces are expanded from it', async () => {
		const foreign = await call(b.c, 'POST', g('/roster'), { seq, side: 'b', rosterId: rosterA });
		expect(foreign.status).toBe(400);
		const wrongSide = await call(b.c, 'POST', g('/roster'), { seq, side: 'a', rosterId: rosterB });
		expect(wrongSide.status).toBe(403);
		const res = await call(b.c, 'POST', g('/roster'), { seq, side: 'b', rosterId: rosterB });
		expect(res.status).toBe(200);
		seq = res.json.seq;
		expect(res.json.game.state.phase).toBe('deploy');
		expect(res.json.game.state.pieces.map((p: Json) => p.id)).toEqual(
			expect.arrayContaining(['a-u1-p1', 'a-u1-p3', 'a-u2-p1', 'b-u1-p2', 'b-u2-l1'])
		);
	});

	it('deploys into the zones only, then both deployments end and round 1 begins', async () => {
		const outside = await call(a.c, 'POST', g('/deploy'), { seq, side: 'a', placements: [{ piece: 'a-u1-p1', at: { x: 10, y: 30 } }] });
		expect(outside.status).toBe(422);
		expect(outside.json.error.message).toMatch(/deployment zone/);
		const early = await call(b.c, 'POST', g('/deploy'), { seq, side: 'b', placements: [{ piece: 'b-u1-p1', at: { x: 10, y: 54 } }] });
		expect(early.status).toBe(403);
		let r = await call(a.c, 'POST', g('/deploy'), {
			seq,
			side: 'a',
			placements: [
				{ piece: 'a-u1-p1', at: { x: 10, y: 6 } },
				{ piece: 'a-u1-p2', at: { x: 12, y: 6 } },
				{ piece: 'a-u1-p3', at: { x: 14, y: 6 } },
				{ piece: 'a-u2-p1', at: { x: 20, y: 6 } }
			]
		});
		expect(r.status).toBe(200);
		seq = r.json.seq;
		r = await call(a.c, 'POST', g('/end-turn'), { seq });
		expect(r.status).toBe(200);
		seq = r.json.seq;
		r = await call(b.c, 'POST', g('/deploy'), {
			seq,
			side: 'b',
			placements: [
				{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } },
				{ piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } },
				{ piece: 'b-u2-p1', at: { x: 30, y: 54 } },
				{ piece: 'b-u2-p2', at: { x: 32, y: 54 } },
				{ piece: 'b-u2-l1', at: { x: 34, y: 54 } }
			]
		});
		expect(r.status).toBe(200);
		seq = r.json.seq;
		r = await call(b.c, 'POST', g('/end-turn'), { seq });
		expect(r.status).toBe(200);
		seq = r.json.seq;
		expect(r.json.game.state).toMatchObject({ phase: 'move', round: 1, activeSide: 'a' });
	});
});

describe('the move flow', () => {
	const forward = (y: number) => ({ 'a-u1-p1': [{ x: 10, y }], 'a-u1-p2': [{ x: 12, y }], 'a-u1-p3': [{ x: 14, y }] });

	it('refuses the wrong side (403), a stranger (403) and a stale seq (409 with the current state)', async () => {
		expect((await call(b.c, 'POST', g('/moves'), { seq, unit: 'b-u1', kind: 'hold' })).status).toBe(403);
		expect((await call(stranger.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'hold' })).status).toBe(403);
		const stale = await call(a.c, 'POST', g('/moves'), { seq: seq - 1, unit: 'a-u1', kind: 'move', paths: forward(8) });
		expect(stale.status).toBe(409);
		expect(stale.json.game.seq).toBe(seq);
		expect(stale.json.game.state.pieces.find((p: Json) => p.id === 'a-u1-p1').at).toMatchObject({ x: 10, y: 6 });
	});

	it('an illegal move is refused with findings and logged as refused; the pieces stay', async () => {
		// 9 in against a 6 in allowance.
		const r = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'move', paths: forward(15) });
		expect(r.status).toBe(422);
		expect(r.json.report.verdict).toBe('illegal');
		const codes = r.json.report.findings.map((f: Json) => f.code);
		expect(codes).toContain('over-allowance');
		expect(r.json.report.findings[0].message).toMatch(/in/);
		expect(r.json.seq).toBe(seq + 1);
		seq = r.json.seq;
		expect(r.json.game.state.pieces.find((p: Json) => p.id === 'a-u1-p1').at).toMatchObject({ x: 10, y: 6 });
		const log = await call(a.c, 'GET', g(`/log?after=${seq - 1}`));
		expect(log.json.entries).toHaveLength(1);
		expect(log.json.entries[0]).toMatchObject({ seq, kind: 'refused', side: 'a', payload: { unit: 'a-u1', kind: 'move' } });
		expect(log.json.entries[0].report.verdict).toBe('illegal');
	});

	it('a legal move is appended, reaches the other player as a server-sent event, and is accepted', async () => {
		const events = await b.c.send('GET', g('/events'), undefined, { accept: 'text/event-stream' });
		expect(events.status).toBe(200);
		expect(events.headers.get('content-type')).toMatch(/text\/event-stream/);

		const r = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'move', paths: forward(11) });
		expect(r.status).toBe(201);
		expect(r.json.report.verdict).toBe('legal');
		seq = r.json.seq;
		expect(await waitForEvent(events, seq)).toBe(seq);

		const moved = r.json.game.state;
		expect(moved.pieces.find((p: Json) => p.id === 'a-u1-p2').at).toMatchObject({ x: 12, y: 11 });
		expect(moved.pending).toMatchObject({ seq, unit: 'a-u1', side: 'a' });
		expect(moved.summaries.objectives[0].id).toBe('obj-1');

		// The mover cannot accept its own move; the opponent can.
		expect((await call(a.c, 'POST', g('/accept'), { seq })).status).toBe(403);
		const acc = await call(b.c, 'POST', g('/accept'), { seq });
		expect(acc.status).toBe(200);
		seq = acc.json.seq;
		expect(acc.json.game.state.pending).toBeNull();
	});

	it('refuses a second move of the same unit in one turn', async () => {
		const r = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'move', paths: forward(12) });
		expect(r.status).toBe(409);
		expect(r.json.error.message).toMatch(/moved already/);
	});

	it('a dash: the server rolls and logs the die before any piece moves, then the dash is checked with it', async () => {
		expect((await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u2', kind: 'dash', paths: { 'a-u2-p1': [{ x: 20, y: 10 }] } })).status).toBe(409);
		const rolled = await call(a.c, 'POST', g('/roll'), { seq, unit: 'a-u2' });
		expect(rolled.status).toBe(201);
		const die = rolled.json.game.state.die.value as number;
		expect(die).toBeGreaterThanOrEqual(1);
		expect(die).toBeLessThanOrEqual(6);
		const rollSeq = rolled.json.seq;
		seq = rollSeq;
		// 5 in allowance + die: move exactly 5 in, legal whatever the die.
		const dash = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u2', kind: 'dash', paths: { 'a-u2-p1': [{ x: 20, y: 11 }] } });
		expect(dash.status).toBe(201);
		seq = dash.json.seq;
		expect(dash.json.report.pieces['a-u2-p1'].allowance).toBe(5 + die);
		const log = await call(a.c, 'GET', g(`/log?after=${rollSeq - 1}`));
		expect(log.json.entries.map((e: Json) => [e.seq, e.kind])).toEqual([
			[rollSeq, 'roll'],
			[rollSeq + 1, 'move']
		]);
		expect(log.json.entries[0].payload).toMatchObject({ unit: 'a-u2', die });
		expect(log.json.entries[1].payload).toMatchObject({ kind: 'dash', die });
	});

	it('the mover takes the dash back before acceptance: logged, positions restored, never deleted', async () => {
		const r = await call(a.c, 'POST', g('/take-back'), { seq });
		expect(r.status).toBe(200);
		seq = r.json.seq;
		expect(r.json.game.state.pieces.find((p: Json) => p.id === 'a-u2-p1').at).toMatchObject({ x: 20, y: 6 });
		expect(r.json.game.state.pending).toBeNull();
		const log = await call(a.c, 'GET', g(`/log?after=${seq - 3}`));
		expect(log.json.entries.map((e: Json) => e.kind)).toEqual(['roll', 'move', 'take-back']);
		// Nothing accepted is left to take back.
		expect((await call(a.c, 'POST', g('/take-back'), { seq })).status).toBe(409);
	});

	it('the opponent may ask for a ruling with a note', async () => {
		// The die of the taken-back dash stays rolled: the unit dashes again with it.
		const dash = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u2', kind: 'dash', paths: { 'a-u2-p1': [{ x: 21, y: 10 }] } });
		expect(dash.status).toBe(201);
		seq = dash.json.seq;
		const rr = await call(b.c, 'POST', g('/ruling-request'), { seq, note: 'Please check the distance to the crate' });
		expect(rr.status).toBe(201);
		seq = rr.json.seq;
		const end = await call(a.c, 'POST', g('/end-turn'), { seq });
		expect(end.status).toBe(200);
		seq = end.json.seq;
		expect(end.json.game.state).toMatchObject({ round: 1, activeSide: 'b', movedUnits: [] });
	});

	it('a reconnecting stream that names the last seq it saw is told the current seq at once', async () => {
		const events = await b.c.send('GET', g('/events'), undefined, { accept: 'text/event-stream', 'last-event-id': String(seq - 2) });
		expect(events.status).toBe(200);
		expect(await waitForEvent(events, seq, 2000)).toBe(seq);
	});

	it('keeps a gap-free, unique seq per game in the log', async () => {
		const log = await call(b.c, 'GET', g('/log'));
		expect(log.json.seq).toBe(seq);
		expect(log.json.entries.map((e: Json) => e.seq)).toEqual(Array.from({ length: seq }, (_, i) => i + 1));
		const dup = testDb()('game_moves').insert({ game_id: gameId, seq: 1, kind: 'accept', actor: a.id, payload: '{}' });
		await expect(dup).rejects.toThrow(/unique|duplicate/i);
	});
});

describe('the move log is append-only in the database', () => {
	it('refuses UPDATE, DELETE and TRUNCATE on game_moves', async () => {
		const db = testDb();
		await expect(db('game_moves').where({ game_id: gameId, seq: 1 }).update({ kind: 'accept' })).rejects.toThrow(/append-only/);
		await expect(db('game_moves').where({ game_id: gameId }).del()).rejects.toThrow(/append-only/);
		await expect(db.raw('truncate game_moves cascade')).rejects.toThrow(/append-only/);
		const count = await db('game_moves').where({ game_id: gameId }).count<{ count: number }[]>({ count: '*' });
		expect(Number(count[0].count)).toBe(seq);
	});
});

describe('one tablet for both sides', () => {
	it('lets the same player hold both sides, deploy both and accept their own side B moves', async () => {
		const res = await call(a.c, 'POST', '/api/v1/games', { title: 'Shared tablet', layout: LAYOUT, opponent: { mode: 'shared' } });
		expect(res.status).toBe(201);
		const view = await call(a.c, 'GET', `/api/v1/games/${res.json.id}`);
		expect(view.json.game.mySides).toEqual(['a', 'b']);
	});
});
