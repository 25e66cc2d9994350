// Joining a game with the token from an invitation e-mail: spends it and seats me on its side.
import { joinSchema } from '$lib/schemas/game';
import { guard, parseJson } from '$lib/server/http';
import { gameActions } from '$lib/server/db/game-actions';
import { answer } from '../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, joinSchema);
	if (!body.ok) return body.response;
	return answer(await gameActions.join(body.data.token, user));
};
