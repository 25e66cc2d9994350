// The printable turn report: players, judges and organisers of the game, or anyone signed in
// holding a shared link for that round. Sharing makes such a link (to send to the organiser).
import { error, fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/roles';
import { accessTo, maySee } from '$lib/server/judging/access';
import { loadReplay } from '$lib/server/judging/replay';
import { buildTurnReport, mayReadReport, shareReport } from '$lib/server/judging/report';
import { parseReportQuery } from './params';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireUser(locals, url);
	const q = parseReportQuery(params.id, url);
	if (!q.success) error(400, 'The report needs a game id, and a round and side if given, that make sense');
	const data = await loadReplay(q.data.id);
	if (!data) error(404, 'No such game');
	const round = q.data.round ?? data.game.state.round;
	const may = await mayReadReport(user, q.data.id, round, q.data.key ?? null);
	if (may === 'no-game') error(404, 'No such game');
	if (may === 'no') error(403, 'Only the players, judges and organisers of this game, or holders of a shared link, may read its report');
	const access = await accessTo(q.data.id, user);
	return { report: buildTurnReport(data, round, q.data.side ?? null), key: q.data.key ?? null, canShare: !!access && maySee(access) };
};

export const actions: Actions = {
	share: async ({ locals, params, url }) => {
		const user = requireUser(locals);
		const q = parseReportQuery(params.id, url);
		if (!q.success || q.data.round === undefined) return fail(400, { message: 'Choose the round to share' });
		const access = await accessTo(q.data.id, user);
		if (!access) return fail(404, { message: 'No such game' });
		if (!maySee(access)) return fail(403, { message: 'Only the players, judges and organisers of this game may share its report' });
		const token = await shareReport(user, q.data.id, q.data.round);
		const origin = (process.env.ORIGIN ?? url.origin).replace(/\/+$/, '');
		return { link: `${origin}/games/${q.data.id}/report?round=${q.data.round}&key=${token}` };
	}
};
