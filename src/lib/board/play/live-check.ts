// The drag's live check as plain messages, so that it runs off the main thread (in the route
// worker's script, its own instance): the table once per game update, then each proposed move,
// answered with the engine's report, each dragged piece's cost split and the unit's spacing links.
// Advice only: the server checks the submitted move again, and only its verdict counts.
import { checkMove, footprintDistance, horizontalIn, localFootprint, pathSteps, pivotIn, resolveProfile } from '../../referee';
import type { CheckReport, CheckRequest, FootprintIn } from '../../schemas/check';

/** The check's table without the move (rules.ts `liveCheckTable`: no support rings). */
export type LiveTable = Omit<CheckRequest, 'move'>;

export interface CostBreakdown {
	piece: string;
	cost: number;
	allowance: number;
	horizontal: number;
	pivot: number;
	climb: number;
}

export interface LivePose {
	x: number;
	y: number;
	facing: number;
}

/** A unit piece and where it stands at the end of its draft (for the spacing links). */
export interface LiveEnd {
	id: string;
	footprint: FootprintIn;
	pose: LivePose;
}

/** Each piece to its nearest unit-mate, edge to edge, at the draft ends of the request. */
export interface LiveLink {
	a: string;
	b: string;
	from: LivePose;
	to: LivePose;
	gapIn: number;
}

export interface LiveAsk {
	type: 'live';
	id: number;
	/** which table the move is checked on; `table` comes along when the worker may not have it yet */
	tableId: number;
	table?: LiveTable;
	/** null: no check applies (a dash before its die), only the spacing links are wanted */
	move: CheckRequest['move'] | null;
	ends: LiveEnd[];
}

export interface LiveAnswer {
	type: 'live';
	id: number;
	/** null when the engine threw (a half-made path it cannot read): nothing to show */
	report: CheckReport | null;
	breakdown: CostBreakdown[];
	links: LiveLink[];
	/** when the table asked for was not there (never sent): the client sends it again */
	missingTable?: boolean;
}

export interface LiveSlot {
	tableId: number;
	table: LiveTable | null;
}

/** Answers one ask; pure apart from keeping the table in `slot`. */
export function liveAnswer(slot: LiveSlot, ask: LiveAsk): LiveAnswer {
	if (ask.table) {
		slot.table = ask.table;
		slot.tableId = ask.tableId;
	}
	const table = slot.tableId === ask.tableId ? slot.table : null;
	if (!table) return { type: 'live', id: ask.id, report: null, breakdown: [], links: [], missingTable: true };
	let report: CheckReport | null = null;
	if (ask.move) {
		try {
			report = checkMove({ ...table, move: ask.move });
		} catch {
			report = null;
		}
	}
	return { type: 'live', id: ask.id, report, breakdown: report && ask.move ? breakdownOf(table, ask.move, report) : [], links: linksOf(ask.ends) };
}

/** Cost of each dragged piece split into across / turning / climbing. */
export function breakdownOf(table: LiveTable, move: CheckRequest['move'], report: CheckReport): CostBreakdown[] {
	const out: CostBreakdown[] = [];
	const prof = resolveProfile(table.profile);
	for (const [id, wps] of Object.entries(move.paths ?? {})) {
		const p = table.pieces.find((q) => q.id === id);
		const pr = report.pieces[id];
		if (!p?.at || !pr) continue;
		const steps = pathSteps(p.at, wps);
		const local = localFootprint(p.footprint, prof.tolerance);
		const horizontal = horizontalIn(steps);
		const pivot = pivotIn(steps, local.rMaxIn, local.round, prof);
		out.push({ piece: id, cost: pr.cost, allowance: pr.allowance, horizontal, pivot, climb: Math.max(0, pr.cost - horizontal - pivot) });
	}
	return out;
}

/** Each piece's link to its nearest unit-mate, each pair once, in the pieces' order. */
export function linksOf(ends: LiveEnd[]): LiveLink[] {
	const out: LiveLink[] = [];
	if (ends.length < 2) return out;
	const drawn = new Set<string>();
	for (const a of ends) {
		let best: { b: LiveEnd; d: number } | null = null;
		for (const b of ends) {
			if (a === b) continue;
			const d = footprintDistance(a.footprint, a.pose, b.footprint, b.pose);
			if (!best || d < best.d) best = { b, d };
		}
		if (!best) continue;
		const key = a.id < best.b.id ? `${a.id}|${best.b.id}` : `${best.b.id}|${a.id}`;
		if (drawn.has(key)) continue;
		drawn.add(key);
		out.push({ a: a.id, b: best.b.id, from: a.pose, to: best.b.pose, gapIn: best.d });
	}
	return out;
}
