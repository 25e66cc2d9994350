// The replay's rune state, one per page: the folded log, the selected entry, before/after, and
// what the board draws for it (pieces, paths, costs, nearest enemies, spacing links, findings).
import type { Profile } from '$lib/schemas/check';
import type { GamePiece, GameState } from '$lib/schemas/game';
import type { Layout } from '$lib/schemas/layout';
import type { LogEntry } from '$lib/schemas/ruling';
import type { BoardPiece, Overlay } from '../types';
import { disagreements, foldLog, type Fold } from './fold';
import { inches, loggedMove, measureMove, type MoveMeasures } from './measure';
import { rulingPayloadSchema } from '$lib/schemas/ruling';

export interface ReplayInput {
	layout: Layout;
	profile: Profile;
	log: LogEntry[];
	/** the state the game row holds now */
	stored: GameState;
}

export function boardPieces(state: GameState, flagged: Set<string> = new Set()): BoardPiece[] {
	return state.pieces
		.filter((p): p is GamePiece & { at: NonNullable<GamePiece['at']> } => p.at !== null)
		.map((p) => ({ id: p.id, side: p.side, footprint: p.footprint, at: p.at, label: p.id.slice(2), flagged: flagged.has(p.id) }));
}

/** The measures plus where every piece stood, for drawing links to enemies. */
export type ShownMeasures = MoveMeasures & { enemyAt: Record<string, { x: number; y: number }>; keepOutIn: number };

export function measureOverlays(m: ShownMeasures, tone: 'sidea' | 'sideb'): Overlay[] {
	const out: Overlay[] = [];
	for (const p of m.pieces) {
		if (p.points.length > 1) out.push({ kind: 'path', points: p.points, tone, arrow: true });
		if (p.points.length > 1) out.push({ kind: 'label', x: p.end.x, y: p.end.y - 0.9, text: `${p.costIn.toFixed(2)} of ${p.allowanceIn}`, tone: p.findings.some((f) => f.code === 'over-allowance') ? 'signal' : 'ink' });
		if (p.nearestEnemy) {
			const enemy = m.enemyAt[p.nearestEnemy.id];
			if (enemy) out.push({ kind: 'link', from: p.end, to: enemy, tone: p.nearestEnemy.distanceIn <= m.keepOutIn ? 'signal' : 'brass', dashed: true, label: `${inches(p.nearestEnemy.distanceIn)} to ${p.nearestEnemy.id}` });
		}
		for (const f of p.findings) if (f.severity !== 'warning') out.push({ kind: 'warning', x: p.end.x + 0.8, y: p.end.y - 0.8, label: f.code });
	}
	for (const s of m.spacing) out.push({ kind: 'link', from: s.a, to: s.b, tone: s.within ? 'ok' : 'signal', dashed: !s.within, label: `${s.distanceIn.toFixed(2)} in${s.within ? '' : ' (too far)'}` });
	return out;
}

export class ReplayState {
	layout: Layout;
	profile: Profile;
	log = $state.raw<LogEntry[]>([]);
	stored = $state.raw<GameState | null>(null);
	/** index into fold.steps */
	index = $state(0);
	show = $state<'before' | 'after'>('after');

	fold: Fold = $derived.by(() =>
		foldLog(this.log, { layout: this.layout, profile: this.profile, firstSide: this.stored!.firstSide, catalogue: this.stored!.pieces })
	);
	/** the browser's own fold against the stored state (the server checks the same) */
	differences: string[] = $derived(this.stored ? disagreements(this.fold.final, this.stored) : []);
	step = $derived(this.fold.steps[this.index] ?? null);
	state: GameState = $derived(this.step ? (this.show === 'before' ? this.step.before : this.step.after) : this.fold.initial);
	measures: ShownMeasures | null = $derived.by(() => {
		const s = this.step;
		if (!s) return null;
		const lm = loggedMove(s.entry);
		if (!lm) return null;
		const m = measureMove(this.layout, this.profile, s.before, lm, lm.recorded);
		const enemyAt: Record<string, { x: number; y: number }> = {};
		for (const p of s.before.pieces) if (p.at) enemyAt[p.id] = p.at;
		return { ...m, enemyAt, keepOutIn: this.profile.keepOut };
	});
	ruling = $derived.by(() => {
		const s = this.step;
		if (!s || s.entry.kind !== 'ruling') return null;
		const p = rulingPayloadSchema.safeParse(s.entry.payload);
		return p.success ? p.data : null;
	});

	constructor(input: ReplayInput, seq?: number) {
		this.layout = input.layout;
		this.profile = input.profile;
		this.stored = input.stored;
		this.log = input.log;
		this.index = Math.max(0, input.log.length - 1);
		if (seq !== undefined) this.select(seq);
	}

	/** New entries arrived (live): keep the selection unless it was on the last entry. */
	update(input: ReplayInput) {
		const atEnd = this.index >= this.log.length - 1;
		this.stored = input.stored;
		this.log = input.log;
		if (atEnd) this.index = Math.max(0, input.log.length - 1);
	}

	select(seq: number) {
		const i = this.log.findIndex((e) => e.seq === seq);
		if (i >= 0) this.index = i;
	}
	next() {
		// Forwards: before → after of this entry, then before of the next.
		if (this.show === 'before') this.show = 'after';
		else if (this.index < this.log.length - 1) {
			this.index += 1;
			this.show = 'before';
		}
	}
	prev() {
		if (this.show === 'after') this.show = 'before';
		else if (this.index > 0) {
			this.index -= 1;
			this.show = 'after';
		}
	}
	get atStart() {
		return this.index === 0 && this.show === 'before';
	}
	get atEnd() {
		return this.index >= this.log.length - 1 && this.show === 'after';
	}

	pieces(): BoardPiece[] {
		const flagged = new Set<string>();
		const m = this.measures;
		if (m) for (const f of m.live.findings) if (f.severity !== 'warning') f.pieces.forEach((id) => flagged.add(id));
		return boardPieces(this.state, flagged);
	}

	overlays(): Overlay[] {
		const m = this.measures;
		if (m) {
			const side = this.step?.entry.side === 'b' ? 'sideb' : 'sidea';
			return measureOverlays(m, side);
		}
		const r = this.ruling;
		if (r) return r.changes.filter((c) => c.from).map((c) => ({ kind: 'path', points: [c.from!, c.to], tone: 'brass', arrow: true, dashed: true }) as Overlay);
		return [];
	}
}
