// The opponent accepts the move awaiting acceptance.
import { seqOnlySchema } from '$lib/schemas/game';
import { accept } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) => change(event, seqOnlySchema, (id, user, body) => gameActions.act(id, user, body.seq, accept));
