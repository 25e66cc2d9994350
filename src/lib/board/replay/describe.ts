// One plain line per move-log entry, for the replay's list, the desk and the printed report.
import type { LogEntry } from '../../schemas/ruling';
import { rulingPayloadSchema } from '../../schemas/ruling';

const sideName = (s: string | null) => (s === 'a' ? 'side A' : s === 'b' ? 'side B' : 'the judge');

export function describeEntry(e: LogEntry): string {
	const p = e.payload as Record<string, unknown>;
	switch (e.kind) {
		case 'roster':
			return `${sideName(e.side)} brings the roster "${String(p.rosterName ?? '')}"`;
		case 'deploy':
			return `${sideName(e.side)} deploys ${Array.isArray(p.placements) ? p.placements.length : 0} piece(s)`;
		case 'roll':
			return `${sideName(e.side)} rolls ${String(p.die)} for a dash of ${String(p.unit)}`;
		case 'move':
			return `${sideName(e.side)}: ${String(p.unit)} ${String(p.kind)}${p.die ? ` (die ${p.die})` : ''} — ${e.report?.verdict ?? 'unchecked'}`;
		case 'refused':
			return `${sideName(e.side)}: ${String(p.unit)} ${String(p.kind)} refused — ${e.report?.findings.find((f) => f.severity !== 'warning')?.message ?? 'illegal'}`;
		case 'accept':
			return `${sideName(e.side)} accepts move #${String(p.moveSeq)}`;
		case 'take-back':
			return `${sideName(e.side)} takes move #${String(p.moveSeq)} back`;
		case 'ruling-request':
			return `${sideName(e.side)} asks for a ruling on #${String(p.moveSeq)}: "${String(p.note ?? '')}"`;
		case 'end-turn':
			return `${sideName(e.side)} ends the turn`;
		case 'ruling': {
			const r = rulingPayloadSchema.safeParse(p);
			if (!r.success) return 'a ruling';
			const words = { uphold: 'upholds', overturn: 'overturns', adjust: 'adjusts' }[r.data.outcome];
			return `Judge ${r.data.judge.name} ${words} #${r.data.moveSeq}${r.data.allowIllegal ? ' (allowed although illegal)' : ''}: ${r.data.reason}`;
		}
		default:
			return e.kind;
	}
}

/** A shape beside the words, so the kind never rests on colour alone. */
export function entryMark(e: LogEntry): string {
	if (e.kind === 'refused') return '✕';
	if (e.kind === 'ruling') return '⚖';
	if (e.kind === 'ruling-request') return '?';
	if (e.kind === 'move') return e.report?.verdict === 'illegal' ? '✕' : '✓';
	return '•';
}
