// The active side ends its turn (or its deployment); after both sides the round advances.
import { seqOnlySchema } from '$lib/schemas/game';
import { endTurn } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) => change(event, seqOnlySchema, (id, user, body) => gameActions.act(id, user, body.seq, endTurn));
