// GET the judge queue (judges: their events' requests; site judges: all), or ?game=<id> the
// requests of one game (its players, judges and organisers); POST opens a request (players).
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { openRequestSchema } from '$lib/schemas/ruling';
import { guard, jsonError, parseJson } from '$lib/server/http';
import { hasRole } from '$lib/server/auth/roles';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { accessTo, maySee } from '$lib/server/judging/access';
import { openRequest } from '$lib/server/judging/requests';
import { notify } from '$lib/server/judging/notify';
import type { RequestHandler } from './$types';

const gameParam = z.coerce.number().int().positive().max(2 ** 31 - 1);

export const GET: RequestHandler = async ({ locals, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const raw = url.searchParams.get('game');
	if (raw !== null) {
		const id = gameParam.safeParse(raw);
		if (!id.success) return jsonError(400, 'game must be a positive whole number', { issues: [{ path: ['game'], message: 'not a game id' }] });
		const access = await accessTo(id.data, user);
		if (!access) return jsonError(404, 'No such game');
		if (!maySee(access)) return jsonError(403, 'Only the players, judges and organisers of this game may see its requests');
		return json({ requests: await rulingRequests.forGame(id.data) });
	}
	const site = hasRole(user, 'judge');
	if (!site && !(await rulingRequests.judgesAnyEvent(user.id))) return jsonError(403, 'The queue is for judges');
	// Catch up on opening mails a failed send left behind (requests opened from the table's own route too).
	void notify.sendOpened().catch((e) => console.error('ruling request mail', e));
	return json({ requests: await rulingRequests.queue(site ? null : user.id) });
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const body = await parseJson(request, openRequestSchema);
	if (!body.ok) return body.response;
	const a = await openRequest(user, body.data);
	return json(a.body, { status: a.status });
};
