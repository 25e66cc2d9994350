// POST: a judge takes an open request (others then see it taken); 409 when it was taken first.
import { json } from '@sveltejs/kit';
import { guard } from '$lib/server/http';
import { takeRequest } from '$lib/server/judging/rule';
import { requestId } from '../../request-id';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = requestId(params.id);
	if (id instanceof Response) return id;
	const a = await takeRequest(id, user);
	return json(a.body, { status: a.status });
};
