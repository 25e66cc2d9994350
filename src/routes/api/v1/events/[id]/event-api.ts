// The event for an API request: 401 signed out, 404 for no such event. Events, their pairings,
// results and standings are open to every signed-in player (names only, never addresses).
import { events, type EventRow } from '$lib/server/db/events';
import { jsonError, unauthorized } from '$lib/server/http';

export async function eventOr(locals: App.Locals, param: string): Promise<EventRow | Response> {
	if (!locals.user) return unauthorized();
	const id = Number(param);
	if (!Number.isInteger(id) || id <= 0) return jsonError(404, 'No such event');
	return (await events.find(id)) ?? jsonError(404, 'No such event');
}

export function csvResponse(body: string, filename: string): Response {
	return new Response(body, {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${filename}"`, 'cache-control': 'private, no-store' }
	});
}
