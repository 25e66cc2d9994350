// Live sync between tablets: one dedicated PostgreSQL connection LISTENs on the games channel
// (moves.append notifies in the same transaction, delivered on commit) and fans each new seq
// out to the server-sent-event streams of that game. Because the signal goes through the
// database, it reaches the streams of every app server, whichever server wrote the move.
// One listener per process is the point (a pooled connection cannot hold a LISTEN), so this
// is a module-level singleton; it holds no per-user state.
import pg from 'pg';
import { GAME_CHANNEL } from '$lib/server/db/moves';
import { games } from '$lib/server/db/games';

type Listener = (seq: number) => void;

const listeners = new Map<number, Set<Listener>>();
let client: pg.Client | null = null;
let connecting: Promise<void> | null = null;
let retryMs = 250;
let closed = false;

function deliver(gameId: number, seq: number): void {
	for (const l of listeners.get(gameId) ?? []) {
		try {
			l(seq);
		} catch (e) {
			console.error('live listener failed', e);
		}
	}
}

async function connect(): Promise<void> {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set');
	const c = new pg.Client({ connectionString: url });
	c.on('notification', (msg) => {
		if (msg.channel !== GAME_CHANNEL || !msg.payload) return;
		const [id, seq] = msg.payload.split(':').map(Number);
		if (Number.isInteger(id) && Number.isInteger(seq)) deliver(id, seq);
	});
	const lost = (e?: unknown) => {
		if (client !== c) return;
		client = null;
		if (e) console.error('live: the LISTEN connection was lost', e);
		if (!closed && listeners.size > 0) setTimeout(() => void ensure().then(catchUp, () => undefined), retryMs);
		retryMs = Math.min(retryMs * 2, 10_000);
	};
	c.on('error', lost);
	c.on('end', () => lost());
	await c.connect();
	await c.query(`LISTEN ${GAME_CHANNEL}`);
	client = c;
	retryMs = 250;
}

function ensure(): Promise<void> {
	if (client || closed) return Promise.resolve();
	connecting ??= connect().finally(() => (connecting = null));
	return connecting;
}

/** After a reconnect, notifications sent meanwhile are gone: tell every stream the current seq. */
async function catchUp(): Promise<void> {
	for (const gameId of listeners.keys()) {
		const g = await games.find(gameId);
		if (g) deliver(gameId, g.seq);
	}
}

/** Calls `fn` with each new seq of the game; returns the unsubscribe function. */
export async function subscribe(gameId: number, fn: Listener): Promise<() => void> {
	let set = listeners.get(gameId);
	if (!set) listeners.set(gameId, (set = new Set()));
	set.add(fn);
	await ensure();
	return () => {
		const s = listeners.get(gameId);
		if (!s) return;
		s.delete(fn);
		if (s.size === 0) listeners.delete(gameId);
	};
}

/** Streams opened by this process, closed on shutdown so the server can exit. */
const streams = new Set<() => void>();
export function trackStream(close: () => void): () => void {
	// A stream opened while the server shuts down ends straight away.
	if (closed) setImmediate(close);
	streams.add(close);
	return () => streams.delete(close);
}

// On SIGTERM/SIGINT adapter-node stops taking connections and waits for the open ones before it
// emits 'sveltekit:shutdown' — up to SHUTDOWN_TIMEOUT (30 s) when a tablet holds a live stream
// open. So the streams end at the signal (the tablets' EventSource reconnects, to another server
// or to this one restarted, and Last-Event-ID tells it what it missed); in-flight requests finish.
function endStreams(): void {
	closed = true;
	for (const close of [...streams]) close();
}
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
	const onSignal = () => {
		endStreams();
		// Alone (no server of adapter-node's listening for it, e.g. a script), keep the signal's
		// default: end the process.
		if (process.listenerCount(signal) === 1) {
			process.removeListener(signal, onSignal);
			process.kill(process.pid, signal);
		}
	};
	process.on(signal, onSignal);
}

// Then, with every request done, the LISTEN connection.
process.on('sveltekit:shutdown', () => {
	endStreams();
	void client?.end().catch(() => undefined);
});

export const live = { subscribe, trackStream };
