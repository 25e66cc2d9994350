// The opponent asks a judge to rule on the move awaiting acceptance, with a note.
import { rulingRequestSchema } from '$lib/schemas/game';
import { requestRuling } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	change(event, rulingRequestSchema, (id, user, body) => gameActions.act(id, user, body.seq, (ctx) => requestRuling(ctx, body.note), 201));
