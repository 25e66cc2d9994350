// Entry fees end to end through the real SDK and the local fake provider: the SDK opens the
// checkout session, the fake's pay page takes the "payment" and posts the signed webhook, the
// app marks the entry paid; a replayed delivery changes nothing, a bad signature is refused
// with 400; a refund by the organiser goes back through the SDK and its webhook.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { BASE, closeTestDb, testDb } from '../helpers';
import { clubWithOrganiser, createEvent, FAKE_PAY, join, person, rosterFor, type Person } from './setup';

afterAll(closeTestDb);

interface Delivery {
	eventId: string;
	type: string;
	payload: string;
	signature: string;
	status: number | null;
}
async function deliveries(): Promise<Delivery[]> {
	return (await fetch(`${FAKE_PAY}/_fake/deliveries`)).json();
}
async function waitFor<T>(fn: () => Promise<T | null | undefined | false>, what: string, ms = 10_000): Promise<T> {
	const until = Date.now() + ms;
	for (;;) {
		const v = await fn();
		if (v) return v;
		if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}
const webhook = (body: string, signature?: string) =>
	fetch(`${BASE}/api/v1/payments/webhook`, {
		method: 'POST',
		headers: { 'content-type': 'application/json', ...(signature ? { 'stripe-signature': signature } : {}) },
		body
	});

let organiser: Person;
let player: Person;
let eventId: number;
let entryId: number;
let sessionId: string;
let payUrl: string;

beforeAll(async () => {
	const club = await clubWithOrganiser();
	organiser = club.organiser;
	player = await person('payer');
	await join(club.clubId, player);
	eventId = await createEvent(organiser, club.clubId, { entryFee: '12.50', currency: 'eur', capacity: '4' });
});

describe('a paid entry', () => {
	it('shows the caution where money is taken', async () => {
		await rosterFor(player);
		const html = await (await player.client.get(`/events/${eventId}`)).text();
		expect(html).toContain('Money is taken here: 12.50 EUR');
		expect(html).toContain('never reach Inchwarden');
	});

	it('registering opens a checkout session through the SDK and sends the player to the fake’s page', async () => {
		const rosterId = (await testDb()('rosters').where({ owner_id: player.id }).first('id')).id;
		const res = await player.client.post(`/events/${eventId}?/register`, { rosterId: String(rosterId) });
		// No redirect: the page links (and with JavaScript navigates) to the provider's page.
		expect(res.status).toBe(200);
		payUrl = (await res.text()).match(/href="([^"]+)"[^>]*data-testid="checkout-link"/)![1];
		expect(payUrl.startsWith(`${FAKE_PAY}/pay/cs_test_`)).toBe(true);
		sessionId = payUrl.split('/').pop()!;

		const entry = await testDb()('event_entries').where({ event_id: eventId, user_id: player.id }).first();
		expect(entry.status).toBe('awaiting-payment');
		entryId = entry.id;
		const pay = await testDb()('payments').where({ session_id: sessionId }).first();
		expect(pay).toMatchObject({ entry_id: entryId, amount_cents: 1250, currency: 'eur', status: 'open', payment_intent: null });

		// The session the provider holds is the one the SDK created, with our amount.
		const sdk = new Stripe(process.env.STRIPE_SECRET_KEY ?? 'sk_test_inchwarden_local', { host: new URL(FAKE_PAY).hostname, port: new URL(FAKE_PAY).port, protocol: 'http' });
		const s = await sdk.checkout.sessions.retrieve(sessionId);
		expect(s).toMatchObject({ amount_total: 1250, currency: 'eur', payment_status: 'unpaid', client_reference_id: String(entryId) });
	});

	it('before the payment the page the provider returns to says it is waiting', async () => {
		const res = await player.client.get(`/events/${eventId}/paid?session_id=${sessionId}`);
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('Waiting for the payment provider');
	});

	it('paying on the fake’s page posts a signed webhook that marks the entry paid', async () => {
		const page = await fetch(payUrl);
		expect(await page.text()).toContain('12.50 EUR');
		const res = await fetch(payUrl, { method: 'POST', redirect: 'manual' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`${BASE}/events/${eventId}/paid?session_id=${sessionId}`);

		const pay = await testDb()('payments').where({ session_id: sessionId }).first();
		expect(pay.status).toBe('paid');
		expect(pay.payment_intent).toMatch(/^pi_/);
		expect((await testDb()('event_entries').where({ id: entryId }).first()).status).toBe('entered');
		const d = (await deliveries()).filter((x) => x.payload.includes(sessionId) && x.type === 'checkout.session.completed');
		expect(d).toHaveLength(1);
		expect(d[0].status).toBe(200);
		expect(d[0].signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
		expect(await (await player.client.get(`/events/${eventId}/paid?session_id=${sessionId}`)).text()).toContain('Paid — you are entered');
	});

	it('another player cannot read someone else’s payment', async () => {
		const other = await person('nosy');
		expect((await other.client.get(`/events/${eventId}/paid?session_id=${sessionId}`)).status).toBe(404);
	});

	it('a replayed delivery is acknowledged and ignored', async () => {
		const d = (await deliveries()).find((x) => x.payload.includes(sessionId))!;
		const before = await testDb()('payment_webhook_events').count<{ n: number }[]>({ n: '*' });
		const res = await webhook(d.payload, d.signature);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ received: true, replay: true });
		const after = await testDb()('payment_webhook_events').count<{ n: number }[]>({ n: '*' });
		expect(Number(after[0].n)).toBe(Number(before[0].n));
		expect((await testDb()('payments').where({ session_id: sessionId }).first()).status).toBe('paid');
	});

	it('a bad, missing or foreign signature is refused with 400 and changes nothing', async () => {
		const d = (await deliveries()).find((x) => x.payload.includes(sessionId))!;
		// The same payload with a digit of the signature changed.
		const flipped = d.signature.replace(/v1=(.)/, (_, c) => `v1=${c === '0' ? '1' : '0'}`);
		expect((await webhook(d.payload, flipped)).status).toBe(400);
		// A tampered payload under the genuine signature.
		const tampered = d.payload.replace('"evt_', '"evt_x');
		expect((await webhook(tampered, d.signature)).status).toBe(400);
		// Signed with another secret.
		const forger = new Stripe('sk_test_other');
		const foreign = JSON.stringify({ ...JSON.parse(d.payload), id: 'evt_forged' });
		expect((await webhook(foreign, forger.webhooks.generateTestHeaderString({ payload: foreign, secret: 'whsec_not_ours' }))).status).toBe(400);
		expect((await webhook(d.payload)).status).toBe(400);
		expect(await testDb()('payment_webhook_events').where({ id: 'evt_forged' }).first()).toBeUndefined();
	});

	it('a fresh event signed with our secret is applied once (the app trusts the signature, not the sender)', async () => {
		// An unknown session: acknowledged (so the provider stops resending), nothing applied.
		const sdk = new Stripe('sk_test_any');
		const payload = JSON.stringify({ id: `evt_unknown_${Date.now()}`, object: 'event', type: 'checkout.session.completed', data: { object: { id: 'cs_test_nobody', object: 'checkout.session', payment_status: 'paid', payment_intent: 'pi_nobody' } } });
		const sig = sdk.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_inchwarden_local' });
		const res = await webhook(payload, sig);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ received: true, applied: false });
	});
});

