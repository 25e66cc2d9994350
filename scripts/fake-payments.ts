// A local fake of the payment provider's API for development and tests, spoken to by the
// official stripe SDK: checkout sessions, refunds and payment intents (form-encoded requests,
// JSON answers, Bearer secret key), a hosted pay page at /pay/:session, and webhooks signed the
// way the provider signs them (Stripe-Signature: t=…,v1=HMAC-SHA256(secret, "t.payload")).
// Listens on the port of STRIPE_API_BASE; delivers webhooks to APP_WEBHOOK_URL.
import http from 'node:http';
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';

const base = new URL(process.env.STRIPE_API_BASE ?? 'http://127.0.0.1:12111');
const port = Number(base.port || 80);
const host = '127.0.0.1';
const secretKey = process.env.STRIPE_SECRET_KEY ?? 'sk_test_inchwarden_local';
const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_inchwarden_local';
const webhookUrl = process.env.APP_WEBHOOK_URL ?? 'http://127.0.0.1:3000/api/v1/payments/webhook';
// Only for its signing helper: the same code the provider's own test tooling uses.
const signer = new Stripe(secretKey);

const id = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);

type Obj = Record<string, unknown>;
interface Session extends Obj {
	id: string;
	url: string;
	status: 'open' | 'complete' | 'expired';
	payment_status: 'unpaid' | 'paid';
	payment_intent: string | null;
	amount_total: number;
	currency: string;
	success_url: string;
	cancel_url: string;
	expires_at: number;
}
const sessions = new Map<string, Session>();
const intents = new Map<string, Obj>();
const refundsByKey = new Map<string, Obj>();
/** Every webhook delivery, newest last, for tests that replay one exactly as it was sent. */
const deliveries: { eventId: string; type: string; payload: string; signature: string; status: number | null }[] = [];

/** `a[b][0][c]=v` form fields into nested objects and arrays, as the SDK encodes them. */
export function parseForm(body: string): Obj {
	const out: Obj = {};
	for (const [key, value] of new URLSearchParams(body)) {
		const path = key.split(/\[|\]\[|\]/).filter((s) => s !== '');
		let node: Obj | unknown[] = out;
		path.forEach((part, i) => {
			const last = i === path.length - 1;
			const nextIsIndex = !last && /^\d+$/.test(path[i + 1]);
			const k = Array.isArray(node) ? Number(part) : part;
			const bag = node as Record<string | number, unknown>;
			if (last) bag[k] = value;
			else {
				bag[k] ??= nextIsIndex ? [] : {};
				node = bag[k] as Obj | unknown[];
			}
		});
	}
	return out;
}

function send(res: http.ServerResponse, status: number, body: unknown) {
	res.writeHead(status, { 'content-type': 'application/json', 'request-id': id('req') });
	res.end(JSON.stringify(body));
}
const apiError = (res: http.ServerResponse, status: number, message: string, param?: string) =>
	send(res, status, { error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } });

async function readBody(req: http.IncomingMessage): Promise<string> {
	const chunks: Buffer[] = [];
	let size = 0;
	for await (const c of req) {
		size += (c as Buffer).length;
		if (size > 1024 * 1024) throw new Error('body too large');
		chunks.push(c as Buffer);
	}
	return Buffer.concat(chunks).toString('utf8');
}

