// The mover takes back a move the opponent has not accepted: logged, positions restored.
import { seqOnlySchema } from '$lib/schemas/game';
import { takeBack } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) => change(event, seqOnlySchema, (id, user, body) => gameActions.act(id, user, body.seq, takeBack));
