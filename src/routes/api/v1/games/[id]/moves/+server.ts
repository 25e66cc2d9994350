// A proposed move: the engine checks it again here (only this verdict counts). Legal → 201,
// appended and awaiting the opponent's acceptance; illegal → 422 with the findings, logged as refused.
import { proposeMoveSchema } from '$lib/schemas/game';
import { propose } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	change(event, proposeMoveSchema, (id, user, body) => gameActions.act(id, user, body.seq, (ctx) => propose(ctx, body), 201));
