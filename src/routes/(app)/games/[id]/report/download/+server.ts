// The turn report as a JSON download, with the same access as the printable page.
import { json } from '@sveltejs/kit';
import { guard, jsonError } from '$lib/server/http';
import { loadReplay } from '$lib/server/judging/replay';
import { buildTurnReport, mayReadReport, reportTag } from '$lib/server/judging/report';
import { parseReportQuery } from '../params';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const q = parseReportQuery(params.id, url);
	if (!q.success) return jsonError(400, 'Bad report parameters', { issues: q.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })) });
	const data = await loadReplay(q.data.id);
	if (!data) return jsonError(404, 'No such game');
	const round = q.data.round ?? data.game.state.round;
	const may = await mayReadReport(user, q.data.id, round, q.data.key ?? null);
	if (may === 'no-game') return jsonError(404, 'No such game');
	if (may === 'no') return jsonError(403, 'Only the players, judges and organisers of this game, or holders of a shared link, may read its report');
	const report = buildTurnReport(data, round, q.data.side ?? null);
	return json(report, {
		headers: {
			'content-disposition': `attachment; filename="turn-report-game-${report.game.id}-round-${report.round}${report.side ? `-side-${report.side}` : ''}-${reportTag(report)}.json"`,
			'cache-control': 'private, no-store'
		}
	});
};
