// Ruling requests: the rows are written by the database itself when a 'ruling-request' entry
// is appended to the move log (see the rulings migration); this module reads them as the
// queue, a game and the desk show them, and moves them along open → taken → ruled.
import type { CheckReport } from '$lib/schemas/check';
import type { LogKind, RequestStatus, RulingRequestView } from '$lib/schemas/ruling';
import { use, type Db } from './index';

interface Row {
	id: number;
	game_id: number;
	game_title: string;
	request_seq: number;
	move_seq: number;
	note: string;
	status: RequestStatus;
	requested_by: string;
	requested_by_name: string | null;
	taken_by: string | null;
	taken_by_name: string | null;
	taken_at: Date | null;
	ruled_seq: number | null;
	ruled_at: Date | null;
	created_at: Date;
	event_id: number | null;
	event_name: string | null;
	round_no: number | null;
	table_no: number | null;
	entry_kind: LogKind;
	entry_payload: Record<string, unknown>;
	entry_report: CheckReport | null;
	photos: { id: string; contentType: string; sizeBytes: number }[] | null;
}

function base(trx?: Db) {
	const k = use(trx);
	return k('ruling_requests as r')
		.join('games as g', 'g.id', 'r.game_id')
		.join('game_moves as m', function () {
			this.on('m.game_id', 'r.game_id').andOn('m.seq', 'r.move_seq');
		})
		.leftJoin('users as ur', 'ur.id', 'r.requested_by')
		.leftJoin('users as ut', 'ut.id', 'r.taken_by')
		// A game belongs to at most one pairing (the event's round and table it was started for).
		.leftJoin('event_pairings as p', 'p.game_id', 'r.game_id')
		.leftJoin('event_rounds as er', 'er.id', 'p.round_id')
		.leftJoin('events as e', 'e.id', 'er.event_id')
		.select(
			'r.id',
			'r.game_id',
			'g.title as game_title',
			'r.request_seq',
			'r.move_seq',
			'r.note',
			'r.status',
			'r.requested_by',
			'ur.display_name as requested_by_name',
			'r.taken_by',
			'ut.display_name as taken_by_name',
			'r.taken_at',
			'r.ruled_seq',
			'r.ruled_at',
			'r.created_at',
			'e.id as event_id',
			'e.name as event_name',
			'er.number as round_no',
			'p.table_no',
			'm.kind as entry_kind',
			'm.payload as entry_payload',
			'm.report as entry_report',
			k.raw(`(select coalesce(json_agg(json_build_object('id', u.id, 'contentType', u.content_type, 'sizeBytes', u.size_bytes) order by ph.position), '[]'::json)
				from ruling_request_photos ph join uploads u on u.id = ph.upload_id where ph.request_id = r.id) as photos`)
		);
}

/** The finding in question, in one plain sentence. */
function findingOf(kind: LogKind, report: CheckReport | null): string {
	if (!report) return kind === 'move' || kind === 'refused' ? 'no report recorded' : `a ${kind} entry (no check)`;
	const first = report.findings.find((f) => f.severity !== 'warning') ?? report.findings[0];
	if (first) return first.message;
	return 'no finding: the referee found the move legal';
}

function toView(r: Row): RulingRequestView {
	return {
		id: r.id,
		gameId: r.game_id,
		gameTitle: r.game_title,
		requestSeq: r.request_seq,
		moveSeq: r.move_seq,
		note: r.note,
		status: r.status,
		requestedBy: { id: r.requested_by, name: r.requested_by_name ?? 'unknown' },
		takenBy: r.taken_by ? { id: r.taken_by, name: r.taken_by_name ?? 'unknown' } : null,
		takenAt: r.taken_at?.toISOString() ?? null,
		ruledSeq: r.ruled_seq,
		ruledAt: r.ruled_at?.toISOString() ?? null,
		createdAt: r.created_at.toISOString(),
		event: r.event_id !== null ? { id: r.event_id, name: r.event_name ?? '', round: r.round_no ?? 0, table: r.table_no } : null,
		entry: {
			kind: r.entry_kind,
			unit: typeof r.entry_payload?.unit === 'string' ? r.entry_payload.unit : null,
			verdict: r.entry_report?.verdict ?? null,
			finding: findingOf(r.entry_kind, r.entry_report)
		},
		photos: r.photos ?? []
	};
}

export async function find(id: number, trx?: Db): Promise<RulingRequestView | null> {
	const row = await base(trx).where('r.id', id).first();
	return row ? toView(row as Row) : null;
}

