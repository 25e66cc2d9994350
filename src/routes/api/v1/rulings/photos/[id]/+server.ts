// GET an evidence photo: its owner, and the players, judges and organisers of a game whose
// ruling request it belongs to.
import { guard, jsonError } from '$lib/server/http';
import { readEvidence } from '$lib/server/judging/photos';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const photo = await readEvidence(user, params.id);
	if (!photo.ok) return jsonError(photo.status, photo.message);
	return new Response(photo.bytes as Uint8Array<ArrayBuffer>, {
		headers: {
			'content-type': photo.contentType,
			'content-length': String(photo.bytes.length),
			'content-disposition': 'inline',
			'content-security-policy': "default-src 'none'; sandbox",
			'cache-control': 'private, no-store'
		}
	});
};
