// Undo/redo over layouts: a stack of past documents, the present, and a stack of undone ones.
// Documents are immutable values, so undo is exact and cheap (commands share what they keep).
import type { Layout } from '$lib/schemas/layout';
import { perform, type Command } from './commands';

/** Enough for a long editing session; the oldest steps fall off first. */
export const HISTORY_LIMIT = 200;

export interface History {
	past: Layout[];
	present: Layout;
	future: Layout[];
}

export const startHistory = (present: Layout): History => ({ past: [], present, future: [] });

/** Do a command: a new present, the old one on the undo stack, the redo stack cleared. */
export function execute(h: History, cmd: Command): History {
	const next = perform(h.present, cmd);
	if (next === h.present) return h; // a no-op is not an undo step
	const past = [...h.past, h.present];
	if (past.length > HISTORY_LIMIT) past.shift();
	return { past, present: next, future: [] };
}

export function undo(h: History): History {
	if (h.past.length === 0) return h;
	return { past: h.past.slice(0, -1), present: h.past[h.past.length - 1], future: [h.present, ...h.future] };
}

export function redo(h: History): History {
	if (h.future.length === 0) return h;
	return { past: [...h.past, h.present], present: h.future[0], future: h.future.slice(1) };
}

export const canUndo = (h: History) => h.past.length > 0;
export const canRedo = (h: History) => h.future.length > 0;
