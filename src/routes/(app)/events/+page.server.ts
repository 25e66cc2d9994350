// Events still to finish (any signed-in player may enter one) and the events I have entered.
import { requireUser } from '$lib/server/auth/roles';
import { clubs } from '$lib/server/db/clubs';
import { entries } from '$lib/server/db/entries';
import { events } from '$lib/server/db/events';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	const [current, mine, myClubs] = await Promise.all([events.listCurrent(), entries.listForUser(user.id), clubs.listForUser(user.id)]);
	return { events: current, mine, organiserOf: myClubs.filter((c) => c.role === 'organiser').map((c) => ({ id: c.id, name: c.name })) };
};
