// A player picks the roster for their side; its units become pieces waiting to deploy.
import { chooseRosterSchema } from '$lib/schemas/game';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	change(event, chooseRosterSchema, (id, user, body) => gameActions.chooseRosterFor(id, user, body.seq, body.side, body.rosterId));
