// Shutdown: SIGTERM to an app server with a tablet's live stream open. The stream ends at once
// (the tablet's EventSource reconnects elsewhere, Last-Event-ID says what it missed) and the
// server exits cleanly, instead of adapter-node waiting its SHUTDOWN_TIMEOUT (30 s) for the
// stream before it lets go; a request in flight at the signal still gets its answer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb } from '../helpers';
import { gameInMovePhase, person, type PlayedGame } from './world';
import { Remote, SLOT, startApp, type AppProcess } from './processes';

const PORT = 3180 + SLOT;

let app: AppProcess | null = null;
let played: PlayedGame;

beforeAll(async () => {
	const [a, b] = [await person('shutdown-a'), await person('shutdown-b')];
	played = await gameInMovePhase(a, b, 'Shutdown game');
	app = await startApp(PORT);
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await closeTestDb();
});

describe('SIGTERM with a live stream open', () => {
	it('ends the stream, answers the request in flight, and exits by itself well before the 30 s wait', async () => {
		const tablet = Remote.withCookies(app!.base, played.a.c);
		const res = await tablet.raw('GET', `/api/v1/games/${played.id}/events`, undefined, { accept: 'text/event-stream' });
		expect(res.status).toBe(200);
		const reader = res.body!.getReader();
		const dec = new TextDecoder();
		let text = '';
		while (!text.includes(': connected')) {
			const { done, value } = await reader.read();
			if (done) throw new Error(`the stream ended before it connected: ${text}`);
			text += dec.decode(value);
		}
		expect(text).toContain(`id: ${played.seq}`);

		// A request sent just before the signal: a game view (reads the database).
		const inFlight = tablet.call('GET', `/api/v1/games/${played.id}`);
		const started = Date.now();
		const exit = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => app!.child.once('exit', (code, signal) => resolve({ code, signal })));
		app!.child.kill('SIGTERM');

		// The stream ends (no SIGKILL in this test: helpers' stop() is not used here).
		for (;;) {
			const { done } = await reader.read();
			if (done) break;
		}
		expect((await inFlight).status).toBe(200);
		const { code, signal } = await exit;
		const tookMs = Date.now() - started;
		expect({ code, signal }).toEqual({ code: 0, signal: null });
		// adapter-node's own wait with a stream open is SHUTDOWN_TIMEOUT = 30 s; a clean exit comes
		// long before (the bound is a wide margin, not a speed target).
		expect(tookMs).toBeLessThan(15_000);
	}, 45_000);
});
