// The event's standings as JSON (rank, points and the tie-breakers; names, never addresses).
import { json } from '@sveltejs/kit';
import { results } from '$lib/server/db/results';
import { eventOr } from '../event-api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const event = await eventOr(locals, params.id);
	if (event instanceof Response) return event;
	return json({ eventId: event.id, status: event.status, standings: await results.standings(event.id) });
};
