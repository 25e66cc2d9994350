// The outbox: the messages the local fake SMTP server received, so a demo user can open a
// reset link without a real inbox. Admins only; the listing is read over the fake's HTTP API.
import { z } from 'zod';
import { requireRole } from '$lib/server/auth/roles';
import type { PageServerLoad } from './$types';

const messagesSchema = z.array(
	z.object({
		id: z.string(),
		from: z.string(),
		to: z.array(z.string()),
		subject: z.string(),
		text: z.string(),
		html: z.string().optional(),
		receivedAt: z.string()
	})
);

const api = () => (process.env.FAKE_SMTP_API ?? 'http://127.0.0.1:2580').replace(/\/+$/, '');

export const load: PageServerLoad = async ({ locals, url, fetch }) => {
	requireRole(locals, 'admin', url);
	const source = `${api()}/messages`;
	try {
		const res = await fetch(source, { signal: AbortSignal.timeout(3000) });
		if (!res.ok) return { messages: [], problem: `The fake mail server answered ${res.status}` };
		const parsed = messagesSchema.safeParse(await res.json());
		if (!parsed.success) return { messages: [], problem: 'The fake mail server sent a listing we cannot read' };
		// The HTML part is left out on purpose: the page shows text only, never foreign markup.
		return {
			messages: parsed.data.map(({ id, from, to, subject, text, receivedAt }) => ({ id, from, to, subject, text, receivedAt })),
			problem: null
		};
	} catch {
		return { messages: [], problem: `The fake mail server is not reachable at ${api()}` };
	}
};
