// The first screen after sign-in: my games, my clubs, my events, my rosters.
import type { PageServerLoad } from './$types';
import { clubs } from '$lib/server/db/clubs';
import { rosters } from '$lib/server/db/rosters';
import { error } from '@sveltejs/kit';

export const load: PageServerLoad = async ({ locals }) => {
	if (!locals.user) error(401, 'Sign in first');
	const [myClubs, myRosters] = await Promise.all([
		clubs.listForUser(locals.user.id),
		rosters.listForOwner(locals.user.id)
	]);
	// Games and events arrive with the table and events features; until then they are empty.
	return { clubs: myClubs, rosters: myRosters, games: [] as { id: number; title: string }[], events: [] as { id: number; name: string }[] };
};
