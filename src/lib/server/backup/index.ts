// Backup: a game, or a whole club with its events and their games, as one JSON document, and
// the import of such a document into a database that does not hold those records yet. Rows are
// read with to_jsonb and written back with jsonb_populate_recordset, so PostgreSQL itself
// converts every column (timestamps to the microsecond, dates, jsonb) in both directions.
import type { Knex } from 'knex';
import { z } from 'zod';
import { db, type Db } from '$lib/server/db';
import { getObject, putObject } from '$lib/server/storage/s3';

export const BACKUP_FORMAT = 'inchwarden-backup';
export const BACKUP_VERSION = 1;

/**
 * The tables a backup carries, in the order an import writes them (parents before children).
 * Invitations, sessions, reset links and report links are left out on purpose: they are
 * short-lived secrets, not records.
 */
export const BACKUP_TABLES = [
	'users',
	'user_roles',
	'uploads',
	'rosters',
	'layouts',
	'clubs',
	'club_members',
	'events',
	'event_judges',
	'event_entries',
	'payments',
	'games',
	'game_players',
	'game_moves',
	'ruling_requests',
	'ruling_request_photos',
	'event_rounds',
	'event_pairings'
] as const;
export type BackupTable = (typeof BACKUP_TABLES)[number];

type Row = Record<string, unknown>;
export type BackupScope = { kind: 'game'; id: number } | { kind: 'club'; id: number };

export interface BackupDocument {
	format: typeof BACKUP_FORMAT;
	version: typeof BACKUP_VERSION;
	exportedAt: string;
	scope: BackupScope;
	tables: Partial<Record<BackupTable, Row[]>>;
	/** the bytes of uploads (roster sources, evidence photos), base64, by upload id */
	objects: Record<string, string>;
}

const rowSchema = z.record(z.string(), z.unknown());
export const backupDocumentSchema = z
	.object({
		format: z.literal(BACKUP_FORMAT),
		version: z.literal(BACKUP_VERSION),
		exportedAt: z.string().max(64),
		scope: z.discriminatedUnion('kind', [
			z.object({ kind: z.literal('game'), id: z.int().positive() }),
			z.object({ kind: z.literal('club'), id: z.int().positive() })
		]),
		tables: z.partialRecord(z.enum(BACKUP_TABLES), z.array(rowSchema).max(200_000)),
		objects: z.record(z.string().uuid(), z.string().max(8_000_000).regex(/^[A-Za-z0-9+/]*={0,2}$/, 'base64')).default({})
	})
	.strict();

// ---------------------------------------------------------------------------------------------
// Export

async function rows(trx: Db, table: BackupTable, where: string, bindings: Knex.RawBinding[], order = 't.ctid'): Promise<Row[]> {
	// `table` only ever comes from BACKUP_TABLES; the filter's values are bound.
	const r = await trx.raw(`select to_jsonb(t) as row from ${table} t where ${where} order by ${order}`, bindings);
	return (r.rows as { row: Row }[]).map((x) => x.row);
}

const ids = <T>(list: Row[], ...keys: string[]): T[] => {
	const out = new Set<T>();
	for (const r of list) for (const k of keys) if (r[k] !== null && r[k] !== undefined) out.add(r[k] as T);
	return [...out];
};

/** The games' own records: players, log, ruling requests and their photos. */
async function gameRecords(trx: Db, gameIds: number[]) {
	const games = await rows(trx, 'games', 't.id = any(?)', [gameIds], 't.id');
	const players = await rows(trx, 'game_players', 't.game_id = any(?)', [gameIds], 't.game_id, t.side');
	const moves = await rows(trx, 'game_moves', 't.game_id = any(?)', [gameIds], 't.game_id, t.seq');
	const requests = await rows(trx, 'ruling_requests', 't.game_id = any(?)', [gameIds], 't.id');
	const photos = await rows(trx, 'ruling_request_photos', 't.request_id = any(?)', [ids<number>(requests, 'id')], 't.request_id, t.position');
	return { games, players, moves, requests, photos };
}

