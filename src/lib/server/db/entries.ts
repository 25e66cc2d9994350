// Event entries (a player and their roster) and the payments of entry fees. The payment rows
// hold only the provider's ids, the amount and a status: card details never reach us. The
// provider's webhook events are remembered by id so that a replayed delivery changes nothing.
import type { EntryStatus, PaymentStatus } from '$lib/schemas/event';
import { db, use, type Db } from './index';
import { events } from './events';

/** A checkout holds a place this long (the session expires then too). */
export const HOLD_MINUTES = 30;

export interface Entry {
	id: number;
	eventId: number;
	userId: string;
	displayName: string;
	rosterId: number | null;
	rosterName: string | null;
	status: EntryStatus;
	payment: PaymentStatus | null;
	createdAt: Date;
	/** organisers only */
	email?: string;
}

const entryColumns = [
	'x.id',
	'x.event_id as eventId',
	'x.user_id as userId',
	'u.display_name as displayName',
	'x.roster_id as rosterId',
	'r.name as rosterName',
	'x.status',
	'x.created_at as createdAt',
	// The newest payment's status speaks for the entry.
	db.raw('(select p.status from payments p where p.entry_id = x.id order by p.id desc limit 1) as payment')
];

function base(trx?: Db) {
	return use(trx)('event_entries as x').join('users as u', 'u.id', 'x.user_id').leftJoin('rosters as r', 'r.id', 'x.roster_id');
}

export async function list(eventId: number, opts: { withEmail?: boolean } = {}, trx?: Db): Promise<Entry[]> {
	const rows = await base(trx)
		.where('x.event_id', eventId)
		.select(...entryColumns, 'u.email')
		.orderBy('x.created_at');
	return rows.map(({ email, ...r }: Entry & { email: string }) => (opts.withEmail ? { ...r, email } : r));
}

export async function find(id: number, trx?: Db): Promise<Entry | null> {
	const row = await base(trx).where('x.id', id).select(...entryColumns).first();
	return (row as Entry | undefined) ?? null;
}

export async function forUser(eventId: number, userId: string, trx?: Db): Promise<Entry | null> {
	const row = await base(trx).where({ 'x.event_id': eventId, 'x.user_id': userId }).select(...entryColumns).first();
	return (row as Entry | undefined) ?? null;
}

/** The events a user has entered (or is paying for), soonest first, for the dashboard. */
export async function listForUser(userId: string, trx?: Db): Promise<{ eventId: number; name: string; startsOn: string; status: EntryStatus }[]> {
	return use(trx)('event_entries as x')
		.join('events as e', 'e.id', 'x.event_id')
		.where('x.user_id', userId)
		.whereNot('x.status', 'withdrawn')
		.select('e.id as eventId', 'e.name', db.raw("to_char(e.starts_on, 'YYYY-MM-DD') as \"startsOn\""), 'x.status')
		.orderBy('e.starts_on');
}

export type RegisterOutcome =
	| { ok: true; entryId: number; status: EntryStatus }
	| { ok: false; reason: 'closed' | 'full' | 'already-entered' | 'no-event' };

/**
 * Enters a player, counting places under the event's row lock: entered players plus checkouts
 * still inside their hold. A free event enters at once; a paid one waits for its payment.
 */
export async function register(eventId: number, userId: string, rosterId: number, feeCents: number): Promise<RegisterOutcome> {
	return db.transaction(async (trx) => {
		const ev = await events.lock(eventId, trx);
		if (!ev) return { ok: false, reason: 'no-event' };
		if (ev.status !== 'open') return { ok: false, reason: 'closed' };
		const mine = await trx('event_entries').where({ event_id: eventId, user_id: userId }).forUpdate().first();
		if (mine && mine.status !== 'withdrawn') return { ok: false, reason: 'already-entered' };
		const [{ taken }] = await trx('event_entries')
			.where('event_id', eventId)
			.andWhere((q) =>
				q.where('status', 'entered').orWhere((h) =>
					h.where('status', 'awaiting-payment').andWhere('updated_at', '>', trx.raw(`now() - interval '${HOLD_MINUTES} minutes'`))
				)
			)
			.count<{ taken: number }[]>({ taken: '*' });
		if (Number(taken) >= ev.capacity) return { ok: false, reason: 'full' };
		const status: EntryStatus = feeCents > 0 ? 'awaiting-payment' : 'entered';
		if (mine) {
			await trx('event_entries').where({ id: mine.id }).update({ status, roster_id: rosterId, updated_at: trx.fn.now() });
			return { ok: true, entryId: mine.id as number, status };
		}
		const [row] = await trx('event_entries').insert({ event_id: eventId, user_id: userId, roster_id: rosterId, status }).returning('id');
		return { ok: true, entryId: row.id as number, status };
	});
}

