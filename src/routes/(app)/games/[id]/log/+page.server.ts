// The move log page: every entry of one game, for those who may replay it; others get 403.
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/roles';
import { loadLog } from './load-log';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireUser(locals, url);
	const a = await loadLog(params.id, user);
	if (!a.ok) error(a.status, a.message);
	return { log: a.log, player: a.player };
};
