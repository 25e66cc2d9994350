// The club's archive of logged games with filters (player, event, date, profile, rulings).
// Members only: it names the club's players.
import { archiveFilterSchema } from '$lib/schemas/club';
import { requireUser } from '$lib/server/auth/roles';
import { clubs } from '$lib/server/db/clubs';
import { results } from '$lib/server/db/results';
import { clubFor } from '../club-access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const { club, role } = await clubFor(params.id, user);
	const filter = archiveFilterSchema.parse(Object.fromEntries([...url.searchParams].filter(([, v]) => v !== '')));
	const [games, choices, members] = await Promise.all([results.archive(club.id, filter), results.archiveChoices(club.id), clubs.members(club.id)]);
	return {
		club,
		role,
		filter,
		query: url.search,
		games: games.map((g) => ({ ...g, createdAt: g.createdAt.toISOString() })),
		events: choices.events,
		profiles: choices.profiles,
		players: members.map((m) => ({ id: m.userId, name: m.displayName }))
	};
};
