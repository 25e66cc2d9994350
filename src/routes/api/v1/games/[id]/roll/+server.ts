// The die for a dash, rolled here on the server and logged before any piece moves (201).
import { rollSchema } from '$lib/schemas/game';
import { roll } from '$lib/board/play/rules';
import { dice } from '$lib/server/dice';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	change(event, rollSchema, (id, user, body) => gameActions.act(id, user, body.seq, (ctx) => roll(ctx, body.unit, dice.rollD6()), 201));