async function deliver(type: string, object: Obj): Promise<void> {
	const event = { id: id('evt'), object: 'event', api_version: Stripe.API_VERSION, created: now(), livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, type, data: { object } };
	const payload = JSON.stringify(event);
	const record = { eventId: event.id, type, payload, signature: '', status: null as number | null };
	deliveries.push(record);
	if (deliveries.length > 500) deliveries.shift();
	// The provider retries failed deliveries; a few quick tries are enough on loopback.
	for (let attempt = 0; attempt < 5; attempt++) {
		record.signature = signer.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
		try {
			const r = await fetch(webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': record.signature }, body: payload });
			record.status = r.status;
			if (r.ok) return;
			console.error(`webhook ${type} ${event.id}: the app answered ${r.status}`);
		} catch (e) {
			console.error(`webhook ${type} ${event.id}: ${(e as Error).message}`);
		}
		await new Promise((r) => setTimeout(r, 300 * (attempt + 1)));
	}
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function payPage(s: Session, notice = ''): string {
	const items = (s.line_items as { name: string; amount: number }[]) ?? [];
	const amount = `${(s.amount_total / 100).toFixed(2)} ${s.currency.toUpperCase()}`;
	const done = s.status !== 'open';
	return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test checkout · local payment fake</title>
<style>body{font-family:system-ui,sans-serif;background:#eef1f4;color:#1b1f24;margin:0;display:flex;justify-content:center}
main{background:#fff;margin:40px 16px;padding:28px;border-radius:12px;max-width:440px;width:100%;box-shadow:0 2px 8px #0002}
.warn{border:2px solid #7a5a00;background:#fff6d6;padding:10px 12px;border-radius:8px}
button{min-height:48px;width:100%;font-size:18px;font-weight:600;border-radius:8px;border:0;background:#1f3b57;color:#fff;margin-top:16px}
button.secondary{background:#fff;color:#1f3b57;border:2px solid #1f3b57}</style></head><body><main>
<h1>Test checkout</h1>
<p class="warn" role="note">⚠ Local payment fake: no real money moves and no card details are asked for.</p>
${notice ? `<p role="status">${esc(notice)}</p>` : ''}
<ul>${items.map((i) => `<li>${esc(i.name)} — ${(i.amount / 100).toFixed(2)} ${s.currency.toUpperCase()}</li>`).join('')}</ul>
<p>Total: <strong data-testid="amount">${esc(amount)}</strong></p>
${done ? `<p>This checkout is ${s.status}.</p>` : `<form method="post" action="/pay/${s.id}"><button type="submit">Pay ${esc(amount)}</button></form>
<form method="post" action="/pay/${s.id}/cancel"><button class="secondary" type="submit">Cancel and go back</button></form>`}
</main></body></html>`;
}

function createSession(p: Obj): Session | string {
	if (p.mode !== 'payment') return 'mode must be payment';
	const items = (p.line_items as Obj[] | undefined) ?? [];
	if (!items.length) return 'line_items is required';
	let total = 0;
	let currency = '';
	const lines: { name: string; amount: number }[] = [];
	for (const li of items) {
		const pd = li.price_data as Obj | undefined;
		const qty = Number(li.quantity ?? 1);
		const unit = Number(pd?.unit_amount);
		if (!pd || !Number.isInteger(unit) || unit < 0 || !Number.isInteger(qty) || qty < 1) return 'line_items need price_data.unit_amount and a quantity';
		currency = String(pd.currency ?? '').toLowerCase();
		total += unit * qty;
		lines.push({ name: String((pd.product_data as Obj | undefined)?.name ?? 'Item'), amount: unit * qty });
	}
	if (!/^[a-z]{3}$/.test(currency)) return 'currency must be a three-letter code';
	if (typeof p.success_url !== 'string' || typeof p.cancel_url !== 'string') return 'success_url and cancel_url are required';
	const sid = id('cs_test');
	return {
		id: sid,
		object: 'checkout.session',
		url: `${base.origin}/pay/${sid}`,
		mode: 'payment',
		status: 'open',
		payment_status: 'unpaid',
		payment_intent: null,
		amount_total: total,
		amount_subtotal: total,
		currency,
		client_reference_id: (p.client_reference_id as string | undefined) ?? null,
		metadata: (p.metadata as Obj | undefined) ?? {},
		success_url: p.success_url,
		cancel_url: p.cancel_url,
		expires_at: p.expires_at ? Number(p.expires_at) : now() + 24 * 3600,
		created: now(),
		livemode: false,
		line_items: lines
	};
}

/** The session as the API answers it (our line item copy is the pay page's, not the API's). */
const publicSession = (s: Session) => {
	const { line_items: _lines, ...rest } = s;
	return rest;
};

const server = http.createServer(async (req, res) => {
	try {
		const url = new URL(req.url ?? '/', base.origin);
		const parts = url.pathname.split('/').filter(Boolean);

		// The hosted pages: no API key (the player's browser), like the provider's own.
		if (parts[0] === 'pay' && parts[1]) {
			const s = sessions.get(parts[1]);
			if (!s) return void res.writeHead(404, { 'content-type': 'text/plain' }).end('No such checkout');
			if (s.status === 'open' && s.expires_at < now()) s.status = 'expired';
			if (req.method === 'GET' && parts.length === 2) return void res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(payPage(s));
			if (req.method === 'POST' && parts[2] === 'cancel') return void res.writeHead(303, { location: s.cancel_url }).end();
			if (req.method === 'POST' && parts.length === 2) {
				await readBody(req);
				if (s.status !== 'open') return void res.writeHead(409, { 'content-type': 'text/html; charset=utf-8' }).end(payPage(s, 'This checkout can no longer be paid.'));
				const pi = id('pi');
				intents.set(pi, { id: pi, object: 'payment_intent', amount: s.amount_total, amount_received: s.amount_total, currency: s.currency, status: 'succeeded', latest_charge: id('ch'), metadata: s.metadata });
				s.status = 'complete';
				s.payment_status = 'paid';
				s.payment_intent = pi;
				// The provider sends the event and the browser back independently; awaiting the
				// first delivery keeps the success page from racing ahead of the app in tests.
				await deliver('checkout.session.completed', publicSession(s));
				return void res.writeHead(303, { location: s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id) }).end();
			}
			return void res.writeHead(405).end();
		}

		if (parts[0] === '_fake' && parts[1] === 'deliveries' && req.method === 'GET') return send(res, 200, deliveries);
		if (parts[0] === '_fake' && parts[1] === 'health') return send(res, 200, { ok: true });

		if (parts[0] !== 'v1') return apiError(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname})`);
		if (req.headers.authorization !== `Bearer ${secretKey}`) {
			return send(res, 401, { error: { type: 'invalid_request_error', message: 'Invalid API Key provided' } });
		}
		const body = req.method === 'POST' ? parseForm(await readBody(req)) : {};

		if (parts[1] === 'checkout' && parts[2] === 'sessions') {
			if (req.method === 'POST' && parts.length === 3) {
				const s = createSession(body);
				if (typeof s === 'string') return apiError(res, 400, s);
				sessions.set(s.id, s);
				return send(res, 200, publicSession(s));
			}
			if (req.method === 'GET' && parts[3]) {
				const s = sessions.get(parts[3]);
				return s ? send(res, 200, publicSession(s)) : apiError(res, 404, `No such checkout.session: '${parts[3]}'`, 'id');
			}
		}
		if (parts[1] === 'payment_intents' && req.method === 'GET' && parts[2]) {
			const pi = intents.get(parts[2]);
			return pi ? send(res, 200, pi) : apiError(res, 404, `No such payment_intent: '${parts[2]}'`, 'id');
		}
		if (parts[1] === 'refunds' && req.method === 'POST' && parts.length === 2) {
			const key = req.headers['idempotency-key'];
			if (typeof key === 'string' && refundsByKey.has(key)) return send(res, 200, refundsByKey.get(key));
			const pi = intents.get(String(body.payment_intent ?? ''));
			if (!pi) return apiError(res, 404, `No such payment_intent: '${body.payment_intent ?? ''}'`, 'payment_intent');
			if (pi.refunded) return send(res, 400, { error: { type: 'invalid_request_error', code: 'charge_already_refunded', message: 'This payment has already been refunded.' } });
			const amount = body.amount ? Number(body.amount) : Number(pi.amount);
			pi.refunded = true;
			const refund = { id: id('re'), object: 'refund', amount, currency: pi.currency, payment_intent: pi.id, charge: pi.latest_charge, status: 'succeeded', reason: body.reason ?? null, created: now() };
			if (typeof key === 'string') refundsByKey.set(key, refund);
			send(res, 200, refund);
			// As with the provider, the refund's event follows its answer.
			setTimeout(() => {
				const charge = { id: pi.latest_charge, object: 'charge', amount: pi.amount, amount_refunded: amount, currency: pi.currency, payment_intent: pi.id, refunded: amount >= Number(pi.amount), status: 'succeeded' };
				void deliver('charge.refunded', charge);
			}, 50);
			return;
		}
		return apiError(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname})`);
	} catch (e) {
		console.error(e);
		if (!res.headersSent) send(res, 500, { error: { type: 'api_error', message: 'fake payments failed' } });
	}
});

server.listen(port, host, () => console.log(`fake payments on http://${host}:${port}, webhooks to ${webhookUrl}`));

function stop() {
	server.close(() => process.exit(0));
	setTimeout(() => process.exit(0), 1000).unref();
}
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
