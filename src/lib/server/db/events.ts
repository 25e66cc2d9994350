// Events (one-day events and leagues) of a club, with their judges. Registration, payment,
// rounds and results live in entries.ts, pairings.ts and results.ts.
import type { Profile } from '$lib/schemas/check';
import type { CreateEvent, EventKind, EventStatus } from '$lib/schemas/event';
import { db, use, type Db } from './index';

export interface EventRow {
	id: number;
	clubId: number;
	clubName: string;
	name: string;
	kind: EventKind;
	startsOn: string;
	endsOn: string;
	venue: string;
	profileName: string;
	profile: Profile;
	rounds: number;
	layoutIds: number[];
	entryFeeCents: number;
	currency: string;
	capacity: number;
	status: EventStatus;
	createdAt: Date;
}

export interface EventListItem {
	id: number;
	clubId: number;
	clubName: string;
	name: string;
	kind: EventKind;
	startsOn: string;
	endsOn: string;
	venue: string;
	entryFeeCents: number;
	currency: string;
	capacity: number;
	status: EventStatus;
	entered: number;
}

// Dates come back as 'YYYY-MM-DD' text: a calendar day has no time zone to shift it.
const columns = [
	'e.id',
	'e.club_id as clubId',
	'c.name as clubName',
	'e.name',
	'e.kind',
	db.raw("to_char(e.starts_on, 'YYYY-MM-DD') as \"startsOn\""),
	db.raw("to_char(e.ends_on, 'YYYY-MM-DD') as \"endsOn\""),
	'e.venue',
	'e.entry_fee_cents as entryFeeCents',
	'e.currency',
	'e.capacity',
	'e.status'
];

export async function add(input: CreateEvent & { profile: Profile; createdBy: string }, trx?: Db): Promise<number> {
	const run = async (t: Db) => {
		const [row] = await t('events')
			.insert({
				club_id: input.clubId,
				name: input.name,
				kind: input.kind,
				starts_on: input.startsOn,
				ends_on: input.endsOn,
				venue: input.venue,
				profile_name: input.profileName,
				profile: JSON.stringify(input.profile),
				rounds: input.rounds,
				layout_ids: JSON.stringify(input.layoutIds),
				entry_fee_cents: input.entryFee,
				currency: input.currency,
				capacity: input.capacity,
				created_by: input.createdBy
			})
			.returning('id');
		for (const userId of new Set(input.judgeIds)) await t('event_judges').insert({ event_id: row.id, user_id: userId });
		return row.id as number;
	};
	return trx ? run(trx) : db.transaction(run);
}

export async function find(id: number, trx?: Db): Promise<EventRow | null> {
	const row = await use(trx)('events as e')
		.join('clubs as c', 'c.id', 'e.club_id')
		.where('e.id', id)
		.select(...columns, 'e.profile_name as profileName', 'e.profile', 'e.rounds', 'e.layout_ids as layoutIds', 'e.created_at as createdAt')
		.first();
	return (row as EventRow | undefined) ?? null;
}

/** The row locked for the rest of the transaction: registrations queue here for the capacity. */
export async function lock(id: number, trx: Db): Promise<{ id: number; capacity: number; status: EventStatus } | null> {
	const row = await trx('events').where({ id }).forUpdate().select('id', 'capacity', 'status').first();
	return row ?? null;
}

const enteredCount = db.raw("(select count(*) from event_entries x where x.event_id = e.id and x.status = 'entered')::int as entered");

export async function listForClub(clubId: number, trx?: Db): Promise<EventListItem[]> {
	return use(trx)('events as e')
		.join('clubs as c', 'c.id', 'e.club_id')
		.where('e.club_id', clubId)
		.select(...columns, enteredCount)
		.orderBy('e.starts_on', 'desc');
}

/** Events still to finish, soonest first, for everyone signed in. */
export async function listCurrent(trx?: Db): Promise<EventListItem[]> {
	return use(trx)('events as e')
		.join('clubs as c', 'c.id', 'e.club_id')
		.whereNot('e.status', 'finished')
		.select(...columns, enteredCount)
		.orderBy('e.starts_on')
		.limit(200);
}

export async function setStatus(id: number, status: EventStatus, trx?: Db): Promise<void> {
	await use(trx)('events').where({ id }).update({ status });
}

export async function judges(eventId: number, trx?: Db): Promise<{ userId: string; displayName: string }[]> {
	return use(trx)('event_judges as j')
		.join('users as u', 'u.id', 'j.user_id')
		.where('j.event_id', eventId)
		.select('j.user_id as userId', 'u.display_name as displayName')
		.orderBy('u.display_name');
}

export async function isJudge(eventId: number, userId: string, trx?: Db): Promise<boolean> {
	return !!(await use(trx)('event_judges').where({ event_id: eventId, user_id: userId }).first());
}



export interface EventAccess {
	/** the user's role in the event's club, null outside it */
	clubRole: 'member' | 'organiser' | null;
	/** organisers of the event's club manage it */
	organiser: boolean;
	/** judges of the event may enter results */
	judge: boolean;
}

export async function accessFor(event: { id: number; clubId: number }, userId: string, trx?: Db): Promise<EventAccess> {
	const [m, judge] = await Promise.all([
		use(trx)('club_members').where({ club_id: event.clubId, user_id: userId }).select('role').first(),
		isJudge(event.id, userId, trx)
	]);
	const clubRole = (m?.role as EventAccess['clubRole'] | undefined) ?? null;
	return { clubRole, organiser: clubRole === 'organiser', judge };
}
export const events = { add, find, lock, listForClub, listCurrent, setStatus, judges, isJudge, accessFor };
