// The play screen's data: the game as this player sees it (players only), and their rosters.
import { error } from '@sveltejs/kit';
import { gameIdSchema } from '$lib/schemas/game';
import { requireUser } from '$lib/server/auth/roles';
import { gameActions } from '$lib/server/db/game-actions';
import { rosters } from '$lib/server/db/rosters';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireUser(locals, url);
	const id = gameIdSchema.safeParse(params.id);
	if (!id.success) error(404, 'No such game');
	const game = await gameActions.viewFor(id.data, user.id);
	if (!game) {
		if (await gameActions.exists(id.data)) error(403, 'Only the players of this game may see it');
		error(404, 'No such game');
	}
	const mine = await rosters.listForOwner(user.id);
	return { game, rosters: mine.map((r) => ({ id: r.id, name: r.name, units: r.units })) };
};
