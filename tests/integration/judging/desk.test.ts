// The judge desk over real HTTP on the real test database: ruling requests (from any entry, by
// either player, with a photo; also through the table's own request route), the queue and taking
// a request (409 when taken), the three rulings (uphold, overturn, adjust) on the append-only
// log, positions after an adjustment, role checks, and the two e-mails at the fake SMTP server.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, freshEmail, testDb, waitForMail } from '../helpers';
import { LAYOUT, UNITS_A, UNITS_B } from '../../unit/games/fixtures';

const PASSWORD = 'long enough password';
// A 1×1 PNG (the smallest valid image; file-type sniffs it by its magic bytes).
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

interface Json {
	[k: string]: any; // eslint-disable-line @typescript-eslint/no-explicit-any
}
interface Person {
	c: Client;
	email: string;
	id: string;
	name: string;
}

async function call(c: Client, method: string, path: string, body?: unknown): Promise<{ status: number; json: Json }> {
	const res = await c.send(method, path, body === undefined ? undefined : JSON.stringify(body), { 'content-type': 'application/json', accept: 'application/json' });
	const text = await res.text();
	return { status: res.status, json: text && text.startsWith('{') ? JSON.parse(text) : {} };
}

async function person(tag: string, roles: string[] = []): Promise<Person> {
	const c = new Client();
	const email = freshEmail(tag);
	const name = `${tag} person`;
	expect((await c.signUp(email, PASSWORD, name)).status).toBe(303);
	const row = await testDb()('users').whereRaw('lower(email) = lower(?)', [email]).first();
	for (const role of roles) await testDb()('user_roles').insert({ user_id: row.id, role });
	return { c, email, id: row.id, name };
}

let a: Person, b: Person, eventJudge: Person, siteJudge: Person, otherJudge: Person, organiser: Person, stranger: Person;
let gameId: number;
let seq: number;
let refusedSeq: number;
let moveSeq: number;
let move2Seq: number;
const g = (path = '') => `/api/v1/games/${gameId}${path}`;

async function currentSeq(): Promise<number> {
	return (await call(a.c, 'GET', g())).json.game.seq;
}

beforeAll(async () => {
	[a, b, eventJudge, siteJudge, otherJudge, organiser, stranger] = [
		await person('alpha'),
		await person('bravo'),
		await person('evjudge'),
		await person('sitejudge', ['judge']),
		await person('otherjudge'),
		await person('organiser'),
		await person('stranger')
	];
	const db = testDb();
	const [ra] = await db('rosters').insert({ owner_id: a.id, name: 'Alpha list', force: 'Test force', units: JSON.stringify(UNITS_A) }).returning('id');
	const [rb] = await db('rosters').insert({ owner_id: b.id, name: 'Bravo list', force: 'Test force', units: JSON.stringify(UNITS_B) }).returning('id');

	// The game, through the table's API: invitation by e-mail, join, rosters, deployment.
	const created = await call(a.c, 'POST', '/api/v1/games', { title: 'Desk skirmish', layout: LAYOUT, opponent: { mode: 'invite', email: b.email }, rosterA: ra.id });
	expect(created.status).toBe(201);
	gameId = created.json.id;
	const [invite] = await waitForMail(b.email);
	const token = invite.text.match(/\/games\/join\/([a-z2-7]+)/)![1];
	expect((await call(b.c, 'POST', '/api/v1/games/join', { token })).status).toBe(200);
	seq = await currentSeq();
	const steps: [Person, string, unknown][] = [
		[b, '/roster', { side: 'b', rosterId: rb.id }],
		[a, '/deploy', { side: 'a', placements: [{ piece: 'a-u1-p1', at: { x: 10, y: 6 } }, { piece: 'a-u1-p2', at: { x: 12, y: 6 } }, { piece: 'a-u1-p3', at: { x: 14, y: 6 } }, { piece: 'a-u2-p1', at: { x: 20, y: 6 } }] }],
		[a, '/end-turn', {}],
		[b, '/deploy', { side: 'b', placements: [{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } }, { piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } }, { piece: 'b-u2-p1', at: { x: 30, y: 54 } }, { piece: 'b-u2-p2', at: { x: 32, y: 54 } }, { piece: 'b-u2-l1', at: { x: 34, y: 54 } }] }],
		[b, '/end-turn', {}]
	];
	for (const [who, path, body] of steps) {
		const r = await call(who.c, 'POST', g(path), { seq, ...(body as object) });
		expect(r.status, JSON.stringify(r.json)).toBe(200);
		seq = r.json.seq;
	}
	const forward = (y: number) => ({ 'a-u1-p1': [{ x: 10, y }], 'a-u1-p2': [{ x: 12, y }], 'a-u1-p3': [{ x: 14, y }] });
	const refused = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'move', paths: forward(15) });
	expect(refused.status).toBe(422);
	seq = refusedSeq = refused.json.seq;
	const moved = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u1', kind: 'move', paths: forward(11) });
	expect(moved.status).toBe(201);
	seq = moveSeq = moved.json.seq;
	const acc = await call(b.c, 'POST', g('/accept'), { seq });
	expect(acc.status).toBe(200);
	seq = acc.json.seq;

	// The game belongs to an event: round 1, table 3, judged by eventJudge, run by organiser's club.
	const [club] = await db('clubs').insert({ name: `Desk club ${Date.now()}-${Math.random()}`, town: 'Testing' }).returning('id');
	await db('club_members').insert({ club_id: club.id, user_id: organiser.id, role: 'organiser' });
	const [event] = await db('events').insert({ club_id: club.id, name: 'Desk Open', starts_on: '2026-12-05', ends_on: '2026-12-05', status: 'closed' }).returning('id');
	await db('event_judges').insert({ event_id: event.id, user_id: eventJudge.id });
	const [round] = await db('event_rounds').insert({ event_id: event.id, number: 1, status: 'published' }).returning('id');
	await db('event_pairings').insert({ round_id: round.id, table_no: 3, player_a: a.id, player_b: b.id, game_id: gameId });
	// otherJudge judges a different event only.
	const [other] = await db('events').insert({ club_id: club.id, name: 'Other Open', starts_on: '2026-12-06', ends_on: '2026-12-06' }).returning('id');
	await db('event_judges').insert({ event_id: other.id, user_id: otherJudge.id });
});

