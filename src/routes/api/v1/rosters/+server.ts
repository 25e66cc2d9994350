// GET my rosters (summaries); POST a new roster, checked against the shared roster schema.
import { json } from '@sveltejs/kit';
import { rosterSchema } from '$lib/schemas/roster';
import { rosters } from '$lib/server/db/rosters';
import { rosterView } from '$lib/server/storage/rosters';
import { guard, parseJson } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	return json({ rosters: await rosters.listForOwner(user.id) });
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, rosterSchema);
	if (!body.ok) return body.response;
	const roster = await rosters.add(user.id, body.data);
	return json({ roster: rosterView(roster) }, { status: 201, headers: { location: `/api/v1/rosters/${roster.id}` } });
};
