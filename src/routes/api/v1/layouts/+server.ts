// Saved layouts as JSON: GET lists every layout (any signed-in user may reuse one), POST saves
// a new one — a whole document, or { copyOf } to reuse someone's layout as one's own.
import { json } from '@sveltejs/kit';
import { createLayoutSchema } from '$lib/schemas/layout';
import { guard, jsonError, parseJson } from '$lib/server/http';
import { layouts } from '$lib/server/db/layouts';
import { copyName } from '$lib/board/editor/names';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	return json({ layouts: await layouts.list(user.id) });
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, createLayoutSchema);
	if (!body.ok) return body.response;

	if (body.data.doc) return json({ layout: await layouts.add(user.id, body.data.doc) }, { status: 201 });

	const source = await layouts.find(body.data.copyOf!);
	if (!source) return jsonError(404, 'There is no saved layout with that id');
	const doc = { ...source.doc, name: body.data.name ?? copyName(source.doc.name) };
	return json({ layout: await layouts.add(user.id, doc) }, { status: 201 });
};
