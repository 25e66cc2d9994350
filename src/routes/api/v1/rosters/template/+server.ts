// The import template (?format=csv|json): the columns and one example row of each kind.
import { exportFormatSchema } from '$lib/schemas/roster';
import { rosterToCsv, rosterToJson, TEMPLATE_ROSTER } from '$lib/rosters/export';
import { guard, jsonError } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const format = exportFormatSchema.safeParse(url.searchParams.get('format') ?? 'csv');
	if (!format.success) return jsonError(400, 'format must be csv or json');
	const csv = format.data === 'csv';
	return new Response(csv ? rosterToCsv(TEMPLATE_ROSTER) : rosterToJson(TEMPLATE_ROSTER), {
		headers: {
			'content-type': csv ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="roster-template.${format.data}"`
		}
	});
};
