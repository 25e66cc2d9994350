// Admin backup API: GET ?game=<id> or ?club=<id> answers the backup as one JSON file to save;
// POST takes such a file's JSON and imports it (201 with the counts, 409 if the records exist).
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { backupDocumentSchema, exportScope, importDocument, type BackupScope } from '$lib/server/backup';
import { StorageError } from '$lib/server/storage/s3';
import { guard, jsonError, parseJson } from '$lib/server/http';
import type { RequestHandler } from './$types';

const idSchema = z.coerce.number().int().positive().max(2_147_483_647);

export const GET: RequestHandler = async ({ locals, url }) => {
	const user = guard(locals, 'admin');
	if (user instanceof Response) return user;
	const game = url.searchParams.get('game');
	const club = url.searchParams.get('club');
	if ((game === null) === (club === null)) return jsonError(400, 'Name either ?game=<id> or ?club=<id>');
	const id = idSchema.safeParse(game ?? club);
	if (!id.success) return jsonError(400, 'The id must be a positive whole number', { issues: [{ path: [game !== null ? 'game' : 'club'], message: 'not an id' }] });
	const scope: BackupScope = { kind: game !== null ? 'game' : 'club', id: id.data };
	try {
		const doc = await exportScope(scope);
		if (!doc) return jsonError(404, `No such ${scope.kind}`);
		return new Response(JSON.stringify(doc), {
			headers: {
				'content-type': 'application/json; charset=utf-8',
				'content-disposition': `attachment; filename="inchwarden-${scope.kind}-${scope.id}.json"`,
				'cache-control': 'no-store'
			}
		});
	} catch (e) {
		if (e instanceof StorageError) return jsonError(503, e.message);
		throw e;
	}
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals, 'admin');
	if (user instanceof Response) return user;
	const body = await parseJson(request, backupDocumentSchema);
	if (!body.ok) return body.response;
	try {
		const result = await importDocument(body.data);
		if (!result.ok) return jsonError(result.status, result.message);
		return json({ imported: result.counts }, { status: 201 });
	} catch (e) {
		if (e instanceof StorageError) return jsonError(503, e.message);
		throw e;
	}
};
