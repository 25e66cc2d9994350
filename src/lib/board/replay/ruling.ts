// What a judge's ruling does, worked out before anything is written: the ruled end poses of the
// disputed move's pieces, the engine's report on an adjustment (checked from the state before
// the disputed move, along the logged route with its end corrected), and the pieces the ruling
// moves on the table as it stands now. Pure: the desk previews it live, the server records it.
import { checkMove } from '../../referee';
import type { CheckReport, Profile } from '../../schemas/check';
import type { GameState, Pose } from '../../schemas/game';
import type { Layout } from '../../schemas/layout';
import type { RulingOutcome } from '../../schemas/ruling';
import { checkRequestFor } from '../play/rules';
import { endsOf, type LoggedMove } from './measure';

export interface RulingPlan {
	ruled: Record<string, Pose>;
	changes: { piece: string; from: Pose | null; to: Pose }[];
	/** the engine's report on what the ruling lets stand (null when it leaves the record as it was) */
	report: CheckReport | null;
	/** the paths the adjustment was checked along */
	paths: Record<string, Pose[]> | null;
	/** the judge let an illegal move stand */
	allowsIllegal: boolean;
	settledPending: boolean;
}

export type PlanResult = { ok: true; plan: RulingPlan } | { ok: false; status: 400 | 422; message: string; report?: CheckReport };

const same = (a: Pose | null | undefined, b: Pose) =>
	!!a && Math.abs(a.x - b.x) < 1e-9 && Math.abs(a.y - b.y) < 1e-9 && Math.abs((a.facing ?? 0) - (b.facing ?? 0)) < 1e-9;

/** The logged route of each piece with its end replaced by the judge's; a piece without one goes straight. */
export function correctedPaths(move: LoggedMove, positions: Record<string, Pose>): Record<string, Pose[]> {
	const out: Record<string, Pose[]> = {};
	for (const [id, path] of Object.entries(move.paths)) out[id] = path;
	for (const [id, at] of Object.entries(positions)) {
		const logged = move.paths[id] ?? [];
		out[id] = [...logged.slice(0, -1), at];
	}
	return out;
}

export function planRuling(input: {
	layout: Layout;
	profile: Profile;
	/** the state just before the disputed entry */
	before: GameState;
	/** the table now */
	current: GameState;
	/** the disputed entry, when it is a move or a refused move; null for any other kind */
	move: LoggedMove | null;
	moveSeq: number;
	outcome: RulingOutcome;
	positions?: Record<string, Pose>;
	allowIllegal: boolean;
}): PlanResult {
	const { move, before, current } = input;
	const settledPending = current.pending?.seq === input.moveSeq;
	if (input.outcome === 'uphold') {
		const ruled = move ? (move.logKind === 'move' ? endsOf(before, move.paths) : {}) : {};
		return { ok: true, plan: { ruled, changes: [], report: null, paths: null, allowsIllegal: false, settledPending } };
	}
	if (!move) return { ok: false, status: 400, message: 'Only a move or a refused move can be overturned or adjusted; this entry can be upheld, with the reason' };
	if (move.kind === 'hold') return { ok: false, status: 400, message: 'A hold moves nothing: it can only be upheld' };

	const unitPieces = before.pieces.filter((p) => p.unit === move.unit && p.at);
	const startOf = new Map(unitPieces.map((p) => [p.id, p.at!]));
	let ruled: Record<string, Pose>;
	let report: CheckReport | null = null;
	let paths: Record<string, Pose[]> | null = null;
	let allowsIllegal = false;

	if (input.outcome === 'overturn') {
		if (move.logKind === 'move') {
			// The move is undone: its pieces stand where they stood before it.
			ruled = Object.fromEntries(Object.keys(move.paths).filter((id) => startOf.has(id)).map((id) => [id, { ...startOf.get(id)! }]));
		} else {
			// A refused move is allowed as it was proposed.
			ruled = endsOf(before, move.paths);
			paths = move.paths;
			report = checkMove(checkRequestFor(input.layout, input.profile, before.pieces, { unit: move.unit, kind: move.kind, die: move.die, paths: move.paths }));
			allowsIllegal = report.verdict === 'illegal';
		}
	} else {
		const positions = input.positions ?? {};
		for (const id of Object.keys(positions)) {
			if (!startOf.has(id)) return { ok: false, status: 400, message: `"${id}" is not a piece of ${move.unit} on the table at that point` };
		}
		paths = correctedPaths(move, positions);
		report = checkMove(checkRequestFor(input.layout, input.profile, before.pieces, { unit: move.unit, kind: move.kind, die: move.die, paths }));
		if (report.verdict === 'illegal' && !input.allowIllegal) {
			const first = report.findings.find((f) => f.severity !== 'warning');
			return {
				ok: false,
				status: 422,
				message: `The engine finds the adjusted move illegal${first ? `: ${first.message}` : ''}. Allow it with the reason, or place the pieces again`,
				report
			};
		}
		allowsIllegal = report.verdict === 'illegal';
		ruled = endsOf(before, paths);
	}

	const changes: RulingPlan['changes'] = [];
	for (const [id, to] of Object.entries(ruled)) {
		const now = current.pieces.find((p) => p.id === id)?.at ?? null;
		if (!same(now, to)) changes.push({ piece: id, from: now, to });
	}
	return { ok: true, plan: { ruled, changes, report, paths, allowsIllegal, settledPending } };
}