export async function findBySeq(gameId: number, requestSeq: number, trx?: Db): Promise<RulingRequestView | null> {
	const row = await base(trx).where({ 'r.game_id': gameId, 'r.request_seq': requestSeq }).first();
	return row ? toView(row as Row) : null;
}

export async function forGame(gameId: number, trx?: Db): Promise<RulingRequestView[]> {
	const rows = await base(trx).where('r.game_id', gameId).orderBy('r.created_at', 'desc').orderBy('r.id', 'desc');
	return (rows as Row[]).map(toView);
}

/**
 * The queue: requests not yet ruled (and the last day's rulings), newest first. `judgeOf` limits
 * it to games of events the user judges; null shows every request (site judges).
 */
export async function queue(judgeOf: string | null, trx?: Db): Promise<RulingRequestView[]> {
	const q = base(trx)
		.where((w) => w.whereIn('r.status', ['open', 'taken']).orWhere('r.ruled_at', '>', use(trx).raw("now() - interval '1 day'")))
		.orderBy('r.created_at', 'desc')
		.orderBy('r.id', 'desc')
		.limit(200);
	if (judgeOf !== null) {
		q.whereExists(function () {
			this.select(1).from('event_judges as j').whereRaw('j.event_id = e.id').andWhere('j.user_id', judgeOf);
		});
	}
	return ((await q) as Row[]).map(toView);
}

/** Requests of games of events whose club the user organises, newest first. */
export async function forOrganiser(userId: string, trx?: Db): Promise<RulingRequestView[]> {
	const rows = await base(trx)
		.whereExists(function () {
			this.select(1).from('club_members as cm').whereRaw('cm.club_id = e.club_id').andWhere({ 'cm.user_id': userId, 'cm.role': 'organiser' });
		})
		.orderBy('r.created_at', 'desc')
		.limit(200);
	return (rows as Row[]).map(toView);
}

/** Takes an open request for a judge: one atomic update, so two judges cannot both take it. */
export async function take(id: number, judgeId: string, trx?: Db): Promise<boolean> {
	const n = await use(trx)('ruling_requests').where({ id, status: 'open' }).update({ status: 'taken', taken_by: judgeId, taken_at: use(trx).fn.now() });
	return n === 1;
}

/** The request row locked for a ruling (inside the ruling's transaction). */
export async function lock(id: number, trx: Db): Promise<{ id: number; gameId: number; moveSeq: number; status: RequestStatus; takenBy: string | null } | null> {
	const r = await trx('ruling_requests').where({ id }).forUpdate().select('id', 'game_id', 'move_seq', 'status', 'taken_by').first();
	return r ? { id: r.id, gameId: r.game_id, moveSeq: r.move_seq, status: r.status, takenBy: r.taken_by } : null;
}

export async function markRuled(id: number, judgeId: string, ruledSeq: number, trx: Db): Promise<void> {
	// A judge may rule on an open request directly: taking it is implied.
	await trx('ruling_requests')
		.where({ id })
		.update({ status: 'ruled', ruled_seq: ruledSeq, ruled_at: trx.fn.now(), taken_by: judgeId, taken_at: trx.raw('coalesce(taken_at, now())') });
}

/** Requests whose judges have not been e-mailed yet, claimed for sending (skipped if another sender holds them). */
export async function claimUnnotified(trx: Db, limit = 20): Promise<{ id: number; gameId: number }[]> {
	const rows = await trx('ruling_requests').whereNull('notified_at').orderBy('id').limit(limit).forUpdate().skipLocked().select('id', 'game_id');
	return rows.map((r: { id: number; game_id: number }) => ({ id: r.id, gameId: r.game_id }));
}

export async function markNotified(id: number, trx?: Db): Promise<void> {
	await use(trx)('ruling_requests').where({ id }).update({ notified_at: use(trx).fn.now() });
}

/** The upload ids attached to a request (for checking who may see a photo). */
export async function photoRequests(uploadId: string, trx?: Db): Promise<{ requestId: number; gameId: number }[]> {
	const rows = await use(trx)('ruling_request_photos as ph')
		.join('ruling_requests as r', 'r.id', 'ph.request_id')
		.where('ph.upload_id', uploadId)
		.select('r.id', 'r.game_id');
	return rows.map((r: { id: number; game_id: number }) => ({ requestId: r.id, gameId: r.game_id }));
}

/** Whether the user judges any event (the queue is theirs to see, limited to those events). */
export async function judgesAnyEvent(userId: string, trx?: Db): Promise<boolean> {
	return !!(await use(trx)('event_judges').where({ user_id: userId }).first());
}

export const rulingRequests = { find, findBySeq, forGame, queue, forOrganiser, take, lock, markRuled, claimUnnotified, markNotified, photoRequests, judgesAnyEvent };