afterAll(async () => {
	await closeTestDb();
});

let photoId: string;
let req1: number;
let req2: number;
let req3: number;

describe('opening a ruling request', () => {
	it('stores an evidence photo only when its bytes are an image', async () => {
		const text = await b.c.send('POST', '/api/v1/rulings/photos', 'not a picture at all', { 'content-type': 'image/png' });
		expect(text.status).toBe(415);
		const res = await b.c.send('POST', '/api/v1/rulings/photos', PNG as unknown as string, { 'content-type': 'application/octet-stream', 'x-file-name': 'table.png' });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.photo.contentType).toBe('image/png');
		photoId = body.photo.id;
	});

	it('refuses a stranger (403), a stale seq (409), an unknown entry and bad bodies (400)', async () => {
		expect((await call(new Client(), 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: 'x' })).status).toBe(401);
		expect((await call(stranger.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: 'x' })).status).toBe(403);
		expect((await call(b.c, 'POST', '/api/v1/rulings', { gameId, seq: seq - 1, moveSeq, note: 'x' })).status).toBe(409);
		expect((await call(b.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq: 999, note: 'x' })).status).toBe(400);
		const bad = await call(b.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: '' });
		expect(bad.status).toBe(400);
		expect(bad.json.error.issues.map((i: Json) => i.path.join('.'))).toContain('note');
		// Someone else's upload is not evidence one may attach.
		expect((await call(a.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: 'x', photos: [photoId] })).status).toBe(400);
	});

	it('a player asks about an accepted move with a note and a photo: the log has the request, the game shows it open, play goes on', async () => {
		const r = await call(b.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: 'The lead piece looked a little far', photos: [photoId] });
		expect(r.status, JSON.stringify(r.json)).toBe(201);
		req1 = r.json.request.id;
		expect(r.json.request).toMatchObject({ status: 'open', moveSeq, requestSeq: r.json.seq, note: 'The lead piece looked a little far', event: { name: 'Desk Open', round: 1, table: 3 } });
		expect(r.json.request.photos).toEqual([expect.objectContaining({ id: photoId, contentType: 'image/png' })]);
		seq = r.json.seq;
		const log = await call(a.c, 'GET', g(`/log?after=${seq - 1}`));
		expect(log.json.entries[0]).toMatchObject({ kind: 'ruling-request', side: 'b', payload: { moveSeq, note: 'The lead piece looked a little far' } });
		const listed = await call(a.c, 'GET', `/api/v1/rulings?game=${gameId}`);
		expect(listed.json.requests.map((q: Json) => [q.id, q.status])).toEqual([[req1, 'open']]);
		// Play goes on: side A moves another unit.
		const next = await call(a.c, 'POST', g('/moves'), { seq, unit: 'a-u2', kind: 'move', paths: { 'a-u2-p1': [{ x: 20, y: 10 }] } });
		expect(next.status).toBe(201);
		seq = move2Seq = next.json.seq;
		// A second request on the same entry waits behind the first.
		expect((await call(a.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq, note: 'me too' })).status).toBe(409);
	});

	it('e-mails the judges of the event when a request opens', async () => {
		const [m] = await waitForMail(eventJudge.email);
		expect(m.subject).toBe('Ruling requested: Desk Open, round 1, table 3');
		expect(m.text).toContain(`/judge/${req1}`);
		expect(m.text).toContain('The lead piece looked a little far');
		// Personal data: the players' addresses are not in it.
		expect(m.text).not.toContain(a.email);
		expect(m.text).not.toContain(b.email);
	});

	it('the table\'s own request route (on the move awaiting acceptance) opens a request too, in the same transaction', async () => {
		const r = await call(b.c, 'POST', g('/ruling-request'), { seq, note: 'Did the beacon crew clip the crate?' });
		expect(r.status).toBe(201);
		seq = r.json.seq;
		const row = await testDb()('ruling_requests').where({ game_id: gameId, request_seq: seq }).first();
		expect(row).toMatchObject({ move_seq: move2Seq, requested_by: b.id, status: 'open', note: 'Did the beacon crew clip the crate?' });
		req2 = row.id;
		// Its mail goes out on the next queue visit (that route does not send it itself).
		expect((await call(eventJudge.c, 'GET', '/api/v1/rulings')).status).toBe(200);
		const mails = await waitForMail(eventJudge.email, 2);
		expect(mails.some((m) => m.text.includes(`/judge/${req2}`))).toBe(true);
	});

	it('either player may ask, about any entry (here side A about its own refused move)', async () => {
		const r = await call(a.c, 'POST', '/api/v1/rulings', { gameId, seq, moveSeq: refusedSeq, note: 'I measured 6 in on the table' });
		expect(r.status).toBe(201);
		req3 = r.json.request.id;
		seq = r.json.seq;
		expect(r.json.request.entry).toMatchObject({ kind: 'refused', verdict: 'illegal' });
		expect(r.json.request.entry.finding).toMatch(/in/);
	});
});

