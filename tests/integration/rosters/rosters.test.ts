// Rosters and uploads over real HTTP against the built app, its PostgreSQL and the S3 fake:
// the upload round trip (bytes really in the store, under our own key), imports with per-line
// problems, export → import, owner-only access (401/403/404), 400/413/415 refusals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { GetObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { BASE, Client, closeTestDb, freshEmail, testDb } from '../helpers';
import { parseRosterFile } from '../../../src/lib/rosters/parse';

afterAll(closeTestDb);

const PASSWORD = 'long enough password';
const EXAMPLE_CSV = readFileSync('docs/roster-example.csv');
const EXAMPLE_JSON = readFileSync('docs/roster-example.json');
// A 1×1 PNG: the 8-byte signature and an IHDR chunk are what file-type reads.
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d6a4a50000000049454e44ae426082', 'hex');
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

async function player(tag: string): Promise<{ client: Client; id: string }> {
	const email = freshEmail(tag);
	const client = new Client();
	const res = await client.signUp(email, PASSWORD, `Roster ${tag}`);
	expect(res.status).toBe(303);
	if (!client.session()) await client.signIn(email, PASSWORD);
	expect(client.session()).toBeTruthy();
	const row = await testDb()('users').whereRaw('lower(email) = ?', [email.toLowerCase()]).first('id');
	return { client, id: row.id };
}

