// Uploaded files' records (the bytes are in the S3 store): find, add, list, remove.
import { use, type Db } from './index';

export const UPLOAD_PURPOSES = ['roster-import', 'unit-picture'] as const;
export type UploadPurpose = (typeof UPLOAD_PURPOSES)[number];

export interface Upload {
	id: string;
	ownerId: string;
	key: string;
	purpose: UploadPurpose;
	contentType: string;
	sizeBytes: number;
	sha256: string;
	fileName: string;
	createdAt: Date;
}

const COLUMNS = [
	'id',
	'owner_id as ownerId',
	'key',
	'purpose',
	'content_type as contentType',
	'size_bytes as sizeBytes',
	'sha256',
	'file_name as fileName',
	'created_at as createdAt'
];

async function find(id: string, trx?: Db): Promise<Upload | undefined> {
	return use(trx)('uploads').where({ id }).first(COLUMNS);
}

async function add(u: Omit<Upload, 'createdAt'>, trx?: Db): Promise<Upload> {
	const [row] = await use(trx)('uploads')
		.insert({
			id: u.id,
			owner_id: u.ownerId,
			key: u.key,
			purpose: u.purpose,
			content_type: u.contentType,
			size_bytes: u.sizeBytes,
			sha256: u.sha256,
			file_name: u.fileName
		})
		.returning(COLUMNS);
	return row as Upload;
}

async function listForOwner(ownerId: string, trx?: Db): Promise<Upload[]> {
	return use(trx)('uploads').where({ owner_id: ownerId }).orderBy('created_at', 'desc').select(COLUMNS);
}

async function remove(id: string, trx?: Db): Promise<boolean> {
	return (await use(trx)('uploads').where({ id }).delete()) > 0;
}

export const uploads = { find, add, listForOwner, remove };
