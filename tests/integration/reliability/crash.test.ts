// Crash: kill -9 of an app server in the middle of a stream of commits. The server is our own
// (`node <build>` on 3190 + slot, the test server's settings and database). After a restart
// every acknowledged commit is in the log, nothing half-written is: the game row's seq is the
// log's last seq and the pieces stand where the log puts them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers';
import { forward, gameInMovePhase, person, type Json, type PlayedGame } from './world';
import { Remote, SLOT, startApp, type AppProcess } from './processes';

const PORT = 3190 + SLOT;
const GAMES = 4;

let app: AppProcess | null = null;
let played: PlayedGame[] = [];

beforeAll(async () => {
	const pairs = await Promise.all(Array.from({ length: GAMES }, async (_, i) => [await person(`crash-a${i}`), await person(`crash-b${i}`)] as const));
	played = await Promise.all(pairs.map(([a, b], i) => gameInMovePhase(a, b, `Crash game ${i}`)));
	app = await startApp(PORT);
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await closeTestDb();
});

/** Side A's first unit: legal moves (a distinct sideways offset per commit) and their take-backs. */
function commitFor(n: number, pending: boolean): { path: string; body: Json } {
	return pending ? { path: '/take-back', body: {} } : { path: '/moves', body: { unit: 'a-u1', kind: 'move', paths: forward(9, (n % 500) * 0.001) } };
}

describe('kill -9 in the middle of a stream of commits', () => {
	it('keeps every acknowledged commit and leaves the game row and the log in agreement', async () => {
		const acked: { game: number; seq: number; path: string; body: Json }[] = [];
		let stop = false;
		let inFlightAtKill = 0;
		const streams = played.map(async (g) => {
			const tablet = Remote.withCookies(app!.base, g.a.c);
			let seq = g.seq;
			let pending = false;
			for (let n = 0; !stop; n++) {
				const c = commitFor(n, pending);
				inFlightAtKill += 1;
				let r: Awaited<ReturnType<Remote['call']>>;
				try {
					r = await tablet.call('POST', `/api/v1/games/${g.id}${c.path}`, { seq, ...c.body });
				} catch {
					// The server died under this request: it was never acknowledged.
					return;
				}
				inFlightAtKill -= 1;
				expect([200, 201], JSON.stringify(r.json).slice(0, 200)).toContain(r.status);
				seq = r.json.seq;
				pending = !pending;
				acked.push({ game: g.id, seq, path: c.path, body: c.body });
			}
		});
		// Let the stream run, then kill the server with requests in flight.
		while (acked.length < 150) await new Promise((r) => setTimeout(r, 5));
		await app!.kill9();
		stop = true;
		await Promise.all(streams);
		expect(inFlightAtKill).toBeGreaterThan(0);

		const restartedAt = Date.now();
		app = await startApp(PORT);
		const restartMs = Date.now() - restartedAt;
		console.log(`crash: ${acked.length} commits acknowledged before kill -9, ${inFlightAtKill} in flight; restart answered after ${restartMs} ms`);

		for (const g of played) {
			const tablet = Remote.withCookies(app.base, g.a.c);
			const view = await tablet.call('GET', `/api/v1/games/${g.id}`);
			const log = await tablet.call('GET', `/api/v1/games/${g.id}/log`);
			expect(view.status).toBe(200);
			const entries: Json[] = log.json.entries;
			// Gap-free, and the row's seq is the log's last seq: no half-written change.
			expect(entries.map((e) => e.seq)).toEqual(entries.map((_, i) => i + 1));
			expect(view.json.game.seq).toBe(entries.length);
			const row = await testDb()('games').where({ id: g.id }).first();
			expect(row.seq).toBe(entries.length);
			// Every acknowledged commit is there, as acknowledged.
			const mine = acked.filter((a) => a.game === g.id);
			expect(mine.length).toBeGreaterThan(0);
			for (const a of mine) {
				const e = entries.find((x) => x.seq === a.seq);
				expect(e, `game ${g.id} seq ${a.seq}`).toBeDefined();
				if (a.path === '/moves') expect(e).toMatchObject({ kind: 'move', payload: { unit: 'a-u1', paths: a.body.paths } });
				else expect(e!.kind).toBe('take-back');
			}
			// At most the one commit in flight got in after the last acknowledged one.
			expect(entries.length - Math.max(...mine.map((a) => a.seq))).toBeLessThanOrEqual(1);
			// The pieces stand where the log's last entry puts them.
			const last = entries[entries.length - 1];
			const p1 = view.json.game.state.pieces.find((p: Json) => p.id === 'a-u1-p1');
			if (last.kind === 'move') {
				expect(view.json.game.state.pending).toMatchObject({ seq: last.seq, unit: 'a-u1' });
				expect(p1.at.x).toBeCloseTo(last.payload.paths['a-u1-p1'][0].x, 9);
				expect(p1.at.y).toBe(9);
			} else {
				expect(last.kind).toBe('take-back');
				expect(view.json.game.state.pending).toBeNull();
				expect(p1.at).toMatchObject({ x: 10, y: 6 });
			}
			// And play goes on from there.
			const next = commitFor(0, last.kind === 'move');
			const r = await tablet.call('POST', `/api/v1/games/${g.id}${next.path}`, { seq: entries.length, ...next.body });
			expect([200, 201]).toContain(r.status);
			expect(r.json.seq).toBe(entries.length + 1);
		}
	}, 60_000);
});
