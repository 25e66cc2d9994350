// Evidence photos for ruling requests, through the roster issue's storage: the bytes are read
// under the upload size limit and sniffed (PNG, JPEG or WebP only, whatever the sender claims),
// stored in the S3 store with a record in uploads. Who may look at one: its owner, and whoever
// may see a game whose request it is attached to (players, its judges, its organisers).
import type { User } from 'lucia';
import { uploads } from '$lib/server/db/uploads';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { storeUpload, type Refusal } from '$lib/server/storage/files';
import { getObject, StorageError } from '$lib/server/storage/s3';
import { accessTo, maySee } from './access';

/**
 * The storage module knows two purposes; a picture's ('unit-picture') is the one that sniffs
 * for images with the picture size limit, which is what evidence needs. A purpose of its own
 * ('ruling-photo') belongs in uploads.ts and the uploads check constraint (asked of its owner).
 */
const EVIDENCE_PURPOSE = 'unit-picture' as const;

export async function storeEvidence(user: User, bytes: Uint8Array, fileName: string | null) {
	return storeUpload({ ownerId: user.id, purpose: EVIDENCE_PURPOSE, bytes, fileName });
}

export async function readEvidence(user: User, uploadId: string): Promise<{ ok: true; contentType: string; bytes: Uint8Array } | Refusal> {
	if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(uploadId)) return { ok: false, status: 404, message: 'No such photo' };
	const u = await uploads.find(uploadId);
	if (!u || !u.contentType.startsWith('image/')) return { ok: false, status: 404, message: 'No such photo' };
	let allowed = u.ownerId === user.id;
	if (!allowed) {
		for (const { gameId } of await rulingRequests.photoRequests(uploadId)) {
			const a = await accessTo(gameId, user);
			if (a && maySee(a)) {
				allowed = true;
				break;
			}
		}
	}
	if (!allowed) return { ok: false, status: 403, message: 'This photo belongs to a game you may not see' };
	try {
		return { ok: true, contentType: u.contentType, bytes: await getObject(u.key) };
	} catch (e) {
		if (e instanceof StorageError) return { ok: false, status: 503, message: 'The file store is not available just now; try again in a minute' };
		throw e;
	}
}
