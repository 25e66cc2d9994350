// The first screen after sign-in: my games, my clubs, my events, my rosters.
import type { PageServerLoad } from './$types';
import { clubs } from '$lib/server/db/clubs';
import { rosters } from '$lib/server/db/rosters';
import { games } from '$lib/server/db/games';
import { listForUser as entriesForUser } from '$lib/server/db/entries';
import { error } from '@sveltejs/kit';

export const load: PageServerLoad = async ({ locals }) => {
	if (!locals.user) error(401, 'Sign in first');
	const userId = locals.user.id;
	const [myClubs, myRosters, myGames, myEvents] = await Promise.all([
		clubs.listForUser(userId),
		rosters.listForOwner(userId),
		games.listForUser(userId),
		entriesForUser(userId)
	]);
	return { clubs: myClubs, rosters: myRosters, games: myGames.slice(0, 8), events: myEvents };
};
