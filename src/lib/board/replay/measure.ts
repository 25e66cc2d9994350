// The measurements a judge looks at for one move: each piece's path and cost against its
// allowance, the distance from its end to the nearest enemy, the unit's spacing links, and the
// engine's report re-run now from the logged state, compared with the report recorded then.
// Pure; the same code draws the replay in the browser and fills the printed turn report.
import { checkMove, endPose, footprintDistance } from '../../referee';
import type { CheckReport, Finding, Profile } from '../../schemas/check';
import type { GameState, Pose } from '../../schemas/game';
import type { Layout } from '../../schemas/layout';
import { checkRequestFor } from '../play/rules';
import type { LogEntry } from '../../schemas/ruling';

export type MoveKind = 'hold' | 'move' | 'dash' | 'withdraw';

/** A move as a log entry records it ('move' or 'refused'). */
export interface LoggedMove {
	seq: number;
	logKind: 'move' | 'refused';
	unit: string;
	kind: MoveKind;
	die?: number;
	paths: Record<string, Pose[]>;
	recorded: CheckReport | null;
}

export function loggedMove(entry: LogEntry): LoggedMove | null {
	if (entry.kind !== 'move' && entry.kind !== 'refused') return null;
	const p = entry.payload as { unit?: unknown; kind?: unknown; die?: unknown; paths?: unknown };
	if (typeof p.unit !== 'string' || typeof p.kind !== 'string') return null;
	return {
		seq: entry.seq,
		logKind: entry.kind,
		unit: p.unit,
		kind: p.kind as MoveKind,
		die: typeof p.die === 'number' ? p.die : undefined,
		paths: (p.paths ?? {}) as Record<string, Pose[]>,
		recorded: entry.report
	};
}

export interface PieceMeasure {
	id: string;
	start: Pose;
	end: Pose;
	/** start, waypoints…, end */
	points: { x: number; y: number }[];
	costIn: number;
	allowanceIn: number;
	findings: Finding[];
	nearestEnemy: { id: string; distanceIn: number } | null;
}

export interface SpacingLink {
	from: string;
	to: string;
	a: { x: number; y: number };
	b: { x: number; y: number };
	distanceIn: number;
	/** within the spacing distance (plus tolerance) */
	within: boolean;
}

export interface MoveMeasures {
	unit: string;
	kind: MoveKind;
	die?: number;
	pieces: PieceMeasure[];
	spacing: SpacingLink[];
	spacingIn: number;
	live: CheckReport;
	recorded: CheckReport | null;
	/** how the live report differs from the recorded one; empty when they agree */
	differences: string[];
}

/** Where each listed piece ends (unlisted pieces of the unit stay put). */
export function endsOf(before: GameState, paths: Record<string, Pose[]>): Record<string, Pose> {
	const out: Record<string, Pose> = {};
	for (const [id, path] of Object.entries(paths)) {
		const piece = before.pieces.find((p) => p.id === id);
		if (!piece?.at || path.length === 0) continue;
		const e = endPose(piece.at, path);
		out[id] = { x: e.x, y: e.y, facing: e.facingDeg };
	}
	return out;
}

const COST_CLOSE_IN = 1e-6;

/** The live report against the recorded one: verdict, findings (code and pieces), costs. */
export function compareReports(live: CheckReport, recorded: CheckReport | null): string[] {
	if (!recorded) return ['no report was recorded with this entry'];
	const out: string[] = [];
	if (live.verdict !== recorded.verdict) out.push(`verdict: ${recorded.verdict} then, ${live.verdict} now`);
	const key = (f: Finding) => `${f.code} (${f.pieces.join(', ')})`;
	const then = recorded.findings.map(key).sort();
	const now = live.findings.map(key).sort();
	for (const k of then) if (!now.includes(k)) out.push(`finding ${k} was recorded and is not found now`);
	for (const k of now) if (!then.includes(k)) out.push(`finding ${k} is found now and was not recorded`);
	for (const [id, r] of Object.entries(live.pieces)) {
		const old = recorded.pieces[id];
		if (!old) out.push(`${id}: no recorded cost`);
		else if (Math.abs(old.cost - r.cost) > COST_CLOSE_IN) out.push(`${id}: cost ${old.cost.toFixed(2)} in then, ${r.cost.toFixed(2)} in now`);
	}
	return out;
}

export function measureMove(
	layout: Layout,
	profile: Profile,
	before: GameState,
	move: { unit: string; kind: MoveKind; die?: number; paths: Record<string, Pose[]> },
	recorded: CheckReport | null
): MoveMeasures {
	const paths = move.kind === 'hold' ? {} : move.paths;
	const live = checkMove(checkRequestFor(layout, profile, before.pieces, { unit: move.unit, kind: move.kind, die: move.die, paths }));
	const ends = endsOf(before, paths);
	const unitPieces = before.pieces.filter((p) => p.unit === move.unit && p.at);
	const endOf = (id: string, at: Pose) => ends[id] ?? at;
	const enemies = before.pieces.filter((p) => p.at && unitPieces[0] && p.side !== unitPieces[0].side);

	const pieces: PieceMeasure[] = unitPieces.map((p) => {
		const start = p.at!;
		const end = endOf(p.id, start);
		let nearest: PieceMeasure['nearestEnemy'] = null;
		for (const e of enemies) {
			const d = footprintDistance(p.footprint, end, e.footprint, e.at!);
			if (!nearest || d < nearest.distanceIn) nearest = { id: e.id, distanceIn: d };
		}
		const r = live.pieces[p.id];
		return {
			id: p.id,
			start,
			end,
			points: [{ x: start.x, y: start.y }, ...(paths[p.id] ?? []).map((w) => ({ x: w.x, y: w.y }))],
			costIn: r?.cost ?? 0,
			allowanceIn: r?.allowance ?? p.allowance,
			findings: r?.findings ?? [],
			nearestEnemy: nearest
		};
	});

	const limit = profile.spacing + profile.tolerance;
	const spacing: SpacingLink[] = [];
	for (let i = 0; i < pieces.length; i++) {
		let best: SpacingLink | null = null;
		let linked = false;
		for (let j = 0; j < pieces.length; j++) {
			if (i === j) continue;
			const a = unitPieces[i];
			const b = unitPieces[j];
			const d = footprintDistance(a.footprint, pieces[i].end, b.footprint, pieces[j].end);
			const link: SpacingLink = { from: a.id, to: b.id, a: pieces[i].end, b: pieces[j].end, distanceIn: d, within: d <= limit };
			if (link.within) {
				linked = true;
				if (i < j) spacing.push(link);
			}
			if (!best || d < best.distanceIn) best = link;
		}
		// A piece out of spacing is shown with the link to its nearest unit-mate, marked as too far.
		if (!linked && best) spacing.push(best);
	}

	return {
		unit: move.unit,
		kind: move.kind,
		die: move.die,
		pieces,
		spacing,
		spacingIn: profile.spacing,
		live,
		recorded,
		differences: compareReports(live, recorded)
	};
}

/** "5.84 in of 6" — figures with units and two decimals. */
export const inches = (n: number) => `${n.toFixed(2)} in`;
export const costOf = (m: PieceMeasure) => `${m.costIn.toFixed(2)} in of ${Number.isInteger(m.allowanceIn) ? m.allowanceIn : m.allowanceIn.toFixed(2)}`;
