// The move log as a JSON download, with the same access as the page (401 signed out, 403 others).
import { json } from '@sveltejs/kit';
import { guard, jsonError } from '$lib/server/http';
import { loadLog } from '../load-log';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const a = await loadLog(params.id, user);
	if (!a.ok) return jsonError(a.status, a.message);
	return json(
		{ game: a.log.game, entries: a.log.rows },
		{ headers: { 'content-disposition': `attachment; filename="move-log-game-${a.log.game.id}-to-${a.log.game.seq}.json"`, 'cache-control': 'private, no-store' } }
	);
};
