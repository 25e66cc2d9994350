// The club's statistics over its logged games: findings, rulings per event, moves and disputes
// per game, the rules behind refused moves. Members only, like the archive they come from.
import { archiveFilterSchema } from '$lib/schemas/club';
import { requireUser } from '$lib/server/auth/roles';
import { results } from '$lib/server/db/results';
import { clubFor } from '../club-access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const { club } = await clubFor(params.id, user);
	const filter = archiveFilterSchema.parse(Object.fromEntries([...url.searchParams].filter(([, v]) => v !== '')));
	return { club, query: url.search, stats: await results.statistics(club.id, filter) };
};
