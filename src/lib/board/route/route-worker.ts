// The route finder off the main thread: a pick-up builds the planner and its reach map here, so
// drag frames on the board never wait for it. Loaded by RouteClient as a module worker. The
// same script, in an instance of its own, runs the drag's live check (play/live-client.ts): one
// script for both keeps the engine's shared code in the page's JavaScript once.
/// <reference lib="webworker" />
import { answer, type PlannerSlot } from './route-answer';
import type { RouteAsk } from './route-protocol';
import { liveAnswer, type LiveAsk, type LiveSlot } from '../play/live-check';

const slot: PlannerSlot = { planner: null };
const live: LiveSlot = { tableId: 0, table: null };

self.onmessage = (e: MessageEvent<RouteAsk | LiveAsk>) => {
	const m = e.data;
	(self as unknown as DedicatedWorkerGlobalScope).postMessage(m.type === 'live' ? liveAnswer(live, m) : answer(slot, m));
};
