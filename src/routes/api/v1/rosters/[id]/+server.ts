// One roster, owner only: GET it, PUT a whole new version (schema-checked), DELETE it.
import { json } from '@sveltejs/kit';
import { rosterSchema } from '$lib/schemas/roster';
import { rosters } from '$lib/server/db/rosters';
import { ownRoster, rosterView } from '$lib/server/storage/rosters';
import { guard, jsonError, parseJson } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const own = await ownRoster(user.id, params.id);
	if (!own.ok) return jsonError(own.status, own.message);
	return json({ roster: rosterView(own.roster) });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const own = await ownRoster(user.id, params.id);
	if (!own.ok) return jsonError(own.status, own.message);
	const body = await parseJson(request, rosterSchema);
	if (!body.ok) return body.response;
	const updated = await rosters.update(own.roster.id, body.data);
	if (!updated) return jsonError(404, 'No such roster');
	return json({ roster: rosterView(updated) });
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const own = await ownRoster(user.id, params.id);
	if (!own.ok) return jsonError(own.status, own.message);
	await rosters.remove(own.roster.id);
	return new Response(null, { status: 204 });
};
