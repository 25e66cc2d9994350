// An event: details, registration (and the entry fee through the payment provider's page),
// entries, rounds with pairings and results, standings. Every action checks its role here:
// players act on their own entry and pairing; the club's organisers run the event; the
// event's judges may also enter results.
import { fail } from '@sveltejs/kit';
import { entryIdSchema, pairingIdSchema, registerSchema, resultSchema, swapSchema } from '$lib/schemas/event';
import { requireUser } from '$lib/server/auth/roles';
import { entries } from '$lib/server/db/entries';
import { events } from '$lib/server/db/events';
import { gamePlayers } from '$lib/server/db/game-players';
import { pairings, rounding } from '$lib/server/db/pairings';
import { results } from '$lib/server/db/results';
import { rosters } from '$lib/server/db/rosters';
import { formFields } from '$lib/server/http';
import { payments } from '$lib/server/payments';
import { eventFor, roundsOf, standingsOf } from './event-view';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { z } from 'zod';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const { event, access } = await eventFor(params.id, user);
	const [list, mine, myRosters, judges, rounds, standings] = await Promise.all([
		entries.list(event.id, { withEmail: access.organiser }),
		entries.forUser(event.id, user.id),
		rosters.listForOwner(user.id),
		events.judges(event.id),
		roundsOf(event.id, access.organiser),
		standingsOf(event.id)
	]);
	return {
		event,
		access,
		meId: user.id,
		// Players see who is in; the organisers also see who is still paying, and addresses.
		entries: list
			.filter((e) => access.organiser || e.status === 'entered')
			.map((e) => ({ id: e.id, userId: e.userId, displayName: e.displayName, rosterName: e.rosterName, status: e.status, payment: access.organiser ? e.payment : null, email: e.email })),
		mine: mine ? { id: mine.id, status: mine.status, payment: mine.payment, rosterName: mine.rosterName } : null,
		rosters: myRosters.map((r) => ({ id: r.id, name: r.name })),
		judges,
		rounds,
		standings,
		paymentNotice: url.searchParams.get('payment') === 'cancelled' ? 'The payment was cancelled; your place is held for a while — pay to keep it.' : null
	};
};

type Ctx = Awaited<ReturnType<typeof eventFor>> & { user: ReturnType<typeof requireUser> };

async function context(e: RequestEvent): Promise<Ctx> {
	const user = requireUser(e.locals);
	return { user, ...(await eventFor(e.params.id, user)) };
}

const notOrganiser = () => fail(403, { message: 'Only the club’s organisers run the event' });

async function parse<S extends z.ZodType>(e: RequestEvent, schema: S): Promise<{ ok: true; data: z.output<S> } | { ok: false; response: ReturnType<typeof fail> }> {
	const parsed = schema.safeParse((await formFields(e.request)) ?? {});
	if (!parsed.success) return { ok: false, response: fail(400, { message: parsed.error.issues[0].message }) };
	return { ok: true, data: parsed.data };
}

function origin(e: RequestEvent): string {
	return (process.env.ORIGIN ?? e.url.origin).replace(/\/+$/, '');
}

/**
 * Opens the checkout and hands its address back to the page, which sends the browser there.
 * Not a redirect: our content security policy keeps form posts (and their redirects) on our
 * own origin, and the provider's page is on another.
 */
async function checkout(e: RequestEvent, ctx: Ctx, entryId: number) {
	try {
		const { url } = await payments.startCheckout({ entryId, eventId: ctx.event.id, eventName: ctx.event.name, amountCents: ctx.event.entryFeeCents, currency: ctx.event.currency, origin: origin(e) });
		return { message: 'Your place is held: pay on the payment provider’s page to keep it', checkoutUrl: url };
	} catch (err) {
		console.error('checkout failed', err);
		// The entry stays (awaiting payment): the player can try again from the event page.
		return fail(502, { message: 'The payment provider could not be reached; nothing was charged. Try again in a moment.' });
	}
}

/** A pairing of this event, or null. */
async function pairingOf(ctx: Ctx, pairingId: number) {
	const p = await pairings.find(pairingId);
	return p && p.eventId === ctx.event.id ? p : null;
}

