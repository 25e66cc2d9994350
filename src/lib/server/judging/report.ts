// The turn report: every entry of one round (optionally one side's turn) with its check — the
// verdict, findings, each piece's cost against its allowance and the engine's re-run compared
// with the recorded report — and the requests and rulings about it. Printed, or downloaded as
// JSON; a link with a token lets an organiser read it without being a player of the game.
import { createHash } from 'node:crypto';
import type { User } from 'lucia';
import { describeEntry } from '$lib/board/replay/describe';
import { foldLog, stepAt } from '$lib/board/replay/fold';
import { loggedMove, measureMove } from '$lib/board/replay/measure';
import type { Side } from '$lib/schemas/game';
import type { Finding } from '$lib/schemas/check';
import { rulingPayloadSchema, type RulingPayload, type RulingRequestView } from '$lib/schemas/ruling';
import { generateResetToken, hashToken, isResetTokenShape } from '$lib/server/auth/token';
import { rulings } from '$lib/server/db/rulings';
import type { ReplayData } from './replay';
import { accessTo, maySee } from './access';

/** Shared links work for a month: long enough for an event's review. */
export const REPORT_LINK_DAYS = 30;

export interface TurnReportEntry {
	seq: number;
	kind: string;
	side: Side | null;
	by: string;
	at: string;
	text: string;
	check: null | {
		verdict: 'legal' | 'illegal';
		findings: Pick<Finding, 'code' | 'severity' | 'message' | 'measured' | 'limit' | 'pieces'>[];
		pieces: { id: string; costIn: number; allowanceIn: number; nearestEnemyIn: number | null }[];
		rerunAgrees: boolean;
		rerunDifferences: string[];
	};
	ruling: RulingPayload | null;
}

export interface TurnReport {
	game: { id: number; title: string };
	players: { side: Side; name: string | null }[];
	round: number;
	side: Side | null;
	generatedAt: string;
	foldAgrees: boolean;
	foldDifferences: string[];
	entries: TurnReportEntry[];
	requests: Pick<RulingRequestView, 'id' | 'moveSeq' | 'status' | 'note' | 'createdAt' | 'ruledSeq'>[];
	rounds: number[];
}

export function buildTurnReport(data: ReplayData, round: number, side: Side | null): TurnReport {
	const g = data.game;
	const fold = foldLog(data.log, { layout: g.layout, profile: g.profile, firstSide: g.state.firstSide, catalogue: g.state.pieces });
	const inTurn = data.log.filter((e) => e.round === round && (side === null || e.side === side || e.kind === 'ruling'));
	const entries: TurnReportEntry[] = inTurn.map((e) => {
		const lm = loggedMove(e);
		const step = stepAt(fold, e.seq);
		let check: TurnReportEntry['check'] = null;
		if (lm && step) {
			const m = measureMove(g.layout, g.profile, step.before, lm, lm.recorded);
			const rep = lm.recorded ?? m.live;
			check = {
				verdict: rep.verdict,
				findings: rep.findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message, measured: f.measured, limit: f.limit, pieces: f.pieces })),
				pieces: m.pieces.filter((p) => p.points.length > 1).map((p) => ({ id: p.id, costIn: p.costIn, allowanceIn: p.allowanceIn, nearestEnemyIn: p.nearestEnemy?.distanceIn ?? null })),
				rerunAgrees: m.differences.length === 0,
				rerunDifferences: m.differences
			};
		}
		const r = e.kind === 'ruling' ? rulingPayloadSchema.safeParse(e.payload) : null;
		return { seq: e.seq, kind: e.kind, side: e.side, by: e.actorName, at: e.createdAt, text: describeEntry(e), check, ruling: r?.success ? r.data : null };
	});
	const seqs = new Set(inTurn.map((e) => e.seq));
	return {
		game: { id: g.id, title: g.title },
		players: data.players,
		round,
		side,
		generatedAt: new Date().toISOString(),
		foldAgrees: data.disagreements.length === 0,
		foldDifferences: data.disagreements,
		entries,
		requests: data.requests
			.filter((r) => seqs.has(r.moveSeq) || seqs.has(r.requestSeq))
			.map((r) => ({ id: r.id, moveSeq: r.moveSeq, status: r.status, note: r.note, createdAt: r.createdAt, ruledSeq: r.ruledSeq })),
		rounds: [...new Set(data.log.map((e) => e.round))].sort((a, b) => a - b)
	};
}

/** May this user read the report: by standing in the game, or with a valid shared link for it. */
export async function mayReadReport(user: User, gameId: number, round: number, key: string | null): Promise<'yes' | 'no-game' | 'no'> {
	const access = await accessTo(gameId, user);
	if (!access) return 'no-game';
	if (maySee(access)) return 'yes';
	if (key && isResetTokenShape(key)) {
		const link = await rulings.findReportLink(hashToken(key));
		if (link && link.gameId === gameId && link.round === round && link.expiresAt > new Date()) return 'yes';
	}
	return 'no';
}

export async function shareReport(user: User, gameId: number, round: number): Promise<string> {
	const token = generateResetToken();
	await rulings.addReportLink({ tokenHash: hashToken(token), gameId, round, createdBy: user.id, expiresAt: new Date(Date.now() + REPORT_LINK_DAYS * 86_400_000) });
	return token;
}

/** A stable tag for the JSON download's name. */
export const reportTag = (r: TurnReport) => createHash('sha256').update(`${r.game.id}:${r.round}:${r.side ?? ''}`).digest('hex').slice(0, 8);
