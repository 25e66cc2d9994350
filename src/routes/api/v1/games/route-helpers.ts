// Shared steps of the game API routes: the game id from the URL, the answer as JSON, and the
// ladder every change climbs (401 signed out, 400 bad id or body, then the locked change).
import { json } from '@sveltejs/kit';
import type { User } from 'lucia';
import type { z } from 'zod';
import { gameIdSchema } from '$lib/schemas/game';
import { guard, jsonError, parseJson } from '$lib/server/http';
import { gameActions, type Answer } from '$lib/server/db/game-actions';

export const answer = (a: Answer): Response => json(a.body, { status: a.status });

export function gameId(params: { id?: string }): number | Response {
	const parsed = gameIdSchema.safeParse(params.id);
	return parsed.success ? parsed.data : jsonError(400, 'The game id must be a positive whole number');
}

/** The common frame of a change: who, which game, what body; then `run` does the work. */
export async function change<S extends z.ZodType>(
	event: { locals: App.Locals; params: { id?: string }; request: Request },
	schema: S,
	run: (id: number, user: User, body: z.infer<S>) => Promise<Answer>
): Promise<Response> {
	const user = guard(event.locals);
	if (user instanceof Response) return user;
	const id = gameId(event.params);
	if (id instanceof Response) return id;
	const body = await parseJson(event.request, schema);
	if (!body.ok) return body.response;
	return answer(await run(id, user, body.data));
}

/** 404 for an unknown game, 403 for a game the user does not play in. */
export async function notYours(id: number): Promise<Response> {
	return (await gameActions.exists(id)) ? jsonError(403, 'Only the players of this game may see it') : jsonError(404, 'No such game');
}
