// The ruling desk for one request: judges of the game's event and site judges only.
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/roles';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { accessTo, isJudge } from '$lib/server/judging/access';
import { loadReplay } from '$lib/server/judging/replay';
import type { PageServerLoad } from './$types';

const idSchema = z.coerce.number().int().positive().max(2 ** 31 - 1);

export const load: PageServerLoad = async ({ locals, params, url, depends }) => {
	const user = requireUser(locals, url);
	const id = idSchema.safeParse(params.id);
	if (!id.success) error(404, 'No such ruling request');
	const request = await rulingRequests.find(id.data);
	if (!request) error(404, 'No such ruling request');
	const access = await accessTo(request.gameId, user);
	if (!access || !isJudge(access)) error(403, 'Only a judge of this game\'s event, or a site judge, may rule on it');
	const replay = await loadReplay(request.gameId);
	if (!replay) error(404, 'No such game');
	depends('app:desk');
	return { request, replay, me: { id: user.id, name: user.displayName } };
};
