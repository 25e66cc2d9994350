// Taking a request and ruling on it. A ruling is one transaction: the request and the game row
// locked, the log folded to the state before the disputed entry, the plan worked out (an
// adjustment checked by the engine), then a 'ruling' entry appended — signed with the judge's
// name and the time — the new positions saved and the request marked ruled. moves.append
// notifies the game's channel, so both players' screens hear of it at once.
import type { User } from 'lucia';
import type { RulingInput, RulingPayload, LogEntry } from '$lib/schemas/ruling';
import { foldLog, stateBefore, applyRuling } from '$lib/board/replay/fold';
import { loggedMove } from '$lib/board/replay/measure';
import { planRuling } from '$lib/board/replay/ruling';
import { db } from '$lib/server/db';
import type { Answer } from '$lib/server/db/game-actions';
import { games } from '$lib/server/db/games';
import { moves } from '$lib/server/db/moves';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { accessTo, isJudge } from './access';
import { notify } from './notify';

const err = (status: number, message: string, extra: Record<string, unknown> = {}): Answer => ({ status, body: { error: { message }, ...extra } });

/** 404 unknown request, 403 not a judge of its game, 409 when someone took it first. */
export async function takeRequest(requestId: number, user: User): Promise<Answer> {
	const r = await rulingRequests.find(requestId);
	if (!r) return err(404, 'No such ruling request');
	const access = await accessTo(r.gameId, user);
	if (!access || !isJudge(access)) return err(403, 'Only a judge of this game\'s event, or a site judge, may take its requests');
	if (await rulingRequests.take(requestId, user.id)) return { status: 200, body: { request: await rulingRequests.find(requestId) } };
	const now = await rulingRequests.find(requestId);
	return err(409, now?.status === 'ruled' ? 'This request has been ruled already' : `${now?.takenBy?.name ?? 'Another judge'} has taken this request`, { request: now });
}

export async function rule(requestId: number, user: User, input: RulingInput): Promise<Answer> {
	const found = await rulingRequests.find(requestId);
	if (!found) return err(404, 'No such ruling request');
	const access = await accessTo(found.gameId, user);
	if (!access || !isJudge(access)) return err(403, 'Only a judge of this game\'s event, or a site judge, may rule');

	const result = await db.transaction(async (trx): Promise<Answer | { ok: true; seq: number; payload: RulingPayload }> => {
		const req = await rulingRequests.lock(requestId, trx);
		if (!req) return err(404, 'No such ruling request');
		if (req.status === 'ruled') return err(409, 'This request has been ruled already');
		if (req.takenBy && req.takenBy !== user.id) return err(409, `${found.takenBy?.name ?? 'Another judge'} has taken this request`);
		const game = await games.lock(req.gameId, trx);
		if (!game) return err(404, 'No such game');
		const log = (await moves.list(req.gameId, 0, trx)) as LogEntry[];
		const fold = foldLog(log, { layout: game.layout, profile: game.profile, firstSide: game.state.firstSide, catalogue: game.state.pieces });
		const before = stateBefore(fold, req.moveSeq);
		const entry = log.find((e) => e.seq === req.moveSeq);
		if (!before || !entry) return err(409, `The log has no entry #${req.moveSeq}`);
		const plan = planRuling({
			layout: game.layout,
			profile: game.profile,
			before,
			current: game.state,
			move: loggedMove(entry),
			moveSeq: req.moveSeq,
			outcome: input.outcome,
			positions: input.positions,
			allowIllegal: input.allowIllegal
		});
		if (!plan.ok) return err(plan.status, plan.message, plan.report ? { report: plan.report } : {});

		const payload: RulingPayload = {
			requestId,
			moveSeq: req.moveSeq,
			outcome: input.outcome,
			reason: input.reason,
			allowIllegal: plan.plan.allowsIllegal,
			ruled: plan.plan.ruled,
			changes: plan.plan.changes,
			settledPending: plan.plan.settledPending,
			judge: { id: user.id, name: user.displayName },
			signedAt: new Date().toISOString()
		};
		const seq = game.seq + 1;
		const state = applyRuling(game.state, payload);
		await moves.append(
			{ gameId: game.id, seq, kind: 'ruling', actor: user.id, side: null, round: game.state.round, payload: payload as unknown as Record<string, unknown>, report: plan.plan.report },
			trx
		);
		await games.saveState(game.id, state, seq, trx);
		await rulingRequests.markRuled(requestId, user.id, seq, trx);
		return { ok: true, seq, payload };
	});
	if (!('ok' in result)) return result;
	await notify.sendRuled(requestId, result.payload, result.seq);
	return { status: 201, body: { seq: result.seq, ruling: result.payload, request: await rulingRequests.find(requestId) } };
}