/** A request with the client's session cookie and a body of raw bytes. */
async function raw(c: Client, method: string, path: string, body?: Uint8Array | string, headers: Record<string, string> = {}): Promise<Response> {
	const cookie = [...c.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
	return fetch(BASE + path, { method, redirect: 'manual', body: body as BodyInit | undefined, headers: { origin: BASE, cookie, 'x-forwarded-for': c.address, ...headers } });
}
const upload = (c: Client, bytes: Uint8Array | string, purpose = 'roster-import', headers: Record<string, string> = {}) =>
	raw(c, 'POST', `/api/v1/files?purpose=${purpose}`, bytes, { 'content-type': 'application/octet-stream', ...headers });
const postJson = (c: Client, path: string, body: unknown, method = 'POST') =>
	raw(c, method, path, JSON.stringify(body), { 'content-type': 'application/json' });

const s3 = new S3Client({
	region: process.env.S3_REGION ?? 'us-east-1',
	endpoint: process.env.S3_ENDPOINT,
	forcePathStyle: true,
	credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER' },
	requestChecksumCalculation: 'WHEN_REQUIRED',
	responseChecksumValidation: 'WHEN_REQUIRED'
});
async function objectBytes(key: string): Promise<Uint8Array | null> {
	try {
		const out = await s3.send(new GetObjectCommand({ Bucket: process.env.S3_BUCKET, Key: key }));
		return await out.Body!.transformToByteArray();
	} catch (e) {
		if ((e as { name?: string }).name === 'NoSuchKey') return null;
		throw e;
	}
}

let ada: { client: Client; id: string };
let bo: { client: Client; id: string };
beforeAll(async () => {
	ada = await player('ada-rosters');
	bo = await player('bo-rosters');
});

describe('signed out', () => {
	it('every roster and file route answers 401', async () => {
		const anon = new Client();
		for (const [method, path] of [
			['GET', '/api/v1/rosters'],
			['POST', '/api/v1/rosters'],
			['GET', '/api/v1/rosters/1'],
			['GET', '/api/v1/rosters/1/export?format=csv'],
			['POST', '/api/v1/rosters/import'],
			['GET', '/api/v1/rosters/template'],
			['GET', '/api/v1/files'],
			['POST', '/api/v1/files?purpose=roster-import'],
			['GET', '/api/v1/files/00000000-0000-4000-8000-000000000000']
		]) {
			const res = await raw(anon, method, path, method === 'POST' ? '{}' : undefined, { 'content-type': 'application/json' });
			expect([method, path, res.status]).toEqual([method, path, 401]);
		}
		const page = await anon.get('/rosters');
		expect(page.status).toBe(303);
		expect(page.headers.get('location')).toBe('/sign-in?next=%2Frosters');
	});
});

describe('uploads through the S3 fake', () => {
	it('stores the bytes under u/<owner>/<id>, sniffs the type, and gives the same bytes back', async () => {
		// The sender claims a misleading name and type; neither is trusted or used for the key.
		const res = await upload(ada.client, EXAMPLE_CSV, 'roster-import', { 'x-file-name': '../../evil name.exe' });
		expect(res.status).toBe(201);
		const { file } = await res.json();
		expect(file).toMatchObject({ purpose: 'roster-import', contentType: 'text/csv; charset=utf-8', sizeBytes: EXAMPLE_CSV.length, sha256: sha256(EXAMPLE_CSV), fileName: 'evil name.exe' });

		const row = await testDb()('uploads').where({ id: file.id }).first();
		expect(row.owner_id).toBe(ada.id);
		expect(row.key).toBe(`u/${ada.id}/${file.id}`);
		// In the store itself, byte for byte.
		expect(sha256((await objectBytes(row.key))!)).toBe(sha256(EXAMPLE_CSV));

		const back = await raw(ada.client, 'GET', `/api/v1/files/${file.id}`);
		expect(back.status).toBe(200);
		expect(back.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(back.headers.get('content-disposition')).toMatch(/^attachment;/);
		expect(Buffer.from(await back.arrayBuffer()).equals(EXAMPLE_CSV)).toBe(true);

		const list = await (await raw(ada.client, 'GET', '/api/v1/files')).json();
		expect(list.files.map((f: { id: string }) => f.id)).toContain(file.id);
		expect(JSON.stringify(list)).not.toContain(row.key);
	});

	it('a multipart upload of a picture is sniffed as PNG whatever its name says', async () => {
		const form = new FormData();
		form.set('purpose', 'unit-picture');
		form.set('file', new File([PNG], 'roster.csv', { type: 'text/csv' }));
		const cookie = [...ada.client.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
		const res = await fetch(`${BASE}/api/v1/files`, { method: 'POST', body: form, headers: { origin: BASE, cookie } });
		expect(res.status).toBe(201);
		const { file } = await res.json();
		expect(file).toMatchObject({ purpose: 'unit-picture', contentType: 'image/png', sizeBytes: PNG.length });
		const back = await raw(ada.client, 'GET', `/api/v1/files/${file.id}`);
		expect(back.headers.get('content-type')).toBe('image/png');
		expect(Buffer.from(await back.arrayBuffer()).equals(PNG)).toBe(true);
	});

	it('refuses the wrong type with 415: a PNG as a roster, text as a picture, UTF-16 text', async () => {
		const png = await upload(ada.client, PNG, 'roster-import');
		expect(png.status).toBe(415);
		expect((await png.json()).error.message).toBe('A roster file must be CSV or JSON text; this file is PNG (image/png)');
		const text = await upload(ada.client, EXAMPLE_CSV, 'unit-picture');
		expect(text.status).toBe(415);
		expect((await text.json()).error.message).toMatch(/^A unit picture must be a PNG, JPEG or WebP image/);
		const utf16 = await upload(ada.client, Buffer.from('\uFEFFname,class\n', 'utf16le'), 'roster-import');
		expect(utf16.status).toBe(415);
	});

	it('refuses a roster file over the import limit with 413, and stores nothing', async () => {
		const before = await testDb()('uploads').where({ owner_id: ada.id }).count<{ count: number }[]>({ count: '*' });
		const big = 'name,class,allowance_in,shape,pieces,points\n' + 'x,foot,6,round,1,1\n'.repeat(21000); // ≈ 400 KiB
		const res = await upload(ada.client, big);
		expect(res.status).toBe(413);
		expect((await res.json()).error.message).toMatch(/larger than the 384 KiB allowed/);
		const after = await testDb()('uploads').where({ owner_id: ada.id }).count<{ count: number }[]>({ count: '*' });
		expect(Number(after[0].count)).toBe(Number(before[0].count));
	});

	it('refuses an unknown purpose or an empty body with 400', async () => {
		expect((await upload(ada.client, EXAMPLE_CSV, 'evidence-of-aliens')).status).toBe(400);
		expect((await upload(ada.client, new Uint8Array(), 'roster-import')).status).toBe(400);
	});

	it('deleting a file removes the record and the object', async () => {
		const { file } = await (await upload(ada.client, EXAMPLE_JSON)).json();
		expect(file.contentType).toBe('application/json');
		const key = `u/${ada.id}/${file.id}`;
		expect(await objectBytes(key)).not.toBeNull();
		expect((await raw(ada.client, 'DELETE', `/api/v1/files/${file.id}`)).status).toBe(204);
		expect(await objectBytes(key)).toBeNull();
		expect((await raw(ada.client, 'GET', `/api/v1/files/${file.id}`)).status).toBe(404);
	});
});

describe('imports', () => {
	it('imports the example CSV as a roster with the file\'s name, force and units', async () => {
		const { file } = await (await upload(ada.client, EXAMPLE_CSV)).json();
		const res = await postJson(ada.client, '/api/v1/rosters/import', { fileId: file.id });
		expect(res.status).toBe(201);
		const body = await res.json();
		const expected = parseRosterFile(EXAMPLE_CSV);
		expect(body.roster).toMatchObject({ name: 'Saltmarsh patrol', force: 'The Saltmarsh Wardens', sourceUploadId: file.id });
		expect(body.roster.units).toEqual(expected.units);
		expect([body.rows, body.imported, body.skipped]).toEqual([6, 6, []]);
	});

	it('lists every bad row with its line and saves nothing, unless only the good rows are asked for', async () => {
		const bad = [
			'name,joins,class,flies,allowance_in,shape,diameter_mm,length_mm,width_mm,hull_in,pieces,value,ring_radius_in,ring_label,points',
			'Good one,,foot,no,6,round,32,,,,5,1,,,50',
			'Wrong class,,wizard,no,6,round,32,,,,5,1,,,50',
			'Backwards,,foot,no,-3,round,32,,,,5,1,,,50',
			'Good two,,beast,no,8,oval,,60,35,,3,1,,,60'
		].join('\n');
		const { file } = await (await upload(ada.client, bad)).json();
		const count = async () => Number((await testDb()('rosters').where({ owner_id: ada.id }).count<{ count: number }[]>({ count: '*' }))[0].count);
		const before = await count();

		const refused = await postJson(ada.client, '/api/v1/rosters/import', { fileId: file.id, name: 'Partial' });
		expect(refused.status).toBe(400);
		const { error } = await refused.json();
		expect(error.message).toBe('2 rows of 4 have problems: nothing was saved');
		expect(error.issues.map((i: { line: number; field: string }) => [i.line, i.field])).toEqual([
			[3, 'class'],
			[4, 'allowance_in']
		]);
		expect(await count()).toBe(before);

		const partial = await postJson(ada.client, '/api/v1/rosters/import', { fileId: file.id, name: 'Partial', onlyGoodRows: true });
		expect(partial.status).toBe(201);
		const body = await partial.json();
		expect(body.roster.name).toBe('Partial');
		expect(body.roster.units.map((u: { name: string }) => u.name)).toEqual(['Good one', 'Good two']);
		expect(body.skipped).toHaveLength(2);
		expect(await count()).toBe(before + 1);
	});

	it('export → upload → import over HTTP gives the same roster, in CSV and JSON', async () => {
		const created = await postJson(ada.client, '/api/v1/rosters', JSON.parse(EXAMPLE_JSON.toString()));
		expect(created.status).toBe(201);
		const original = (await created.json()).roster;
		for (const format of ['csv', 'json']) {
			const exported = await raw(ada.client, 'GET', `/api/v1/rosters/${original.id}/export?format=${format}`);
			expect(exported.status).toBe(200);
			expect(exported.headers.get('content-disposition')).toBe(`attachment; filename="saltmarsh-patrol.${format}"`);
			const bytes = new Uint8Array(await exported.arrayBuffer());
			const { file } = await (await upload(ada.client, bytes)).json();
			const again = await (await postJson(ada.client, '/api/v1/rosters/import', { fileId: file.id })).json();
			expect([format, again.roster.name, again.roster.force, again.roster.units]).toEqual([format, original.name, original.force, original.units]);
		}
	});

	it('a file that is not a roster is refused with its line; a picture cannot be imported', async () => {
		const { file } = await (await upload(ada.client, 'Dear organiser,\nhere is my list.\n')).json();
		const res = await postJson(ada.client, '/api/v1/rosters/import', { fileId: file.id });
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/^Line 1: This is not a roster CSV/);
		const form = new FormData();
		form.set('purpose', 'unit-picture');
		form.set('file', new File([PNG], 'x.png'));
		const cookie = [...ada.client.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
		const pic = (await (await fetch(`${BASE}/api/v1/files`, { method: 'POST', body: form, headers: { origin: BASE, cookie } })).json()).file;
		expect((await postJson(ada.client, '/api/v1/rosters/import', { fileId: pic.id })).status).toBe(400);
	});

	it('the templates download and import cleanly', async () => {
		for (const format of ['csv', 'json']) {
			const t = await raw(ada.client, 'GET', `/api/v1/rosters/template?format=${format}`);
			expect(t.status).toBe(200);
			const parsed = parseRosterFile(new Uint8Array(await t.arrayBuffer()));
			expect(parsed.errors).toEqual([]);
			expect(parsed.units.length).toBe(3);
		}
		expect((await raw(ada.client, 'GET', '/api/v1/rosters/template?format=xlsx')).status).toBe(400);
	});
});

describe('owner only', () => {
	let rosterId: number;
	let fileId: string;
	beforeAll(async () => {
		rosterId = (await (await postJson(ada.client, '/api/v1/rosters', { name: 'Ada private', force: 'F', units: [] })).json()).roster.id;
		fileId = (await (await upload(ada.client, EXAMPLE_CSV)).json()).file.id;
	});

	it("another player gets 403 on every route to someone else's roster, and nothing changes", async () => {
		expect((await raw(bo.client, 'GET', `/api/v1/rosters/${rosterId}`)).status).toBe(403);
		expect((await postJson(bo.client, `/api/v1/rosters/${rosterId}`, { name: 'Mine now', units: [] }, 'PUT')).status).toBe(403);
		expect((await raw(bo.client, 'GET', `/api/v1/rosters/${rosterId}/export?format=json`)).status).toBe(403);
		expect((await raw(bo.client, 'DELETE', `/api/v1/rosters/${rosterId}`)).status).toBe(403);
		expect((await bo.client.get(`/rosters/${rosterId}`)).status).toBe(403);
		const save = await bo.client.post(`/rosters/${rosterId}?/save`, { roster: JSON.stringify({ name: 'Mine now', units: [] }) });
		expect(save.status).toBe(403);
		expect((await bo.client.post(`/rosters/${rosterId}?/delete`, {})).status).toBe(403);
		const row = await testDb()('rosters').where({ id: rosterId }).first();
		expect(row.name).toBe('Ada private');
		const list = await (await raw(bo.client, 'GET', '/api/v1/rosters')).json();
		expect(list.rosters.map((r: { id: number }) => r.id)).not.toContain(rosterId);
	});

	it("another player gets 403 on someone else's file, and cannot import it", async () => {
		expect((await raw(bo.client, 'GET', `/api/v1/files/${fileId}`)).status).toBe(403);
		expect((await raw(bo.client, 'DELETE', `/api/v1/files/${fileId}`)).status).toBe(403);
		expect((await postJson(bo.client, '/api/v1/rosters/import', { fileId })).status).toBe(403);
		expect(await testDb()('uploads').where({ id: fileId }).first()).toBeTruthy();
		const files = await (await raw(bo.client, 'GET', '/api/v1/files')).json();
		expect(files.files.map((f: { id: string }) => f.id)).not.toContain(fileId);
	});

	it('ids that cannot exist are 404, never a database error', async () => {
		for (const path of ['/api/v1/rosters/99999999999999', '/api/v1/rosters/abc', '/api/v1/rosters/0', '/api/v1/files/not-a-uuid', '/api/v1/files/00000000-0000-4000-8000-000000000000']) {
			expect([path, (await raw(ada.client, 'GET', path)).status]).toEqual([path, 404]);
		}
	});
});

describe('the editor API and form refuse bad rosters with 400 and reasons', () => {
	it('POST and PUT answer the schema issues with their paths', async () => {
		const res = await postJson(ada.client, '/api/v1/rosters', {
			name: '',
			units: [{ name: 'X', class: 'foot', allowanceIn: -1, footprint: { shape: 'hull', points: [[0, 0], [1, 1]] }, pieces: 1, points: 1 }]
		});
		expect(res.status).toBe(400);
		const { error } = await res.json();
		expect(error.issues).toEqual([
			{ path: ['name'], message: 'The roster name is missing' },
			{ path: ['units', '0', 'allowanceIn'], message: 'The move allowance cannot be negative' },
			{ path: ['units', '0', 'footprint', 'points'], message: 'A hull needs at least 3 points (this one has 2)' }
		]);
		const broken = await raw(ada.client, 'POST', '/api/v1/rosters', '{"name": ', { 'content-type': 'application/json' });
		expect(broken.status).toBe(400);
		expect((await postJson(ada.client, '/api/v1/rosters/import', { fileId: 'nope' })).status).toBe(400);
	});

	it('the editor page saves a valid roster and refuses an invalid one', async () => {
		const create = await ada.client.post('/rosters?/create', { name: 'Form made', force: 'Form force' });
		expect(create.status).toBe(303);
		const id = Number(create.headers.get('location')!.split('/').pop());
		const unit = { name: 'Pikes', class: 'foot', allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 10, points: 100 };
		const ok = await ada.client.post(`/rosters/${id}?/save`, { roster: JSON.stringify({ name: 'Form made', force: 'Form force', units: [unit] }) });
		expect(ok.status).toBe(200);
		const stored = await testDb()('rosters').where({ id }).first();
		expect(stored.units).toEqual([{ ...unit, flies: false, value: 0 }]);
		const bad = await ada.client.post(`/rosters/${id}?/save`, { roster: JSON.stringify({ name: 'Form made', units: [{ ...unit, class: 'wizard' }] }) });
		expect(bad.status).toBe(400);
		const junk = await ada.client.post(`/rosters/${id}?/save`, { roster: '{not json' });
		expect(junk.status).toBe(400);
		expect((await testDb()('rosters').where({ id }).first()).units).toEqual(stored.units);
	});
});
