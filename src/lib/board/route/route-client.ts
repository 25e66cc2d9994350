// What the play screen calls: pick a piece up (builds its planner in the worker and returns its
// reach map), then ask for routes while dragging (only the newest drag position is answered; older
// ones resolve to null), and for the nearest legal end on a drop. Create one per play screen.
import type { NearestResult, ReachMap, RouteRequest, RouteResult } from '$lib/referee/route';
import type { PlannerSlot } from './route-answer';
import type { RouteAnswer, RouteAsk } from './route-protocol';

type Pending = { resolve: (a: RouteAnswer) => void };
/** A question without its id (distributes over the union, unlike Omit). */
type Ask = RouteAsk extends infer A ? (A extends RouteAsk ? Omit<A, 'id'> : never) : never;

export class RouteClient {
	private worker: Worker | null = null;
	private slot: PlannerSlot = { planner: null };
	private nextId = 1;
	private pending = new Map<number, Pending>();
	/** the drag question waiting behind the one in flight (replaced by each newer position) */
	private queuedRoute: { x: number; y: number; resolve: (r: RouteResult | null) => void } | null = null;
	private routeInFlight = false;
	private generation = 0;

	/** `useWorker: false` answers on the calling thread (tests, or where workers are missing). */
	constructor(opts: { useWorker?: boolean } = {}) {
		const want = opts.useWorker ?? typeof Worker !== 'undefined';
		if (want) {
			this.worker = new Worker(new URL('./route-worker.ts', import.meta.url), { type: 'module' });
			this.worker.onmessage = (e: MessageEvent<RouteAnswer>) => {
				const p = this.pending.get(e.data.id);
				if (!p) return;
				this.pending.delete(e.data.id);
				p.resolve(e.data);
			};
		}
	}

	private ask(a: Ask): Promise<RouteAnswer> {
		const full = { ...a, id: this.nextId++ } as RouteAsk;
		// without a worker the finder is loaded on this thread when first asked (dynamic import), so
		// the page's own JavaScript does not carry the engine the worker already has
		if (!this.worker) return import('./route-answer').then(({ answer }) => answer(this.slot, full));
		return new Promise((resolve) => {
			this.pending.set(full.id, { resolve });
			this.worker!.postMessage(full);
		});
	}

	/** Picks a piece up for a move kind: builds its planner and returns its reach map. */
	async pickUp(request: RouteRequest, cellIn?: number): Promise<ReachMap> {
		this.generation++;
		this.queuedRoute?.resolve(null);
		this.queuedRoute = null;
		const prepared = await this.ask({ type: 'prepare', request });
		if (prepared.type === 'error') throw new Error(prepared.message);
		return this.reachMap(cellIn);
	}

	async reachMap(cellIn?: number): Promise<ReachMap> {
		const a = await this.ask({ type: 'reach', cellIn });
		if (a.type !== 'reach') throw new Error(a.type === 'error' ? a.message : 'unexpected answer');
		return a.map;
	}

	/**
	 * The shortest legal route to the finger. Drag frames come faster than answers: while one is
	 * in flight only the latest position waits, and positions it replaced resolve to null.
	 */
	findRoute(x: number, y: number): Promise<RouteResult | null> {
		return new Promise((resolve) => {
			this.queuedRoute?.resolve(null);
			this.queuedRoute = { x, y, resolve };
			this.pump();
		});
	}

	private pump(): void {
		if (this.routeInFlight || !this.queuedRoute) return;
		const q = this.queuedRoute;
		this.queuedRoute = null;
		this.routeInFlight = true;
		const gen = this.generation;
		void this.ask({ type: 'route', x: q.x, y: q.y }).then((a) => {
			this.routeInFlight = false;
			q.resolve(a.type === 'route' && gen === this.generation ? a.route : null);
			this.pump();
		});
	}

	/** The legal end nearest to a proposed one (offered when a piece is dropped on an illegal spot). */
	async nearestLegal(x: number, y: number): Promise<NearestResult> {
		const a = await this.ask({ type: 'nearest', x, y });
		if (a.type !== 'nearest') throw new Error(a.type === 'error' ? a.message : 'unexpected answer');
		return a.nearest;
	}

	dispose(): void {
		this.worker?.terminate();
		this.worker = null;
		for (const p of this.pending.values()) p.resolve({ id: -1, type: 'error', message: 'disposed' });
		this.pending.clear();
		this.queuedRoute?.resolve(null);
		this.queuedRoute = null;
	}
}