export const actions = {
	register: async (e) => {
		const ctx = await context(e);
		const body = await parse(e, registerSchema);
		if (!body.ok) return body.response;
		if (!(await gamePlayers.ownedRoster(body.data.rosterId, ctx.user.id))) return fail(400, { message: 'Choose one of your own rosters' });
		const r = await entries.register(ctx.event.id, ctx.user.id, body.data.rosterId, ctx.event.entryFeeCents);
		if (!r.ok) {
			const message = { closed: 'Registration is closed', full: 'The event is full', 'already-entered': 'You have entered already', 'no-event': 'No such event' }[r.reason];
			return fail(409, { message });
		}
		if (r.status === 'awaiting-payment') return checkout(e, ctx, r.entryId);
		return { message: 'You are entered' };
	},
	pay: async (e) => {
		const ctx = await context(e);
		const mine = await entries.forUser(ctx.event.id, ctx.user.id);
		if (!mine || mine.status !== 'awaiting-payment') return fail(409, { message: 'There is no entry fee waiting to be paid' });
		if (ctx.event.status !== 'open') return fail(409, { message: 'Registration is closed' });
		return checkout(e, ctx, mine.id);
	},
	withdraw: async (e) => {
		const ctx = await context(e);
		const mine = await entries.forUser(ctx.event.id, ctx.user.id);
		if (!mine || mine.status === 'withdrawn') return fail(409, { message: 'You have not entered' });
		if (ctx.event.status !== 'open') return fail(409, { message: 'The event is under way: ask an organiser' });
		if (mine.payment === 'paid') return fail(409, { message: 'Your fee is paid: ask an organiser to withdraw you with a refund' });
		await entries.setStatus(mine.id, 'withdrawn');
		return { message: 'You have withdrawn' };
	},
	refund: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const body = await parse(e, entryIdSchema);
		if (!body.ok) return body.response;
		const entry = await entries.find(body.data.entryId);
		if (!entry || entry.eventId !== ctx.event.id) return fail(404, { message: 'No such entry' });
		const paid = await entries.paidPayment(entry.id);
		if (!paid) {
			if (entry.status === 'withdrawn') return fail(409, { message: 'That entry is withdrawn already' });
			await entries.setStatus(entry.id, 'withdrawn');
			return { message: `${entry.displayName} is withdrawn (nothing was paid)` };
		}
		if (paid.status === 'refund-requested') return fail(409, { message: 'A refund is on its way already' });
		try {
			await payments.refund(paid.id, paid.paymentIntent!);
		} catch (err) {
			console.error('refund failed', err);
			return fail(409, { message: 'The payment provider refused the refund; nothing changed' });
		}
		return { message: `Refund requested for ${entry.displayName}; the entry is withdrawn` };
	},
	closeRegistration: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		if (ctx.event.status !== 'open') return fail(409, { message: 'Registration is closed already' });
		await events.setStatus(ctx.event.id, 'closed');
		return { message: 'Registration closed' };
	},
	pair: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const r = await rounding.pairNext(ctx.event.id);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: 'The round is paired as a draft: check it, swap if needed, then publish' };
	},
	swap: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const fields = (await formFields(e.request)) ?? {};
		const parsed = swapSchema.safeParse(fields);
		const roundId = Number(fields.roundId);
		if (!parsed.success || !Number.isInteger(roundId)) return fail(400, { message: parsed.success ? 'Choose a round' : parsed.error.issues[0].message });
		const round = await pairings.findRound(roundId);
		if (!round || round.eventId !== ctx.event.id) return fail(404, { message: 'No such round' });
		const r = await rounding.swapInDraft(roundId, parsed.data.first, parsed.data.second);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: r.problems?.length ? `Swapped — but check: ${r.problems.join('; ')}` : 'Swapped' };
	},
	discard: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const roundId = Number(((await formFields(e.request)) ?? {}).roundId);
		const round = Number.isInteger(roundId) ? await pairings.findRound(roundId) : null;
		if (!round || round.eventId !== ctx.event.id) return fail(404, { message: 'No such round' });
		if (!(await pairings.removeDraft(roundId))) return fail(409, { message: 'Only a draft can be discarded' });
		return { message: 'Draft discarded' };
	},
	publish: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const roundId = Number(((await formFields(e.request)) ?? {}).roundId);
		const round = Number.isInteger(roundId) ? await pairings.findRound(roundId) : null;
		if (!round || round.eventId !== ctx.event.id) return fail(404, { message: 'No such round' });
		const r = await rounding.publish(roundId);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: `Round ${round.number} published: ${r.games} games started, ${r.mailed} players e-mailed${r.mailFailed ? `, ${r.mailFailed} e-mails failed` : ''}` };
	},
	report: async (e) => {
		const ctx = await context(e);
		const body = await parse(e, resultSchema);
		if (!body.ok) return body.response;
		if (!(await pairingOf(ctx, body.data.pairingId))) return fail(404, { message: 'No such pairing' });
		const r = await results.report(body.data.pairingId, ctx.user.id, body.data);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: 'Result reported: your opponent confirms it' };
	},
	confirm: async (e) => {
		const ctx = await context(e);
		const body = await parse(e, pairingIdSchema);
		if (!body.ok) return body.response;
		if (!(await pairingOf(ctx, body.data.pairingId))) return fail(404, { message: 'No such pairing' });
		const r = await results.confirm(body.data.pairingId, ctx.user.id);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: 'Result confirmed' };
	},
	enter: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser && !ctx.access.judge) return fail(403, { message: 'Only organisers and the event’s judges enter results' });
		const body = await parse(e, resultSchema);
		if (!body.ok) return body.response;
		if (!(await pairingOf(ctx, body.data.pairingId))) return fail(404, { message: 'No such pairing' });
		const r = await results.enter(body.data.pairingId, ctx.user.id, body.data);
		if (!r.ok) return fail(r.status, { message: r.message });
		return { message: 'Result entered' };
	},
	finish: async (e) => {
		const ctx = await context(e);
		if (!ctx.access.organiser) return notOrganiser();
		const rounds = await roundsOf(ctx.event.id, true);
		if (rounds.length === 0) return fail(409, { message: 'No round has been played' });
		if (rounds.some((r) => r.status === 'draft' || r.pairings.some((p) => p.resultStatus !== 'confirmed'))) {
			return fail(409, { message: 'Every round must be published and every result confirmed first' });
		}
		await events.setStatus(ctx.event.id, 'finished');
		return { message: 'The event is finished: the final table stands' };
	}
} satisfies Actions;
