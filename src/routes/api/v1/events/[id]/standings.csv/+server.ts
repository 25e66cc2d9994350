// The event's standings with every tie-breaker, as CSV.
import { toCsv } from '$lib/pairings';
import { results } from '$lib/server/db/results';
import { csvResponse, eventOr } from '../event-api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const event = await eventOr(locals, params.id);
	if (event instanceof Response) return event;
	const rows = (await results.standings(event.id)).map((r) => [r.rank, r.name, r.played, r.wins, r.draws, r.losses, r.byes, r.points, r.opponentsPoints, r.valueDiff, r.headToHead]);
	return csvResponse(
		toCsv(['rank', 'player', 'games', 'wins', 'draws', 'losses', 'byes', 'points', 'opponents_points', 'value_difference', 'head_to_head'], rows),
		`event-${event.id}-standings.csv`
	);
};
