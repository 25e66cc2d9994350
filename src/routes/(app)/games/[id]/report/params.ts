// The report's URL parameters: game id, round (default: the game's current round), side, key.
import { z } from 'zod';

export const reportQuery = z.object({
	id: z.coerce.number().int().positive().max(2 ** 31 - 1),
	round: z.coerce.number().int().min(0).max(10_000).optional(),
	side: z.enum(['a', 'b']).optional(),
	key: z.string().max(200).optional()
});

export function parseReportQuery(id: string, url: URL) {
	return reportQuery.safeParse({
		id,
		round: url.searchParams.get('round') ?? undefined,
		side: url.searchParams.get('side') ?? undefined,
		key: url.searchParams.get('key') ?? undefined
	});
}
