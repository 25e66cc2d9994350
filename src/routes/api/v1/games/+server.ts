// Games: list the ones I play in (GET), set up a new one (POST createGameSchema → 201 {id}).
import { json } from '@sveltejs/kit';
import { createGameSchema } from '$lib/schemas/game';
import { guard, parseJson } from '$lib/server/http';
import { games } from '$lib/server/db/games';
import { gameActions } from '$lib/server/db/game-actions';
import { savedLayout } from './saved-layout';
import { answer } from './route-helpers';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	return json({ games: await games.listForUser(user.id) });
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, createGameSchema);
	if (!body.ok) return body.response;
	return answer(await gameActions.createGame(body.data, user, savedLayout));
};
