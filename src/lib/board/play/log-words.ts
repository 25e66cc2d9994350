// The move log in words, pure: one sentence per entry for the play screen's panel, and the full
// rows of the move log page and its JSON download (who, when, which side and round, what kind,
// and for a checked move each piece's cost against its allowance and every finding).
import type { MoveKind } from '../../schemas/check';
import type { GamePiece, MoveLogEntry, MoveLogKind, Side } from '../../schemas/game';
import { rulingPayloadSchema, type RulingPayload } from '../../schemas/ruling';

const sideLabel = (s: Side): string => (s === 'a' ? 'Side A' : 'Side B');
const moveKindLabel: Record<MoveKind, string> = { hold: 'Hold', move: 'Move', dash: 'Dash', withdraw: 'Withdraw' };
const limitText = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(2));

export const logKindLabel: Record<MoveLogKind, string> = {
	roster: 'Roster',
	deploy: 'Deployment',
	roll: 'Die roll',
	move: 'Move',
	refused: 'Refused move',
	accept: 'Acceptance',
	'take-back': 'Take-back',
	'ruling-request': 'Ruling request',
	'end-turn': 'End of turn',
	ruling: 'Ruling'
};

export const outcomeWords: Record<RulingPayload['outcome'], string> = { uphold: 'upholds', overturn: 'overturns', adjust: 'adjusts' };

/** The ruling an entry carries, or null when it is not a (readable) ruling. */
export function rulingOf(e: MoveLogEntry): RulingPayload | null {
	if (e.kind !== 'ruling') return null;
	const r = rulingPayloadSchema.safeParse(e.payload);
	return r.success ? r.data : null;
}

/** A log entry in one sentence, for the log panel. */
export function describeEntry(e: MoveLogEntry, pieces: readonly GamePiece[]): string {
	const unitName = (u: unknown) => pieces.find((p) => p.unit === u)?.unitName ?? String(u);
	const p = e.payload as Record<string, unknown>;
	const side = e.side ? sideLabel(e.side) : '';
	switch (e.kind) {
		case 'roster':
			return `${side} brings "${p.rosterName}" (${p.pieces} pieces)`;
		case 'deploy':
			return `${side} deploys ${(p.placements as unknown[]).length} piece(s)`;
		case 'roll':
			return `${side} rolls ${p.die} for the dash of ${unitName(p.unit)}`;
		case 'move':
			return `${side}: ${unitName(p.unit)} — ${moveKindLabel[p.kind as MoveKind]}${p.die ? ` (die ${p.die})` : ''}, legal`;
		case 'refused':
			return `${side}: ${unitName(p.unit)} — ${moveKindLabel[p.kind as MoveKind]} refused: ${(e.report?.findings ?? []).filter((f) => f.severity !== 'warning').map((f) => f.message).join('; ')}`;
		case 'accept':
			return `${side} accepts move #${p.moveSeq}`;
		case 'take-back':
			return `${side} takes move #${p.moveSeq} back`;
		case 'ruling-request':
			return `${side} asks a judge about move #${p.moveSeq}: "${p.note}"`;
		case 'end-turn': {
			const next = p.next as { phase: string; round: number; side: Side };
			return `${side} ends its ${p.phase === 'deploy' ? 'deployment' : 'turn'}; next: ${sideLabel(next.side)}${next.phase === 'move' ? `, round ${next.round}` : ''}`;
		}
		case 'ruling': {
			const r = rulingOf(e);
			if (!r) return `A judge rules (the entry could not be read)`;
			const moved = r.changes.length ? `; ${r.changes.length} piece(s) placed anew` : '';
			return `Judge ${r.judge.name} ${outcomeWords[r.outcome]} move #${r.moveSeq}${r.allowIllegal ? ' (allowed although the engine found it illegal)' : ''}: "${r.reason}"${moved}`;
		}
	}
}

export interface LogRow {
	seq: number;
	/** ISO time the entry was appended */
	at: string;
	actor: string;
	side: Side | null;
	sideText: string;
	round: number;
	kind: MoveLogKind;
	kindText: string;
	/** the entry in one sentence */
	summary: string;
	/** the engine's verdict for checked entries */
	verdict: 'legal' | 'illegal' | null;
	die: number | null;
	/** "a-u1-p1: 5.84 in of 6" per piece that moved (checked entries) */
	costs: string[];
	/** every finding in words, errors marked ✕ and warnings ℹ */
	findings: string[];
	ruling: { judge: string; signedAt: string; outcome: RulingPayload['outcome']; reason: string; moveSeq: number } | null;
}

/** Every entry of a game's log as a row for the log page and its download. */
export function logRows(entries: readonly MoveLogEntry[], pieces: readonly GamePiece[]): LogRow[] {
	return entries.map((e) => {
		const p = e.payload as Record<string, unknown>;
		const r = rulingOf(e);
		const costs: string[] = [];
		if (e.report && (e.kind === 'move' || e.kind === 'refused' || e.kind === 'ruling')) {
			const paths = (p.paths ?? {}) as Record<string, unknown>;
			const moved = e.kind === 'ruling' ? Object.keys(e.report.pieces) : Object.keys(paths);
			for (const id of moved) {
				const pr = e.report.pieces[id];
				if (pr) costs.push(`${id}: ${pr.cost.toFixed(2)} in of ${limitText(pr.allowance)}`);
			}
		}
		const findings = (e.report?.findings ?? []).map((f) => `${f.severity === 'warning' ? 'ℹ' : '✕'} ${f.message}`);
		const die = typeof p.die === 'number' ? p.die : null;
		return {
			seq: e.seq,
			at: e.createdAt,
			actor: e.actorName,
			side: e.side,
			sideText: e.side ? sideLabel(e.side) : r ? 'Judge' : '—',
			round: e.round,
			kind: e.kind,
			kindText: logKindLabel[e.kind],
			summary: describeEntry(e, pieces),
			verdict: e.report?.verdict ?? null,
			die,
			costs,
			findings,
			ruling: r ? { judge: r.judge.name, signedAt: r.signedAt, outcome: r.outcome, reason: r.reason, moveSeq: r.moveSeq } : null
		};
	});
}
