// Concurrency over real HTTP on the built app and the real database: 50 commits at once to one
// game from two clients (two tablets of the player whose turn it is), then 50 accepts at once
// from the opponent's two tablets, then 50 judges' takes and rulings of one request at once.
// Each acknowledged commit must be in the move log exactly once, the seqs gap-free, and each
// refused one a 409 carrying the current state (or, for the desk, the request as it now is).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Client } from '../helpers';
import { closeTestDb } from '../helpers';
import { call, clubEventFor, forward, gameInMovePhase, person, secondTablet, type Json, type PlayedGame } from './world';

let game: PlayedGame;
let tabletsA: Client[];
let tabletsB: Client[];
const g = (p = '') => `/api/v1/games/${game.id}${p}`;

async function fullLog(): Promise<Json[]> {
	const log = await call(game.a.c, 'GET', g('/log'));
	expect(log.status).toBe(200);
	return log.json.entries;
}

function expectGapFree(entries: Json[]): void {
	expect(entries.map((e) => e.seq)).toEqual(entries.map((_, i) => i + 1));
}

beforeAll(async () => {
	const a = await person('conc-a');
	const b = await person('conc-b');
	game = await gameInMovePhase(a, b, 'Concurrency game');
	tabletsA = [a.c, await secondTablet(a)];
	tabletsB = [b.c, await secondTablet(b)];
});

afterAll(async () => {
	await closeTestDb();
});

describe('50 concurrent commits to one game from two clients', () => {
	it('all naming the same seq: exactly one is acknowledged, 49 get 409 with the current state', async () => {
		const seq0 = game.seq;
		// Each commit is a different legal move (its x offset names it), so the log shows which won.
		const sent = Array.from({ length: 50 }, (_, i) => ({ i, client: tabletsA[i % 2], body: { seq: seq0, unit: 'a-u1', kind: 'move', paths: forward(9, i * 0.01) } }));
		const answers = await Promise.all(sent.map((s) => call(s.client, 'POST', g('/moves'), s.body)));
		const ok = answers.map((r, i) => ({ r, i })).filter(({ r }) => r.status === 201);
		expect(ok).toHaveLength(1);
		const winner = ok[0].i;
		expect(ok[0].r.json.seq).toBe(seq0 + 1);
		for (const [i, r] of answers.entries()) {
			if (i === winner) continue;
			expect(r.status, JSON.stringify(r.json).slice(0, 300)).toBe(409);
			expect(r.json.error.message).toMatch(/moved on/);
			// The current state: the winner's move, pending acceptance.
			expect(r.json.game.seq).toBe(seq0 + 1);
			expect(r.json.game.state.pending).toMatchObject({ seq: seq0 + 1, unit: 'a-u1' });
			expect(r.json.game.state.pieces.find((p: Json) => p.id === 'a-u1-p1').at.x).toBeCloseTo(10 + winner * 0.01, 9);
		}
		const entries = await fullLog();
		expectGapFree(entries);
		const added = entries.filter((e) => e.seq > seq0);
		expect(added).toHaveLength(1);
		expect(added[0]).toMatchObject({ seq: seq0 + 1, kind: 'move', payload: { unit: 'a-u1', paths: sent[winner].body.paths } });
		game.seq = seq0 + 1;
	});

	it('50 concurrent accepts from the opponent’s two tablets: one accept in the log, 49 × 409 with the state', async () => {
		const seq0 = game.seq;
		const answers = await Promise.all(Array.from({ length: 50 }, (_, i) => call(tabletsB[i % 2], 'POST', g('/accept'), { seq: seq0 })));
		expect(answers.filter((r) => r.status === 200)).toHaveLength(1);
		const refused = answers.filter((r) => r.status !== 200);
		expect(refused).toHaveLength(49);
		for (const r of refused) {
			expect(r.status).toBe(409);
			expect(r.json.game.seq).toBe(seq0 + 1);
			expect(r.json.game.state.pending).toBeNull();
		}
		const entries = await fullLog();
		expectGapFree(entries);
		expect(entries.filter((e) => e.seq > seq0).map((e) => e.kind)).toEqual(['accept']);
		expect(entries.filter((e) => e.kind === 'accept' && e.payload.moveSeq === seq0)).toHaveLength(1);
		game.seq = seq0 + 1;
	});

	it('a stream of 50 commits with retries on 409: each acknowledged one is in the log exactly once, seqs gap-free', async () => {
		const seq0 = game.seq;
		// An over-allowance move of a-u2 is refused by the referee and logged as refused (422),
		// which leaves the table as it was: it can be committed again and again. Its end x names it.
		const commit = (n: number) => ({ unit: 'a-u2', kind: 'move', paths: { 'a-u2-p1': [{ x: 20 + n * 0.01, y: 30 }] } });
		const acked = new Map<number, number>(); // commit number → the seq it got
		let conflicts = 0;
		const worker = async (client: Client, numbers: number[]) => {
			let seen = seq0;
			for (const n of numbers) {
				for (;;) {
					const r = await call(client, 'POST', g('/moves'), { seq: seen, ...commit(n) });
					if (r.status === 409) {
						conflicts += 1;
						expect(r.json.game.seq).toBeGreaterThan(seen - 1);
						seen = r.json.game.seq;
						continue;
					}
					expect(r.status, JSON.stringify(r.json).slice(0, 300)).toBe(422);
					acked.set(n, r.json.seq);
					seen = r.json.seq;
					break;
				}
			}
		};
		// 50 commits in flight at once: 25 workers per tablet, one commit each.
		await Promise.all(Array.from({ length: 50 }, (_, n) => worker(tabletsA[n % 2], [n])));
		expect(acked.size).toBe(50);
		console.log(`concurrency stream: 50 commits acknowledged after ${conflicts} answers of 409 (retried with the state they carried)`);
		expect(conflicts).toBeGreaterThan(0); // they really did collide
		const entries = await fullLog();
		expectGapFree(entries);
		const added = entries.filter((e) => e.seq > seq0);
		expect(added).toHaveLength(50);
		expect([...acked.values()].sort((x, y) => x - y)).toEqual(added.map((e) => e.seq));
		for (const [n, s] of acked) {
			const e = added.filter((x) => x.payload.paths['a-u2-p1'][0].x === 20 + n * 0.01);
			expect(e, `commit ${n}`).toHaveLength(1);
			expect(e[0]).toMatchObject({ seq: s, kind: 'refused' });
		}
		// Positions and log agree: the refused moves moved nothing.
		const view = await call(game.a.c, 'GET', g(''));
		expect(view.json.game.seq).toBe(seq0 + 50);
		expect(view.json.game.state.pieces.find((p: Json) => p.id === 'a-u2-p1').at).toMatchObject({ x: 20, y: 6 });
		game.seq = seq0 + 50;
	});
});

