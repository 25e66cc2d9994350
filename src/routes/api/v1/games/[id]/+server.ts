// One game as its players see it: layout snapshot, profile, state (positions, round, turn,
// active side, the move awaiting acceptance) and the seq to send back with the next change.
import { json } from '@sveltejs/kit';
import { guard } from '$lib/server/http';
import { gameActions } from '$lib/server/db/game-actions';
import { gameId, notYours } from '../route-helpers';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = gameId(params);
	if (id instanceof Response) return id;
	const view = await gameActions.viewFor(id, user.id);
	if (!view) return notYours(id);
	return json({ game: view });
};