describe('who sees what', () => {
	it('signed out 401; strangers and players are no judges (403); organisers see the requests of their events', async () => {
		expect((await call(new Client(), 'GET', '/api/v1/rulings')).status).toBe(401);
		expect((await call(stranger.c, 'GET', '/api/v1/rulings')).status).toBe(403);
		expect((await call(a.c, 'GET', '/api/v1/rulings')).status).toBe(403);
		expect((await call(stranger.c, 'GET', `/api/v1/rulings?game=${gameId}`)).status).toBe(403);
		expect((await call(stranger.c, 'GET', `/api/v1/rulings/${req1}`)).status).toBe(403);
		expect((await call(otherJudge.c, 'GET', `/api/v1/rulings/${req1}`)).status).toBe(403);
		const org = await call(organiser.c, 'GET', `/api/v1/rulings?game=${gameId}`);
		expect(org.status).toBe(200);
		expect(org.json.requests).toHaveLength(3);
		expect(JSON.stringify(org.json)).not.toContain(a.email);
		expect((await stranger.c.get(`/games/${gameId}/replay`)).status).toBe(403);
		expect((await organiser.c.get(`/games/${gameId}/replay`)).status).toBe(200);
		expect((await stranger.c.get('/judge')).status).toBe(403);
		expect((await a.c.get(`/judge/${req1}`)).status).toBe(403);
		expect((await eventJudge.c.get(`/judge/${req1}`)).status).toBe(200);
	});

	it('the queue: the event judge and site judges see the requests, newest first; a judge of another event does not', async () => {
		const ev = await call(eventJudge.c, 'GET', '/api/v1/rulings');
		const mine = ev.json.requests.filter((q: Json) => q.gameId === gameId).map((q: Json) => q.id);
		expect(mine).toEqual([req3, req2, req1]);
		const site = await call(siteJudge.c, 'GET', '/api/v1/rulings');
		expect(site.json.requests.map((q: Json) => q.id)).toEqual(expect.arrayContaining([req1, req2, req3]));
		const other = await call(otherJudge.c, 'GET', '/api/v1/rulings');
		expect(other.status).toBe(200);
		expect(other.json.requests.some((q: Json) => q.gameId === gameId)).toBe(false);
	});

	it('the photo is shown to the judge, not to a stranger', async () => {
		const res = await eventJudge.c.get(`/api/v1/rulings/photos/${photoId}`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('image/png');
		expect(Buffer.from(await res.arrayBuffer()).equals(PNG)).toBe(true);
		expect((await stranger.c.get(`/api/v1/rulings/photos/${photoId}`)).status).toBe(403);
	});
});

describe('taking and ruling', () => {
	it('only judges take; the first judge gets it, the next gets 409 and sees who took it', async () => {
		expect((await call(b.c, 'POST', `/api/v1/rulings/${req1}/take`)).status).toBe(403);
		expect((await call(organiser.c, 'POST', `/api/v1/rulings/${req1}/take`)).status).toBe(403);
		const took = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/take`);
		expect(took.status).toBe(200);
		expect(took.json.request).toMatchObject({ status: 'taken', takenBy: { id: eventJudge.id, name: eventJudge.name } });
		const late = await call(siteJudge.c, 'POST', `/api/v1/rulings/${req1}/take`);
		expect(late.status).toBe(409);
		expect(late.json.error.message).toContain(eventJudge.name);
		const seen = await call(a.c, 'GET', `/api/v1/rulings?game=${gameId}`);
		expect(seen.json.requests.find((q: Json) => q.id === req1).status).toBe('taken');
		// Nor may the other judge rule on it.
		expect((await call(siteJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'uphold', reason: 'x' })).status).toBe(409);
	});

	it('only judges rule (403 for players and organisers); bad rulings are 400', async () => {
		expect((await call(a.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'uphold', reason: 'mine' })).status).toBe(403);
		expect((await call(organiser.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'uphold', reason: 'x' })).status).toBe(403);
		const noPlaces = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'adjust', reason: 'x' });
		expect(noPlaces.status).toBe(400);
		expect(noPlaces.json.error.issues.map((i: Json) => i.path.join('.'))).toContain('positions');
		const foreign = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'adjust', reason: 'x', positions: { 'b-u1-p1': { x: 1, y: 1 } } });
		expect(foreign.status).toBe(400);
	});

	it('an adjustment the engine finds illegal is refused with its report unless allowed', async () => {
		const r = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'adjust', reason: 'too far', positions: { 'a-u1-p1': { x: 10, y: 14 } } });
		expect(r.status).toBe(422);
		expect(r.json.report.findings.map((f: Json) => f.code)).toContain('over-allowance');
		expect(await currentSeq()).toBe(seq); // nothing written
	});

	it('adjust: appended to the log, signed, positions changed from that point on, both players e-mailed', async () => {
		const before = await call(a.c, 'GET', g('/log'));
		const r = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'adjust', reason: 'The lead piece ended 1 in too far', positions: { 'a-u1-p1': { x: 10, y: 10 } } });
		expect(r.status, JSON.stringify(r.json)).toBe(201);
		expect(r.json.seq).toBe(seq + 1);
		seq = r.json.seq;
		expect(r.json.ruling).toMatchObject({ outcome: 'adjust', moveSeq, judge: { id: eventJudge.id, name: eventJudge.name }, changes: [{ piece: 'a-u1-p1', to: { x: 10, y: 10 } }] });
		expect(Date.now() - Date.parse(r.json.ruling.signedAt)).toBeLessThan(60_000);
		expect(r.json.request).toMatchObject({ status: 'ruled', ruledSeq: seq });

		const game = await call(b.c, 'GET', g());
		const at = (id: string) => game.json.game.state.pieces.find((p: Json) => p.id === id).at;
		expect(at('a-u1-p1')).toMatchObject({ x: 10, y: 10 });
		expect(at('a-u1-p2')).toMatchObject({ x: 12, y: 11 }); // not adjusted: stays where the move put it
		expect(game.json.game.seq).toBe(seq);

		const after = await call(a.c, 'GET', g('/log'));
		// Append-only: every earlier entry is unchanged, the ruling is the new last one.
		expect(after.json.entries.slice(0, -1)).toEqual(before.json.entries);
		const last = after.json.entries.at(-1);
		expect(last).toMatchObject({ seq, kind: 'ruling', actor: eventJudge.id, payload: { requestId: req1, outcome: 'adjust', reason: 'The lead piece ended 1 in too far' } });
		expect(last.report.verdict).toBe('legal');
		expect(last.report.pieces['a-u1-p1'].cost).toBeCloseTo(4, 6);

		// a has had no mail before; b had the invitation.
		for (const [p, count] of [[a, 1], [b, 2]] as const) {
			const mails = await waitForMail(p.email, count);
			const m = mails.find((x) => x.subject.startsWith('Ruling given'));
			expect(m, `ruling mail to ${p.email}`).toBeDefined();
			expect(m!.subject).toContain('adjusted');
			expect(m!.text).toContain(eventJudge.name);
			expect(m!.text).toContain('The lead piece ended 1 in too far');
		}
		// Ruled once only.
		expect((await call(eventJudge.c, 'POST', `/api/v1/rulings/${req1}/ruling`, { outcome: 'uphold', reason: 'again' })).status).toBe(409);
	});

	it('overturn: the disputed move of a-u2 is undone (its piece back where it started)', async () => {
		const r = await call(siteJudge.c, 'POST', `/api/v1/rulings/${req2}/ruling`, { outcome: 'overturn', reason: 'The crew clipped the crate corner' });
		expect(r.status, JSON.stringify(r.json)).toBe(201);
		seq = r.json.seq;
		const game = await call(a.c, 'GET', g());
		expect(game.json.game.state.pieces.find((p: Json) => p.id === 'a-u2-p1').at).toMatchObject({ x: 20, y: 6 });
		expect(r.json.request).toMatchObject({ status: 'ruled', takenBy: { id: siteJudge.id } });
	});

	it('uphold: the refusal stands and nothing moves', async () => {
		const before = (await call(a.c, 'GET', g())).json.game.state.pieces;
		const r = await call(eventJudge.c, 'POST', `/api/v1/rulings/${req3}/ruling`, { outcome: 'uphold', reason: 'The engine measured 9 in against 6' });
		expect(r.status).toBe(201);
		seq = r.json.seq;
		expect(r.json.ruling.changes).toEqual([]);
		expect((await call(a.c, 'GET', g())).json.game.state.pieces).toEqual(before);
	});

	it('the log is still append-only in the database, rulings included', async () => {
		const db = testDb();
		await expect(db('game_moves').where({ game_id: gameId, kind: 'ruling' }).update({ payload: '{}' })).rejects.toThrow(/append-only/);
		await expect(db('game_moves').where({ game_id: gameId, kind: 'ruling' }).del()).rejects.toThrow(/append-only/);
		const kinds = (await call(a.c, 'GET', g('/log'))).json.entries.map((e: Json) => e.kind);
		expect(kinds.filter((k: string) => k === 'ruling')).toHaveLength(3);
		const log = (await call(a.c, 'GET', g('/log'))).json.entries.map((e: Json) => e.seq);
		expect(log).toEqual(Array.from({ length: seq }, (_, i) => i + 1));
	});

	it('the turn report: folding the log agrees with the table, the rulings are in it, JSON for the organiser; strangers need a shared link', async () => {
		const res = await organiser.c.get(`/games/${gameId}/report/download?round=1`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="turn-report-game-\d+-round-1/);
		const report = await res.json();
		expect(report.foldAgrees).toBe(true);
		expect(report.entries.filter((e: Json) => e.kind === 'ruling').map((e: Json) => e.ruling.outcome)).toEqual(['adjust', 'overturn', 'uphold']);
		const refused = report.entries.find((e: Json) => e.seq === refusedSeq);
		expect(refused.check).toMatchObject({ verdict: 'illegal', rerunAgrees: true });
		expect((await stranger.c.get(`/games/${gameId}/report/download?round=1`)).status).toBe(403);
		const page = await a.c.get(`/games/${gameId}/report?round=1`);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('data-testid="turn-report"');
		expect(html).toContain('The lead piece ended 1 in too far');

		const shared = await a.c.post(`/games/${gameId}/report?/share&round=1`, {});
		expect(shared.status).toBe(200);
		const link = (await shared.text()).match(/key=([a-z2-7]{52})/);
		expect(link).not.toBeNull();
		expect((await stranger.c.get(`/games/${gameId}/report/download?round=1&key=${link![1]}`)).status).toBe(200);
		expect((await stranger.c.get(`/games/${gameId}/report/download?round=0&key=${link![1]}`)).status).toBe(403);
	});
});
