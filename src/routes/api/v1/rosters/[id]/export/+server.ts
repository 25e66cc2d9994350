// A roster as a download in one of the import formats (?format=csv|json), owner only.
import { exportFormatSchema } from '$lib/schemas/roster';
import { exportFileName, rosterToCsv, rosterToJson } from '$lib/rosters/export';
import { ownRoster } from '$lib/server/storage/rosters';
import { guard, jsonError } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const own = await ownRoster(user.id, params.id);
	if (!own.ok) return jsonError(own.status, own.message);
	const format = exportFormatSchema.safeParse(url.searchParams.get('format') ?? 'csv');
	if (!format.success) return jsonError(400, 'format must be csv or json', { issues: format.error.issues.map((i) => ({ path: ['format'], message: i.message })) });
	const body = format.data === 'csv' ? rosterToCsv(own.roster) : rosterToJson(own.roster);
	return new Response(body, {
		headers: {
			'content-type': format.data === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="${exportFileName(own.roster.name, format.data)}"`,
			'cache-control': 'private, no-store'
		}
	});
};
