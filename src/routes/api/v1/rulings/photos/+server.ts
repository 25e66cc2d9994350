// POST an evidence photo for a ruling request: the body is the image itself (optional
// X-File-Name). Sniffed from its bytes (PNG, JPEG, WebP) and size-limited by the storage module.
import { json } from '@sveltejs/kit';
import { guard, jsonError } from '$lib/server/http';
import { maxBytesFor, readBody } from '$lib/server/storage/files';
import { storeEvidence } from '$lib/server/judging/photos';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await readBody(request, maxBytesFor('unit-picture'));
	if (!body.ok) return jsonError(body.status, body.message);
	const stored = await storeEvidence(user, body.bytes, request.headers.get('x-file-name'));
	if (!stored.ok) return jsonError(stored.status, stored.message);
	const u = stored.upload;
	return json({ photo: { id: u.id, contentType: u.contentType, sizeBytes: u.sizeBytes } }, { status: 201, headers: { location: `/api/v1/rulings/photos/${u.id}` } });
};
