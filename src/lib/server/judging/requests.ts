// Opening a ruling request: a player of the game points at any entry of its move log, says what
// the judge should look at and may add photos. It is one change of the game (the table's `act`:
// row locked, seq checked) that appends a 'ruling-request' entry; the database writes the
// request row and its photo links from that entry in the same transaction. Play goes on.
import type { User } from 'lucia';
import type { OpenRequest } from '$lib/schemas/ruling';
import { otherSide, type Side } from '$lib/schemas/game';
import { requestRuling, type StepResult } from '$lib/board/play/rules';
import { gameActions, type Answer } from '$lib/server/db/game-actions';
import { moves } from '$lib/server/db/moves';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { uploads } from '$lib/server/db/uploads';
import type { Db } from '$lib/server/db';
import { notify } from './notify';

const refuse = (status: 400 | 403 | 409, message: string, issues?: unknown[]): StepResult => ({ ok: false, status, message, issues });

export async function openRequest(user: User, input: OpenRequest): Promise<Answer> {
	const answer = await gameActions.act(
		input.gameId,
		user,
		input.seq,
		async (ctx, trx: Db): Promise<StepResult> => {
			if (input.moveSeq >= ctx.nextSeq) return refuse(400, `The log has no entry #${input.moveSeq} yet`, [{ path: ['moveSeq'], message: 'no such entry' }]);
			const [entry] = (await moves.list(input.gameId, input.moveSeq - 1, trx)).filter((e) => e.seq === input.moveSeq);
			if (!entry) return refuse(400, `The log has no entry #${input.moveSeq}`, [{ path: ['moveSeq'], message: 'no such entry' }]);
			if (entry.kind === 'ruling-request') return refuse(400, 'Ask about the entry itself, not about another request', [{ path: ['moveSeq'], message: 'a request' }]);
			const open = (await rulingRequests.forGame(input.gameId, trx)).find((r) => r.moveSeq === input.moveSeq && r.status !== 'ruled');
			if (open) return refuse(409, `Entry #${input.moveSeq} has a request waiting already (#${open.id}, ${open.status})`);
			for (const [i, id] of input.photos.entries()) {
				const u = await uploads.find(id, trx);
				// Only the asker's own uploads, and only what was sniffed as a picture.
				if (!u || u.ownerId !== user.id) return refuse(400, 'A photo must be one you uploaded', [{ path: ['photos', String(i)], message: 'not your upload' }]);
				if (!u.contentType.startsWith('image/')) return refuse(400, 'A photo must be a PNG, JPEG or WebP image', [{ path: ['photos', String(i)], message: 'not a picture' }]);
			}
			const extra = { moveSeq: input.moveSeq, note: input.note, photos: input.photos, kind: entry.kind, unit: typeof entry.payload.unit === 'string' ? entry.payload.unit : null };
			const pending = ctx.state.pending;
			// The opponent disputing the move awaiting acceptance: the table's own step, so the
			// move stands (and can no longer be taken back) exactly as when asked from the board.
			if (pending && pending.seq === input.moveSeq && ctx.actorSides.includes(otherSide(pending.side))) {
				const r = requestRuling(ctx, input.note);
				if (!r.ok) return r;
				return { ...r, entries: r.entries.map((e) => ({ ...e, payload: { ...e.payload, ...extra } })) };
			}
			const next = structuredClone(ctx.state);
			if (pending && pending.seq === input.moveSeq) next.pending = null;
			const side: Side = pending && ctx.actorSides.includes(otherSide(pending.side)) ? otherSide(pending.side) : ctx.actorSides[0];
			return { ok: true, state: next, entries: [{ kind: 'ruling-request', side, payload: extra }] };
		},
		201
	);
	if (answer.status !== 201) return answer;
	const body = answer.body as { seq: number; game: unknown };
	const request = await rulingRequests.findBySeq(input.gameId, body.seq);
	// Mail goes after the commit; the request is on record whether or not it gets through.
	await notify.sendOpened().catch((e) => console.error('ruling request mail', e));
	return { status: 201, body: { request, seq: body.seq, game: body.game } };
}