describe('50 judges at once on one ruling request', () => {
	let requestId: number;
	let judges: Client[];

	beforeAll(async () => {
		const organiser = await person('conc-org', ['organiser']);
		const eventJudge = await person('conc-judge');
		await clubEventFor(game, organiser, eventJudge);
		// A legal move of a-u2, and side B asks for a ruling on it.
		const mv = await call(game.a.c, 'POST', g('/moves'), { seq: game.seq, unit: 'a-u2', kind: 'move', paths: { 'a-u2-p1': [{ x: 20, y: 10 }] } });
		expect(mv.status).toBe(201);
		const rr = await call(game.b.c, 'POST', g('/ruling-request'), { seq: mv.json.seq, note: 'Concurrent desk check' });
		expect(rr.status, JSON.stringify(rr.json)).toBe(201);
		game.seq = rr.json.seq;
		const list = await call(eventJudge.c, 'GET', `/api/v1/rulings?game=${game.id}`);
		expect(list.status).toBe(200);
		requestId = list.json.requests[0].id;
		// Five site judges and the event's judge, each on several tablets: 50 clients in all.
		const people = [eventJudge, ...(await Promise.all(Array.from({ length: 4 }, (_, i) => person(`conc-sj${i}`, ['judge']))))];
		judges = [];
		for (let i = 0; i < 50; i++) judges.push(i < people.length ? people[i].c : await secondTablet(people[i % people.length]));
	});

	it('50 concurrent takes: one judge gets it, 49 × 409 naming who took it', async () => {
		const answers = await Promise.all(judges.map((c) => call(c, 'POST', `/api/v1/rulings/${requestId}/take`)));
		const ok = answers.filter((r) => r.status === 200);
		expect(ok).toHaveLength(1);
		for (const r of answers.filter((x) => x.status !== 200)) {
			expect(r.status).toBe(409);
			expect(r.json.request.status).toBe('taken');
			expect(r.json.request.takenBy.id).toBe(ok[0].json.request.takenBy.id);
		}
	});

	it('50 concurrent rulings by the judge who took it (on all tablets) and the others: one ruling in the log', async () => {
		const seq0 = game.seq;
		const body = { outcome: 'uphold', reason: 'Measured again: it stands' };
		const answers = await Promise.all(judges.map((c) => call(c, 'POST', `/api/v1/rulings/${requestId}/ruling`, body)));
		const ok = answers.filter((r) => r.status === 200 || r.status === 201);
		expect(ok).toHaveLength(1);
		for (const r of answers.filter((x) => !ok.includes(x))) {
			expect(r.status, JSON.stringify(r.json)).toBe(409);
			expect(r.json.error.message).toMatch(/ruled already|has taken/);
		}
		const entries = await fullLog();
		expectGapFree(entries);
		expect(entries.filter((e) => e.seq > seq0).map((e) => e.kind)).toEqual(['ruling']);
	});
});
