// GET one ruling request: its players, judges and organisers only.
import { json } from '@sveltejs/kit';
import { guard, jsonError } from '$lib/server/http';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { accessTo, maySee } from '$lib/server/judging/access';
import { requestId } from '../request-id';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = requestId(params.id);
	if (id instanceof Response) return id;
	const r = await rulingRequests.find(id);
	if (!r) return jsonError(404, 'No such ruling request');
	const access = await accessTo(r.gameId, user);
	if (!access || !maySee(access)) return jsonError(403, 'Only the players, judges and organisers of this game may see its requests');
	return json({ request: r });
};
