// One upload, owner only: GET its bytes (with the sniffed type), DELETE it.
import { deleteOwnUpload, readOwnUpload } from '$lib/server/storage/files';
import { guard, jsonError } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const file = await readOwnUpload(user.id, params.id);
	if (!file.ok) return jsonError(file.status, file.message);
	const picture = file.upload.contentType.startsWith('image/');
	const name = file.upload.fileName.replace(/[^A-Za-z0-9._-]+/g, '_') || file.upload.id;
	return new Response(file.bytes as Uint8Array<ArrayBuffer>, {
		headers: {
			'content-type': file.upload.contentType,
			'content-length': String(file.bytes.length),
			// Pictures may show in an <img>; anything else downloads. Neither may run as a page.
			'content-disposition': `${picture ? 'inline' : 'attachment'}; filename="${name}"`,
			'content-security-policy': "default-src 'none'; sandbox",
			'cache-control': 'private, no-store'
		}
	});
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const done = await deleteOwnUpload(user.id, params.id);
	if (!done.ok) return jsonError(done.status, done.message);
	return new Response(null, { status: 204 });
};