describe('refunds', () => {
	it('only the club’s organisers refund', async () => {
		const res = await player.client.post(`/events/${eventId}?/refund`, { entryId: String(entryId) });
		expect(res.status).toBe(403);
		expect((await testDb()('payments').where({ session_id: sessionId }).first()).status).toBe('paid');
	});

	it('the organiser’s refund goes through the SDK; the provider’s webhook marks it refunded', async () => {
		const res = await organiser.client.post(`/events/${eventId}?/refund`, { entryId: String(entryId) });
		expect(res.status).toBe(200);
		expect((await testDb()('event_entries').where({ id: entryId }).first()).status).toBe('withdrawn');
		const pay = await waitFor(async () => {
			const p = await testDb()('payments').where({ session_id: sessionId }).first();
			return p.status === 'refunded' ? p : null;
		}, 'the refund webhook');
		expect(pay.refund_id).toMatch(/^re_/);
		const refunded = (await deliveries()).filter((x) => x.type === 'charge.refunded' && x.payload.includes(pay.payment_intent));
		expect(refunded).toHaveLength(1);
		expect(refunded[0].status).toBe(200);
		// A second refund is refused: there is nothing paid left.
		const again = await organiser.client.post(`/events/${eventId}?/refund`, { entryId: String(entryId) });
		expect(again.status).toBe(409);
	});
});
