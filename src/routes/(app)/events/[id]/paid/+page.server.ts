// Where the payment provider sends the player back. The webhook, not this visit, marks the
// entry paid: this page only reports what the webhook has recorded so far.
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/roles';
import { entries } from '$lib/server/db/entries';
import { eventFor } from '../event-view';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const { event } = await eventFor(params.id, user);
	const sessionId = url.searchParams.get('session_id') ?? '';
	const payment = /^cs_[A-Za-z0-9_]{1,200}$/.test(sessionId) ? await entries.paymentForSession(sessionId) : null;
	const entry = payment ? await entries.find(payment.entryId) : null;
	// Someone else's session id tells them nothing.
	if (!payment || !entry || entry.userId !== user.id || entry.eventId !== event.id) error(404, 'No such payment');
	return { event: { id: event.id, name: event.name }, paid: payment.status === 'paid', status: payment.status, entered: entry.status === 'entered' };
};
