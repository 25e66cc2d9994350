// POST { fileId, onlyGoodRows?, name?, force? }: a stored roster-import upload becomes a new
// roster. 400 lists every bad row with its line, and saves nothing unless onlyGoodRows is set.
import { json } from '@sveltejs/kit';
import { importRequestSchema } from '$lib/schemas/roster';
import { importUpload, rosterView } from '$lib/server/storage/rosters';
import { guard, jsonError, parseJson } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, importRequestSchema);
	if (!body.ok) return body.response;
	const outcome = await importUpload(user.id, body.data);
	if (!outcome.ok) {
		return jsonError(outcome.status, outcome.message, 'errors' in outcome ? { issues: outcome.errors } : undefined);
	}
	return json(
		{ roster: rosterView(outcome.roster), rows: outcome.result.rows, imported: outcome.result.goodRows, skipped: outcome.skipped },
		{ status: 201, headers: { location: `/api/v1/rosters/${outcome.roster.id}` } }
	);
};
