// One saved layout: GET (any signed-in user, to view or reuse), PUT and DELETE (the owner only).
// PUT names the version it was edited from; a stale one gets 409 with the current layout.
import { json } from '@sveltejs/kit';
import { layoutIdSchema, updateLayoutSchema } from '$lib/schemas/layout';
import { guard, jsonError, parseJson } from '$lib/server/http';
import { layouts } from '$lib/server/db/layouts';
import type { RequestHandler } from './$types';

const NOT_YOURS = 'Only the layout’s owner may change it; save a copy to make your own';

function parseId(raw: string): number | Response {
	const id = layoutIdSchema.safeParse(raw);
	return id.success ? id.data : jsonError(400, 'The layout id must be a positive whole number');
}

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = parseId(params.id);
	if (id instanceof Response) return id;
	const layout = await layouts.find(id);
	if (!layout) return jsonError(404, 'There is no saved layout with that id');
	return json({ layout });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = parseId(params.id);
	if (id instanceof Response) return id;
	const existing = await layouts.find(id);
	if (!existing) return jsonError(404, 'There is no saved layout with that id');
	if (existing.ownerId !== user.id) return jsonError(403, NOT_YOURS);
	const body = await parseJson(request, updateLayoutSchema);
	if (!body.ok) return body.response;

	const result = await layouts.update(id, body.data.doc, body.data.version);
	if (result.kind === 'missing') return jsonError(404, 'There is no saved layout with that id');
	if (result.kind === 'stale') {
		return json(
			{
				error: {
					message: `The layout was saved elsewhere since you opened it (your version ${body.data.version}, now ${result.current.version}); reload it or save a copy`
				},
				current: result.current
			},
			{ status: 409 }
		);
	}
	return json({ layout: result.layout });
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = parseId(params.id);
	if (id instanceof Response) return id;
	const existing = await layouts.find(id);
	if (!existing) return jsonError(404, 'There is no saved layout with that id');
	if (existing.ownerId !== user.id) return jsonError(403, NOT_YOURS);
	await layouts.remove(id);
	return new Response(null, { status: 204 });
};
