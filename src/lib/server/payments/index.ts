// Entry fees through the payment provider's official SDK (stripe). The player pays on the
// provider's hosted page: our server only creates the checkout session, keeps its id, and
// learns the outcome from the provider's signed webhook. No card data ever reaches us.
// In development and tests the SDK talks to the local fake (scripts/fake-payments.ts).
import Stripe from 'stripe';
import { db } from '$lib/server/db';
import { entries, HOLD_MINUTES } from '$lib/server/db/entries';

let client: Stripe | null = null;

/** The SDK pointed at STRIPE_API_BASE (the local fake unless set otherwise). */
export function stripe(): Stripe {
	if (!client) {
		const base = new URL(process.env.STRIPE_API_BASE ?? 'http://127.0.0.1:12111');
		client = new Stripe(process.env.STRIPE_SECRET_KEY ?? 'sk_test_inchwarden_local', {
			host: base.hostname,
			port: base.port || (base.protocol === 'https:' ? 443 : 80),
			protocol: base.protocol === 'https:' ? 'https' : 'http',
			// A retried create could open a second session for one entry; the player can retry instead.
			maxNetworkRetries: 0,
			timeout: 15_000,
			telemetry: false
		});
	}
	return client;
}

export const webhookSecret = (): string => process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_inchwarden_local';

export interface Checkout {
	sessionId: string;
	url: string;
}

/** Opens a checkout session for an entry's fee and records it; the player is sent to `url`. */
export async function startCheckout(input: {
	entryId: number;
	eventId: number;
	eventName: string;
	amountCents: number;
	currency: string;
	origin: string;
}): Promise<Checkout> {
	const session = await stripe().checkout.sessions.create({
		mode: 'payment',
		line_items: [
			{
				quantity: 1,
				price_data: { currency: input.currency, unit_amount: input.amountCents, product_data: { name: `Entry: ${input.eventName}` } }
			}
		],
		client_reference_id: String(input.entryId),
		metadata: { entryId: String(input.entryId), eventId: String(input.eventId) },
		// The place is held as long as the session lives (the provider's minimum is 30 minutes).
		expires_at: Math.floor(Date.now() / 1000) + HOLD_MINUTES * 60,
		success_url: `${input.origin}/events/${input.eventId}/paid?session_id={CHECKOUT_SESSION_ID}`,
		cancel_url: `${input.origin}/events/${input.eventId}?payment=cancelled`
	});
	if (!session.url) throw new Error('the payment provider gave no checkout address');
	await db.transaction(async (trx) => {
		await entries.addPayment({ entryId: input.entryId, sessionId: session.id, amountCents: input.amountCents, currency: input.currency }, trx);
		await entries.touch(input.entryId, trx);
	});
	return { sessionId: session.id, url: session.url };
}

/** Asks the provider to refund a paid entry fee; the webhook confirms the money went back. */
export async function refund(paymentId: number, paymentIntent: string): Promise<string> {
	const r = await stripe().refunds.create({ payment_intent: paymentIntent, reason: 'requested_by_customer' }, { idempotencyKey: `refund-payment-${paymentId}` });
	await entries.requestRefund(paymentId, r.id);
	return r.id;
}

export type WebhookOutcome = { status: 200; body: { received: true; replay?: true; applied?: boolean } } | { status: 400; body: { error: { message: string } } };

/**
 * Verifies the signature over the raw body with the SDK, then applies the event once: the
 * event id is stored in the same transaction, so a replay is acknowledged and ignored.
 */
export async function handleWebhook(rawBody: string, signature: string | null): Promise<WebhookOutcome> {
	if (!signature) return { status: 400, body: { error: { message: 'The Stripe-Signature header is missing' } } };
	let event: Stripe.Event;
	try {
		event = stripe().webhooks.constructEvent(rawBody, signature, webhookSecret());
	} catch {
		return { status: 400, body: { error: { message: 'The webhook signature does not match' } } };
	}
	return db.transaction(async (trx) => {
		const fresh = await entries.recordWebhookEvent(event.id, event.type, trx);
		if (!fresh) return { status: 200 as const, body: { received: true as const, replay: true as const } };
		let applied = false;
		if (event.type === 'checkout.session.completed') {
			const s = event.data.object;
			if (s.payment_status === 'paid') {
				const intent = typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null);
				applied = await entries.markPaid(s.id, intent, trx);
			}
		} else if (event.type === 'charge.refunded') {
			const c = event.data.object;
			const intent = typeof c.payment_intent === 'string' ? c.payment_intent : (c.payment_intent?.id ?? null);
			if (intent && c.refunded) applied = await entries.markRefunded(intent, trx);
		}
		// Other event types are acknowledged so the provider stops resending them.
		return { status: 200 as const, body: { received: true as const, applied } };
	});
}

export const payments = { stripe, startCheckout, refund, handleWebhook, webhookSecret };
