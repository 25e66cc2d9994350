// A local S3-compatible store (s3rver) on loopback for uploads in development and tests.
import S3rver from 's3rver';
import { mkdirSync } from 'node:fs';

const endpoint = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4569');
const directory = process.env.FAKE_S3_DIR ?? '.data/s3';
const bucket = process.env.S3_BUCKET ?? 'inchwarden';
mkdirSync(directory, { recursive: true });

const server = new S3rver({
	address: '127.0.0.1',
	port: Number(endpoint.port),
	directory,
	silent: true,
	configureBuckets: [{ name: bucket, configs: [] }]
});

await server.run();
console.log(`fake S3 on ${endpoint.origin}, bucket ${bucket}, files in ${directory}`);

async function stop() {
	// Kept-alive connections from the app can hold close() open: exit after a second anyway.
	setTimeout(() => process.exit(0), 1000).unref();
	await server.close();
	process.exit(0);
}
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
