// The replay of a game's log, for its players, its event's judges, site judges and its event's
// organisers; everyone else gets 403.
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/roles';
import { accessTo, isJudge, isPlayer, maySee } from '$lib/server/judging/access';
import { loadReplay } from '$lib/server/judging/replay';
import type { PageServerLoad } from './$types';

const idSchema = z.coerce.number().int().positive().max(2 ** 31 - 1);

export const load: PageServerLoad = async ({ locals, params, url, depends }) => {
	const user = requireUser(locals, url);
	const id = idSchema.safeParse(params.id);
	if (!id.success) error(404, 'No such game');
	const access = await accessTo(id.data, user);
	if (!access) error(404, 'No such game');
	if (!maySee(access)) error(403, 'Only the players, judges and organisers of this game may replay it');
	const replay = await loadReplay(id.data);
	if (!replay) error(404, 'No such game');
	depends('app:replay');
	const seq = Number(url.searchParams.get('seq'));
	return { replay, player: isPlayer(access), judge: isJudge(access), mySides: access.sides, seq: Number.isInteger(seq) && seq > 0 ? seq : null };
};
