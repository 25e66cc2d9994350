// The route finder off the main thread: a pick-up builds the planner and its reach map here, so
// drag frames on the board never wait for it. Loaded by RouteClient as a module worker.
/// <reference lib="webworker" />
import { answer, type PlannerSlot } from './route-answer';
import type { RouteAsk } from './route-protocol';

const slot: PlannerSlot = { planner: null };

self.onmessage = (e: MessageEvent<RouteAsk>) => {
	(self as unknown as DedicatedWorkerGlobalScope).postMessage(answer(slot, e.data));
};
