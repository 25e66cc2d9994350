// The club's statistics as CSV: one section per measure, for spreadsheets. Members only.
import { archiveFilterSchema } from '$lib/schemas/club';
import { toCsv } from '$lib/pairings';
import { clubs } from '$lib/server/db/clubs';
import { results } from '$lib/server/db/results';
import { forbidden, jsonError, unauthorized } from '$lib/server/http';
import type { RequestHandler } from './$types';
import { PG_INT_MAX } from '$lib/schemas/limits';

export const GET: RequestHandler = async ({ locals, params, url }) => {
	if (!locals.user) return unauthorized();
	const id = Number(params.id);
	if (!Number.isInteger(id) || id <= 0 || id > PG_INT_MAX) return jsonError(404, 'No such club');
	const club = await clubs.find(id);
	if (!club) return jsonError(404, 'No such club');
	if (!(await clubs.roleOf(id, locals.user.id))) return forbidden();
	const filter = archiveFilterSchema.parse(Object.fromEntries([...url.searchParams].filter(([, v]) => v !== '')));
	const s = await results.statistics(id, filter);
	const rows = [
		...s.findings.map((f) => ['finding', f.code, '', f.count]),
		...s.refusedBy.map((f) => ['refused-by', f.code, '', f.count]),
		...s.rulingsPerEvent.flatMap((e) => [
			['rulings-per-event', e.eventName, e.games, e.rulings],
			['rulings-given-per-event', e.eventName, e.games, e.ruled]
		]),
		...s.perGame.flatMap((g) => [
			['moves-per-game', `#${g.id} ${g.title}`, g.id, g.moves],
			['refused-per-game', `#${g.id} ${g.title}`, g.id, g.refused],
			['rulings-per-game', `#${g.id} ${g.title}`, g.id, g.rulings]
		])
	];
	return new Response(toCsv(['measure', 'subject', 'detail', 'count'], rows), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="club-${id}-statistics.csv"`,
			'cache-control': 'private, no-store'
		}
	});
};
