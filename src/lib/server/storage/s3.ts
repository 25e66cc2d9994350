// The object store behind uploads: any S3-compatible service through the AWS SDK v3. Locally
// and in tests that is s3rver on loopback (scripts/fake-s3.ts); settings in .env.example.
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';

export class StorageError extends Error {
	constructor(message: string, options?: { cause?: unknown }) {
		super(message, options);
		this.name = 'StorageError';
	}
}

interface StoreConfig {
	client: S3Client;
	bucket: string;
}

let store: StoreConfig | undefined;

/** Built on first use, not at import: the build step loads this module without settings. */
function config(): StoreConfig {
	if (store) return store;
	const bucket = process.env.S3_BUCKET;
	const region = process.env.S3_REGION ?? 'us-east-1';
	if (!bucket) throw new StorageError('S3_BUCKET is not set: uploads need an S3-compatible store (see .env.example)');
	const accessKeyId = process.env.S3_ACCESS_KEY_ID;
	const secretAccessKey = process.env.S3_SECRET_ACCESS_KEY;
	const client = new S3Client({
		region,
		endpoint: process.env.S3_ENDPOINT || undefined,
		// Local fakes and most self-hosted stores address buckets by path, not by host name.
		forcePathStyle: (process.env.S3_FORCE_PATH_STYLE ?? 'false') === 'true',
		credentials: accessKeyId && secretAccessKey ? { accessKeyId, secretAccessKey } : undefined,
		// Recent SDKs add CRC checksums to every put; many S3-compatible stores reject or
		// mis-handle those headers. Checksums only where the API requires them.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED',
		maxAttempts: 2
	});
	store = { client, bucket };
	return store;
}

async function wrap<T>(what: string, run: () => Promise<T>): Promise<T> {
	try {
		return await run();
	} catch (e) {
		if (e instanceof StorageError) throw e;
		throw new StorageError(`The file store could not ${what}`, { cause: e });
	}
}

export async function putObject(key: string, bytes: Uint8Array, contentType: string): Promise<void> {
	const { client, bucket } = config();
	await wrap('store the file', () =>
		client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.length }))
	);
}

export async function getObject(key: string): Promise<Uint8Array> {
	const { client, bucket } = config();
	return wrap('read the file', async () => {
		const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
		if (!out.Body) throw new StorageError('The file store returned no content');
		return out.Body.transformToByteArray();
	});
}

export async function deleteObject(key: string): Promise<void> {
	const { client, bucket } = config();
	await wrap('delete the file', () => client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key })));
}
