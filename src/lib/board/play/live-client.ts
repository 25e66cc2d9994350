// The play screen's side of the live check worker: the newest proposed move wins. At most one
// ask is in flight; a newer move waits in its place (replacing any older one waiting), so a
// slow check never builds a queue of stale drag positions. The table goes along with the first
// ask after it changed. Create one per play screen.
import type { LiveAnswer, LiveAsk, LiveEnd, LiveSlot, LiveTable } from './live-check';

/** What the client talks to: a Worker, or a stand-in (tests, or where workers are missing). */
export interface LivePort {
	postMessage(ask: LiveAsk): void;
	onmessage: ((e: MessageEvent<LiveAnswer>) => void) | null;
	terminate(): void;
}

/**
 * The same answers on the calling thread, a task or more later (as a worker's would come). The
 * check is loaded only then (dynamic import): the page's own JavaScript does not carry the engine
 * that the worker already has.
 */
export function localPort(): LivePort {
	const slot: LiveSlot = { tableId: 0, table: null };
	const port: LivePort = {
		onmessage: null,
		postMessage: (ask) => {
			void import('./live-check').then(({ liveAnswer }) => {
				const a = liveAnswer(slot, ask);
				port.onmessage?.({ data: a } as MessageEvent<LiveAnswer>);
			});
		},
		terminate: () => (port.onmessage = null)
	};
	return port;
}

/** An ask as the play screen makes it: `context` says which state the answer belongs to. */
export interface LiveQuestion {
	context: string;
	move: LiveAsk['move'] | null;
	ends: LiveEnd[];
}

export class LiveClient {
	private port: LivePort;
	private nextId = 1;
	private inFlight: { id: number; q: LiveQuestion } | null = null;
	private queued: LiveQuestion | null = null;
	private table: LiveTable | null = null;
	private tableId = 0;
	private sentTableId = 0;

	/** `onanswer` gets each answer with the question it answers. */
	constructor(
		private onanswer: (a: LiveAnswer, q: LiveQuestion) => void,
		opts: { port?: LivePort } = {}
	) {
		this.port =
			opts.port ??
			(typeof Worker !== 'undefined'
				? (new Worker(new URL('../route/route-worker.ts', import.meta.url), { type: 'module' }) as unknown as LivePort)
				: localPort());
		this.port.onmessage = (e) => this.received(e.data);
	}

	/** The table every following move is checked on (sent once, with the next ask). */
	setTable(table: LiveTable): void {
		if (table === this.table) return;
		this.table = table;
		this.tableId++;
	}

	/** Asks about a move; replaces a question still waiting. */
	ask(q: LiveQuestion): void {
		this.queued = q;
		this.pump();
	}

	/** Drops the question still waiting (the one in flight is answered and may be ignored). */
	clear(): void {
		this.queued = null;
	}

	/** How many asks are waiting or in flight (0, 1 or 2): for tests. */
	get outstanding(): number {
		return (this.inFlight ? 1 : 0) + (this.queued ? 1 : 0);
	}

	private pump(): void {
		if (this.inFlight || !this.queued || !this.table) return;
		const q = this.queued;
		this.queued = null;
		const id = this.nextId++;
		this.inFlight = { id, q };
		const ask: LiveAsk = { type: 'live', id, tableId: this.tableId, move: q.move, ends: q.ends };
		if (this.sentTableId !== this.tableId) {
			ask.table = this.table;
			this.sentTableId = this.tableId;
		}
		this.port.postMessage(ask);
	}

	private received(a: LiveAnswer): void {
		const f = this.inFlight;
		if (!f || f.id !== a.id) return;
		this.inFlight = null;
		if (a.missingTable) {
			// the worker lost or never got the table: send it again with the same question
			this.sentTableId = 0;
			this.queued ??= f.q;
		} else this.onanswer(a, f.q);
		this.pump();
	}

	dispose(): void {
		this.port.terminate();
		this.port.onmessage = null;
		this.inFlight = null;
		this.queued = null;
	}
}
