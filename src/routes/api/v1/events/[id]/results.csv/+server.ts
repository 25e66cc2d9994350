// Every published pairing of the event with its result, as CSV.
import { toCsv } from '$lib/pairings';
import { pairings } from '$lib/server/db/pairings';
import { csvResponse, eventOr } from '../event-api';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const event = await eventOr(locals, params.id);
	if (event instanceof Response) return event;
	const published = new Set((await pairings.rounds(event.id)).filter((r) => r.status === 'published').map((r) => r.id));
	const rows = (await pairings.forEvent(event.id))
		.filter((p) => published.has(p.roundId))
		.map((p) => [
			p.round,
			p.table ?? 'bye',
			p.playerAName,
			p.playerBName ?? '',
			p.resultStatus === 'none' ? '' : p.outcome === 'draw' ? 'draw' : p.outcome === 'a' ? p.playerAName : p.playerBName,
			p.playerB ? p.valueA : null,
			p.playerB ? p.valueB : null,
			p.resultStatus,
			p.gameId
		]);
	return csvResponse(toCsv(['round', 'table', 'player_a', 'player_b', 'winner', 'value_a', 'value_b', 'result_status', 'game_id'], rows), `event-${event.id}-results.csv`);
};
