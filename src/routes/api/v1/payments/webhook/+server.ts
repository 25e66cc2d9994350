// The payment provider's webhook: no session, no role — the signature over the raw body is the
// only credential, checked by the SDK. Replays are acknowledged and ignored.
import { json } from '@sveltejs/kit';
import { payments } from '$lib/server/payments';
import type { RequestHandler } from './$types';

/** Provider events are a few kB; anything far larger is not one. */
const MAX_BYTES = 256 * 1024;

export const POST: RequestHandler = async ({ request }) => {
	const length = Number(request.headers.get('content-length') ?? 0);
	if (length > MAX_BYTES) return json({ error: { message: 'The webhook body is too large' } }, { status: 413 });
	// The signature covers the exact bytes sent: read the raw text, never a re-serialised object.
	const raw = await request.text();
	if (raw.length > MAX_BYTES) return json({ error: { message: 'The webhook body is too large' } }, { status: 413 });
	const out = await payments.handleWebhook(raw, request.headers.get('stripe-signature'));
	return json(out.body, { status: out.status });
};
