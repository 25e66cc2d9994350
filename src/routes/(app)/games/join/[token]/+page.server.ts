// The link from an invitation e-mail: shows the game and joins it on a press (the token is spent then).
import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/roles';
import { gameActions } from '$lib/server/db/game-actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	requireUser(locals, url);
	const inv = await gameActions.invitationFor(params.token);
	if (!inv) error(404, 'This invitation link is not known');
	return { invitation: inv };
};

export const actions = {
	default: async ({ locals, params }) => {
		const user = requireUser(locals);
		const a = await gameActions.join(params.token, user);
		if (a.status !== 200) return fail(a.status, { message: (a.body as { error: { message: string } }).error.message });
		redirect(303, `/games/${(a.body as { id: number }).id}`);
	}
} satisfies Actions;
