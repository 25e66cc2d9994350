// Uploads end to end: size limit while reading, type sniffed from the bytes, an object key we
// make up, the bytes in the S3 store and the record in the database together or not at all,
// and reads and deletes only for the owner.
import { createHash, randomUUID } from 'node:crypto';
import { z } from 'zod';
import { db } from '$lib/server/db';
import { uploads, UPLOAD_PURPOSES, type Upload, type UploadPurpose } from '$lib/server/db/uploads';
import { deleteObject, getObject, putObject, StorageError } from './s3';
import { sniff } from './sniff';

export { UPLOAD_PURPOSES, type UploadPurpose, StorageError };

const MiB = 1024 * 1024;
/** UPLOAD_MAX_BYTES (default 5 MiB) caps every upload. */
export function uploadMaxBytes(): number {
	const v = Number(process.env.UPLOAD_MAX_BYTES);
	return Number.isInteger(v) && v > 0 ? v : 5 * MiB;
}
/**
 * A roster of 100 units with 64-point hulls is about 200 KiB of pretty JSON; anything much
 * bigger is not a roster. Kept under adapter-node's default 512 KiB body limit on purpose.
 */
export const ROSTER_IMPORT_MAX_BYTES = 384 * 1024;

export function maxBytesFor(purpose: UploadPurpose): number {
	return purpose === 'roster-import' ? Math.min(ROSTER_IMPORT_MAX_BYTES, uploadMaxBytes()) : uploadMaxBytes();
}

export type Refusal = { ok: false; status: 400 | 403 | 404 | 413 | 415 | 503; message: string };
const refuse = (status: Refusal['status'], message: string): Refusal => ({ ok: false, status, message });

export const tooLarge = (limit: number): Refusal =>
	refuse(413, `The file is larger than the ${Math.round((limit / 1024) * 10) / 10} KiB allowed`);

/**
 * The request body, read as a stream and abandoned as soon as it passes the limit, so a
 * huge body costs us at most `limit` bytes of memory. A Content-Length over it is refused first.
 */
export async function readBody(request: Request, limit: number): Promise<{ ok: true; bytes: Uint8Array<ArrayBuffer> } | Refusal> {
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > limit) return tooLarge(limit);
	if (!request.body) return { ok: true, bytes: new Uint8Array() };
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	try {
		for (;;) {
			const { done, value } = await reader.read();
			if (done) break;
			size += value.length;
			if (size > limit) {
				await reader.cancel().catch(() => {});
				return tooLarge(limit);
			}
			chunks.push(value);
		}
	} catch (e) {
		// adapter-node errors the stream itself when its BODY_SIZE_LIMIT is passed.
		if (e instanceof Error && /limit/i.test(e.message)) return tooLarge(limit);
		return refuse(400, 'The upload was interrupted');
	}
	const bytes = new Uint8Array(size);
	let at = 0;
	for (const c of chunks) {
		bytes.set(c, at);
		at += c.length;
	}
	return { ok: true, bytes };
}

/** A name to show the owner: no folders, no control characters, not too long. */
export function cleanFileName(name: string | null | undefined): string {
	const base = (name ?? '').split(/[\\/]/).pop() ?? '';
	return base.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, 120);
}

/** Key segments are ours: ids that are not plain tokens are hashed rather than escaped. */
const safeSegment = (id: string) => (/^[A-Za-z0-9_-]{1,64}$/.test(id) ? id : createHash('sha256').update(id).digest('hex'));
export const objectKey = (ownerId: string, uploadId: string) => `u/${safeSegment(ownerId)}/${uploadId}`;

export async function storeUpload(input: {
	ownerId: string;
	purpose: UploadPurpose;
	bytes: Uint8Array;
	fileName?: string | null;
}): Promise<{ ok: true; upload: Upload } | Refusal> {
	const limit = maxBytesFor(input.purpose);
	if (input.bytes.length > limit) return tooLarge(limit);
	const sniffed = await sniff(input.bytes, input.purpose);
	if (!sniffed.ok) return refuse(input.bytes.length === 0 ? 400 : 415, sniffed.message);

	const id = randomUUID();
	const key = objectKey(input.ownerId, id);
	try {
		// The row is written in a transaction that commits only once the bytes are stored:
		// a failed put leaves no record pointing at nothing.
		const upload = await db.transaction(async (trx) => {
			const row = await uploads.add(
				{
					id,
					ownerId: input.ownerId,
					key,
					purpose: input.purpose,
					contentType: sniffed.contentType,
					sizeBytes: input.bytes.length,
					sha256: createHash('sha256').update(input.bytes).digest('hex'),
					fileName: cleanFileName(input.fileName)
				},
				trx
			);
			await putObject(key, input.bytes, sniffed.contentType);
			return row;
		});
		return { ok: true, upload };
	} catch (e) {
		if (e instanceof StorageError) {
			console.error(e, e.cause);
			return refuse(503, 'The file store is not available just now; try again in a minute');
		}
		throw e;
	}
}

const uploadId = z.uuid();

/** The record, if this user may see it: the owner only (judges will read evidence photos). */
export async function findOwnUpload(userId: string, id: string): Promise<{ ok: true; upload: Upload } | Refusal> {
	if (!uploadId.safeParse(id).success) return refuse(404, 'No such file');
	const upload = await uploads.find(id);
	if (!upload) return refuse(404, 'No such file');
	if (upload.ownerId !== userId) return refuse(403, 'This file belongs to someone else');
	return { ok: true, upload };
}

export async function readOwnUpload(userId: string, id: string): Promise<{ ok: true; upload: Upload; bytes: Uint8Array } | Refusal> {
	const found = await findOwnUpload(userId, id);
	if (!found.ok) return found;
	try {
		return { ok: true, upload: found.upload, bytes: await getObject(found.upload.key) };
	} catch (e) {
		if (e instanceof StorageError) {
			console.error(e, e.cause);
			return refuse(503, 'The file store is not available just now; try again in a minute');
		}
		throw e;
	}
}

export async function deleteOwnUpload(userId: string, id: string): Promise<{ ok: true } | Refusal> {
	const found = await findOwnUpload(userId, id);
	if (!found.ok) return found;
	try {
		// Record first, inside a transaction that commits only after the bytes are gone.
		await db.transaction(async (trx) => {
			await uploads.remove(found.upload.id, trx);
			await deleteObject(found.upload.key);
		});
		return { ok: true };
	} catch (e) {
		if (e instanceof StorageError) {
			console.error(e, e.cause);
			return refuse(503, 'The file store is not available just now; try again in a minute');
		}
		throw e;
	}
}

/** What the API shows of an upload (the object key stays inside). */
export function uploadView(u: Upload) {
	return { id: u.id, purpose: u.purpose, contentType: u.contentType, sizeBytes: u.sizeBytes, sha256: u.sha256, fileName: u.fileName, createdAt: u.createdAt };
}