/** Null when the game or club does not exist. */
export async function exportScope(scope: BackupScope): Promise<BackupDocument | null> {
	// One snapshot: a repeatable-read, read-only transaction sees every table at the same instant.
	return db.transaction(
		async (trx) => {
			const t: Partial<Record<BackupTable, Row[]>> = {};
			let gameIds: number[];
			if (scope.kind === 'club') {
				const clubs = await rows(trx, 'clubs', 't.id = ?', [scope.id]);
				if (clubs.length === 0) return null;
				t.clubs = clubs;
				t.club_members = await rows(trx, 'club_members', 't.club_id = ?', [scope.id], 't.user_id');
				t.events = await rows(trx, 'events', 't.club_id = ?', [scope.id], 't.id');
				const eventIds = ids<number>(t.events, 'id');
				t.event_judges = await rows(trx, 'event_judges', 't.event_id = any(?)', [eventIds], 't.event_id, t.user_id');
				t.event_entries = await rows(trx, 'event_entries', 't.event_id = any(?)', [eventIds], 't.id');
				t.payments = await rows(trx, 'payments', 't.entry_id = any(?)', [ids<number>(t.event_entries, 'id')], 't.id');
				t.event_rounds = await rows(trx, 'event_rounds', 't.event_id = any(?)', [eventIds], 't.id');
				t.event_pairings = await rows(trx, 'event_pairings', 't.round_id = any(?)', [ids<number>(t.event_rounds, 'id')], 't.id');
				gameIds = ids<number>(t.event_pairings, 'game_id');
			} else {
				gameIds = [scope.id];
			}
			const g = await gameRecords(trx, gameIds);
			if (scope.kind === 'game' && g.games.length === 0) return null;
			Object.assign(t, { games: g.games, game_players: g.players, game_moves: g.moves, ruling_requests: g.requests, ruling_request_photos: g.photos });

			// What the records point at: rosters, saved layouts, uploads, and the people.
			t.rosters = await rows(trx, 'rosters', 't.id = any(?)', [ids<number>([...g.players, ...(t.event_entries ?? [])], 'roster_id')], 't.id');
			const layoutIds = [
				...ids<number>([...g.games, ...(t.event_pairings ?? [])], 'layout_id'),
				...(t.events ?? []).flatMap((e) => (Array.isArray(e.layout_ids) ? (e.layout_ids as unknown[]).filter((x): x is number => Number.isInteger(x)) : []))
			];
			t.layouts = await rows(trx, 'layouts', 't.id = any(?)', [[...new Set(layoutIds)]], 't.id');
			t.uploads = await rows(trx, 'uploads', 't.id = any(?::uuid[])', [[...ids<string>(g.photos, 'upload_id'), ...ids<string>(t.rosters, 'source_upload_id')]], 't.id');
			const userIds = ids<string>(
				[
					...(t.clubs ?? []),
					...(t.club_members ?? []),
					...(t.events ?? []),
					...(t.event_judges ?? []),
					...(t.event_entries ?? []),
					...(t.event_pairings ?? []),
					...g.games,
					...g.players,
					...g.moves,
					...g.requests,
					...t.rosters,
					...t.layouts,
					...t.uploads
				],
				'created_by', 'user_id', 'player_a', 'player_b', 'reported_by', 'confirmed_by', 'actor', 'requested_by', 'taken_by', 'owner_id'
			);
			// Accounts come with their password hashes so that the restored people can sign in.
			t.users = await rows(trx, 'users', 't.id = any(?)', [userIds], 't.id');
			t.user_roles = await rows(trx, 'user_roles', 't.user_id = any(?)', [userIds], 't.user_id, t.role');

			const objects: Record<string, string> = {};
			for (const u of t.uploads) objects[u.id as string] = Buffer.from(await getObject(u.key as string)).toString('base64');

			const tables: Partial<Record<BackupTable, Row[]>> = {};
			for (const name of BACKUP_TABLES) if (t[name]?.length) tables[name] = t[name];
			return { format: BACKUP_FORMAT, version: BACKUP_VERSION, exportedAt: new Date().toISOString(), scope, tables, objects } satisfies BackupDocument;
		},
		{ isolationLevel: 'repeatable read', readOnly: true }
	);
}

// ---------------------------------------------------------------------------------------------
// Import

export type ImportResult =
	| { ok: true; counts: Partial<Record<BackupTable, number>> }
	| { ok: false; status: 400 | 409; message: string };

/**
 * Writes the document's records with their own ids, all or nothing. Accounts that already exist
 * with the same id are kept as they are (an admin restoring into a fresh install exists there);
 * any other record that is already present refuses the whole import with 409.
 */
export async function importDocument(doc: BackupDocument): Promise<ImportResult> {
	const uploads = doc.tables.uploads ?? [];
	for (const u of uploads) {
		if (typeof u.id !== 'string' || !(u.id in doc.objects)) return { ok: false, status: 400, message: `The file for upload ${String(u.id)} is missing from the backup` };
	}
	try {
		const counts = await db.transaction(async (trx) => {
			const counts: Partial<Record<BackupTable, number>> = {};
			const gameIds = ids<number>(doc.tables.games ?? [], 'id');
			for (const table of BACKUP_TABLES) {
				const list = doc.tables[table];
				if (!list?.length) continue;
				if (table === 'ruling_requests') {
					// Appending a 'ruling-request' entry to the log opens a request by trigger; the
					// backup's own requests (with their ids, which later log entries name) replace those.
					await trx.raw('delete from ruling_requests where game_id = any(?)', [gameIds]);
				}
				const keep = table === 'users' || table === 'user_roles' ? ' on conflict do nothing' : '';
				const r = await trx.raw(`insert into ${table} select * from jsonb_populate_recordset(null::${table}, ?::jsonb)${keep}`, [JSON.stringify(list)]);
				counts[table] = r.rowCount ?? 0;
			}
			// Serial ids: the next new row must come after the restored ones.
			const serials = await trx.raw(
				`select table_name as t, pg_get_serial_sequence(quote_ident(table_name), 'id') as s from information_schema.columns
				 where table_schema = current_schema() and column_name = 'id' and table_name = any(?)`,
				[BACKUP_TABLES.filter((name) => doc.tables[name]?.length)]
			);
			for (const { t, s } of serials.rows as { t: BackupTable; s: string | null }[]) {
				if (!s || !BACKUP_TABLES.includes(t)) continue;
				await trx.raw(`select setval(?, greatest((select max(id) from ${t}), 1))`, [s]);
			}
			return counts;
		});
		for (const u of uploads) await putObject(u.key as string, Buffer.from(doc.objects[u.id as string], 'base64'), String(u.content_type));
		return { ok: true, counts };
	} catch (e) {
		const code = (e as { code?: string }).code;
		const detail = (e as { detail?: string }).detail;
		if (code === '23505') return { ok: false, status: 409, message: `The database already holds some of these records${detail ? ` (${detail})` : ''}: import into an empty database` };
		if (code === '23503') return { ok: false, status: 400, message: `The backup is incomplete: a record points at one that is not there${detail ? ` (${detail})` : ''}` };
		if (code && /^(22|23)/.test(code)) return { ok: false, status: 400, message: `The backup holds a record the database refuses: ${(e as Error).message.split(' - ').pop()}` };
		throw e;
	}
}
