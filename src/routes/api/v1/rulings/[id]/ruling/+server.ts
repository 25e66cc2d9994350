// POST a judge's ruling on a request: uphold, overturn or adjust (with the corrected end
// positions); appended to the game's move log. 422 with the engine's report when an adjusted
// move is illegal and the judge has not allowed it.
import { json } from '@sveltejs/kit';
import { rulingSchema } from '$lib/schemas/ruling';
import { guard, parseJson } from '$lib/server/http';
import { rule } from '$lib/server/judging/rule';
import { requestId } from '../../request-id';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = requestId(params.id);
	if (id instanceof Response) return id;
	const body = await parseJson(request, rulingSchema);
	if (!body.ok) return body.response;
	const a = await rule(id, user, body.data);
	return json(a.body, { status: a.status });
};
