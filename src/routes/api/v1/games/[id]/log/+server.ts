// The move log of a game, in order; `?after=<seq>` gives only what came since (catching up).
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { guard, jsonError } from '$lib/server/http';
import { gameActions } from '$lib/server/db/game-actions';
import { moves } from '$lib/server/db/moves';
import { gameId, notYours } from '../../route-helpers';
import type { RequestHandler } from './$types';

const afterSchema = z.coerce.number().int().min(0).default(0);

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = gameId(params);
	if (id instanceof Response) return id;
	const after = afterSchema.safeParse(url.searchParams.get('after') ?? undefined);
	if (!after.success) return jsonError(400, '`after` must be a seq (a whole number, 0 or more)');
	const view = await gameActions.viewFor(id, user.id);
	if (!view) return notYours(id);
	return json({ seq: view.seq, entries: await moves.list(id, after.data) });
};
