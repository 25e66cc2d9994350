// GET my uploads; POST one. The body is the file itself (?purpose=roster-import|unit-picture,
// optional X-File-Name), or a multipart form with "file" and "purpose" fields.
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { uploads } from '$lib/server/db/uploads';
import { maxBytesFor, readBody, storeUpload, tooLarge, uploadView, UPLOAD_PURPOSES } from '$lib/server/storage/files';
import { guard, jsonError } from '$lib/server/http';
import type { RequestHandler } from './$types';

// A refusal sent before the body is read leaves the rest of it on the socket: close the
// connection so that no client reuses it for its next request.
const refuse = (status: number, message: string) =>
	jsonError(status, message, status === 413 ? { headers: { connection: 'close' } } : undefined);

const purposeSchema = z.enum(UPLOAD_PURPOSES, { error: `purpose must be one of ${UPLOAD_PURPOSES.join(', ')}` });

export const GET: RequestHandler = async ({ locals }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	return json({ files: (await uploads.listForOwner(user.id)).map(uploadView) });
};

export const POST: RequestHandler = async ({ locals, request, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;

	const multipart = (request.headers.get('content-type') ?? '').startsWith('multipart/form-data');
	let purposeRaw: unknown = url.searchParams.get('purpose');
	let bytes: Uint8Array;
	let fileName: string | null = request.headers.get('x-file-name');

	if (multipart) {
		// The largest limit of any purpose bounds the form; the purpose's own limit follows.
		const form = await readBody(request, Math.max(...UPLOAD_PURPOSES.map(maxBytesFor)) + 64 * 1024);
		if (!form.ok) return refuse(form.status, form.message);
		let data: FormData;
		try {
			data = await new Request(url, { method: 'POST', headers: request.headers, body: form.bytes }).formData();
		} catch {
			return jsonError(400, 'The form could not be read');
		}
		const file = data.get('file');
		if (!(file instanceof File)) return jsonError(400, 'The form needs a "file" field with the file');
		purposeRaw = data.get('purpose') ?? purposeRaw;
		fileName = file.name;
		const purpose = purposeSchema.safeParse(purposeRaw);
		if (!purpose.success) return jsonError(400, purpose.error.issues[0].message, { issues: [{ path: ['purpose'], message: purpose.error.issues[0].message }] });
		if (file.size > maxBytesFor(purpose.data)) return refuse(413, tooLarge(maxBytesFor(purpose.data)).message);
		bytes = new Uint8Array(await file.arrayBuffer());
	} else {
		const purpose = purposeSchema.safeParse(purposeRaw);
		if (!purpose.success) {
			// Read (a bounded amount of) the body first: answering mid-upload resets the connection.
			await readBody(request, maxBytesFor('roster-import'));
			return jsonError(400, purpose.error.issues[0].message, { issues: [{ path: ['purpose'], message: purpose.error.issues[0].message }] });
		}
		const body = await readBody(request, maxBytesFor(purpose.data));
		if (!body.ok) return refuse(body.status, body.message);
		bytes = body.bytes;
	}

	const purpose = purposeSchema.parse(purposeRaw);
	const stored = await storeUpload({ ownerId: user.id, purpose, bytes, fileName });
	if (!stored.ok) return jsonError(stored.status, stored.message);
	return json({ file: uploadView(stored.upload) }, { status: 201, headers: { location: `/api/v1/files/${stored.upload.id}` } });
};
