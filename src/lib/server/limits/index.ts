// Rate limits whose counters live in PostgreSQL, so that every app process sees the same
// counts: sign-in failures, invitations, anonymous checks. One statement per hit, on the
// database's clock; the arithmetic is in window.ts.
import { db, use, type Db } from '$lib/server/db';
import { verdict, type LimitVerdict } from './window';

export type { LimitVerdict } from './window';

export interface Limit {
	/** Names the limit in the table ("signin-account", "invite-recipient"). */
	name: string;
	/** Hits allowed within one window. */
	limit: number;
	windowSeconds: number;
}

interface Counts {
	current: number;
	previous: number;
	slot: number;
	now_s: number;
}

function toVerdict(limit: Limit, r: Counts, counted: boolean): LimitVerdict {
	const elapsed = Math.min(limit.windowSeconds, Math.max(0, r.now_s - r.slot * limit.windowSeconds));
	return verdict({ current: r.current, previous: r.previous, elapsedSeconds: elapsed, windowSeconds: limit.windowSeconds }, limit.limit, counted);
}

/** Counts one hit for `key` and says whether it is within the limit (a refused hit counts too). */
export async function hit(limit: Limit, key: string, trx?: Db): Promise<LimitVerdict> {
	const w = limit.windowSeconds;
	const { rows } = await use(trx).raw(
		`with t as (select extract(epoch from clock_timestamp())::float8 as now_s),
			s as (select now_s, floor(now_s / ?)::bigint as slot from t),
			cur as (
				insert into rate_counts (name, key, slot, count, expires_at)
				select ?, ?, s.slot, 1, to_timestamp((s.slot + 2) * ?::float8) from s
				on conflict (name, key, slot) do update set count = rate_counts.count + 1
				returning count, slot
			)
		select cur.count as current, cur.slot, s.now_s,
			coalesce((select p.count from rate_counts p where p.name = ? and p.key = ? and p.slot = cur.slot - 1), 0) as previous
		from cur, s`,
		[w, limit.name, key, w, limit.name, key]
	);
	return toVerdict(limit, rows[0] as Counts, true);
}

/** Whether one more hit for `key` would be allowed, without counting one. */
export async function peek(limit: Limit, key: string, trx?: Db): Promise<LimitVerdict> {
	const w = limit.windowSeconds;
	const { rows } = await use(trx).raw(
		`with t as (select extract(epoch from clock_timestamp())::float8 as now_s),
			s as (select now_s, floor(now_s / ?)::bigint as slot from t)
		select s.slot, s.now_s,
			coalesce((select c.count from rate_counts c where c.name = ? and c.key = ? and c.slot = s.slot), 0) as current,
			coalesce((select p.count from rate_counts p where p.name = ? and p.key = ? and p.slot = s.slot - 1), 0) as previous
		from s`,
		[w, limit.name, key, limit.name, key]
	);
	return toVerdict(limit, rows[0] as Counts, false);
}

/** Takes back one hit counted in the current or previous slot (an attempt that turned out fine). */
export async function unhit(limit: Limit, key: string, trx?: Db): Promise<void> {
	const w = limit.windowSeconds;
	await use(trx).raw(
		`update rate_counts set count = count - 1
		where ctid = (select ctid from rate_counts where name = ? and key = ? and count > 0
			and slot >= floor(extract(epoch from clock_timestamp()) / ?)::bigint - 1 order by slot desc limit 1)`,
		[limit.name, key, w]
	);
}

/** Forgets every hit of `key` under this limit (a password reset clears the account's failures). */
export async function clear(limit: Limit, key: string, trx?: Db): Promise<void> {
	await use(trx)('rate_counts').where({ name: limit.name, key }).delete();
}

/** Deletes counters that can no longer matter; run now and then (the hourly sweep). */
export async function sweep(trx?: Db): Promise<number> {
	return use(trx ?? db)('rate_counts').where('expires_at', '<', use(trx ?? db).fn.now()).delete();
}

function positiveInt(raw: string | undefined, fallback: number): number {
	const n = Number(raw);
	return Number.isInteger(n) && n > 0 ? n : fallback;
}

/** A limit from settings: `limitFromEnv('SIGNIN_ACCOUNT', …)` reads SIGNIN_ACCOUNT_LIMIT and _WINDOW_SECONDS. */
export function limitFromEnv(name: string, prefix: string, fallback: { limit: number; windowSeconds: number }, env: Record<string, string | undefined> = process.env): Limit {
	return {
		name,
		limit: positiveInt(env[`${prefix}_LIMIT`], fallback.limit),
		windowSeconds: positiveInt(env[`${prefix}_WINDOW_SECONDS`], fallback.windowSeconds)
	};
}

export const limits = { hit, peek, unhit, clear, sweep };