/** A place is held again while a new checkout runs. */
export async function touch(entryId: number, trx?: Db): Promise<void> {
	await use(trx)('event_entries').where({ id: entryId }).update({ updated_at: db.fn.now() });
}

export async function setStatus(entryId: number, status: EntryStatus, trx?: Db): Promise<void> {
	await use(trx)('event_entries').where({ id: entryId }).update({ status, updated_at: db.fn.now() });
}

/** Players who take part in pairings: entered, not withdrawn. */
export async function entrants(eventId: number, trx?: Db): Promise<{ userId: string; displayName: string; rosterId: number | null }[]> {
	return use(trx)('event_entries as x')
		.join('users as u', 'u.id', 'x.user_id')
		.where({ 'x.event_id': eventId, 'x.status': 'entered' })
		.select('x.user_id as userId', 'u.display_name as displayName', 'x.roster_id as rosterId')
		.orderBy('u.display_name');
}

// ---------------------------------------------------------------------------------------------
// Payments

export interface Payment {
	id: number;
	entryId: number;
	sessionId: string;
	paymentIntent: string | null;
	amountCents: number;
	currency: string;
	status: PaymentStatus;
	refundId: string | null;
}

const paymentColumns = [
	'id',
	'entry_id as entryId',
	'session_id as sessionId',
	'payment_intent as paymentIntent',
	'amount_cents as amountCents',
	'currency',
	'status',
	'refund_id as refundId'
];

export async function addPayment(input: { entryId: number; sessionId: string; amountCents: number; currency: string }, trx?: Db): Promise<void> {
	await use(trx)('payments').insert({ entry_id: input.entryId, session_id: input.sessionId, amount_cents: input.amountCents, currency: input.currency });
}

export async function paymentForSession(sessionId: string, trx?: Db): Promise<Payment | null> {
	const row = await use(trx)('payments').where({ session_id: sessionId }).select(paymentColumns).first();
	return (row as Payment | undefined) ?? null;
}

/** The entry's paid (or refund-pending) payment, the one a refund goes against. */
export async function paidPayment(entryId: number, trx?: Db): Promise<Payment | null> {
	const row = await use(trx)('payments').where({ entry_id: entryId }).whereIn('status', ['paid', 'refund-requested']).select(paymentColumns).orderBy('id', 'desc').first();
	return (row as Payment | undefined) ?? null;
}

/**
 * Remembers a webhook event id; false when it was seen before (a replay). Called inside the
 * transaction that applies the event, so a failed apply forgets the id and a retry is applied.
 */
export async function recordWebhookEvent(id: string, type: string, trx: Db): Promise<boolean> {
	const rows = await trx.raw('insert into payment_webhook_events (id, type) values (?, ?) on conflict (id) do nothing returning id', [id, type]);
	return rows.rows.length === 1;
}

/** checkout.session.completed: the payment is paid and the entry entered. */
export async function markPaid(sessionId: string, paymentIntent: string | null, trx: Db): Promise<boolean> {
	const [row] = await trx('payments')
		.where({ session_id: sessionId, status: 'open' })
		.update({ status: 'paid', payment_intent: paymentIntent, paid_at: trx.fn.now() })
		.returning(['entry_id']);
	if (!row) return false;
	await trx('event_entries').where({ id: row.entry_id, status: 'awaiting-payment' }).update({ status: 'entered', updated_at: trx.fn.now() });
	return true;
}

/** The organiser asked for a refund: the entry leaves the event at once, the money follows. */
export async function requestRefund(paymentId: number, refundId: string, trx?: Db): Promise<void> {
	const run = async (t: Db) => {
		const [row] = await t('payments').where({ id: paymentId }).update({ refund_id: refundId }).returning(['entry_id', 'status']);
		// The provider's webhook may already have marked it refunded: never step back from that.
		await t('payments').where({ id: paymentId, status: 'paid' }).update({ status: 'refund-requested' });
		if (row) await t('event_entries').where({ id: row.entry_id }).update({ status: 'withdrawn', updated_at: t.fn.now() });
	};
	await (trx ? run(trx) : db.transaction(run));
}

/** charge.refunded: the money went back to the player. */
export async function markRefunded(paymentIntent: string, trx: Db): Promise<boolean> {
	const [row] = await trx('payments')
		.where({ payment_intent: paymentIntent })
		.whereIn('status', ['paid', 'refund-requested'])
		.update({ status: 'refunded', refunded_at: trx.fn.now() })
		.returning(['entry_id']);
	if (!row) return false;
	await trx('event_entries').where({ id: row.entry_id }).update({ status: 'withdrawn', updated_at: trx.fn.now() });
	return true;
}

export const entries = {
	list,
	find,
	forUser,
	listForUser,
	register,
	touch,
	setStatus,
	entrants,
	addPayment,
	paymentForSession,
	paidPayment,
	recordWebhookEvent,
	markPaid,
	requestRefund,
	markRefunded
};
