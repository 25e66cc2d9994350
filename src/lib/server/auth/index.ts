// The app's one session manager, wired to PostgreSQL through the sessions entity module,
// and the two request-level steps every sign-in path shares.
import type { RequestEvent } from '@sveltejs/kit';
import { sessions } from '$lib/server/db/sessions';
import { createAdapter } from './adapter';
import { cookieSecure, createSessionManager } from './session';

export const auth = createSessionManager(createAdapter(sessions), {
	secure: cookieSecure(process.env.ORIGIN)
});
export { SESSION_COOKIE } from './session';

/**
 * Signs the user in on this response: drops whatever session the browser came with and
 * issues a new token, so an id planted before sign-in is never promoted (session fixation).
 */
export async function startSession(event: RequestEvent, userId: string): Promise<void> {
	if (event.locals.session) await auth.invalidate(event.locals.session.id);
	const { token } = await auth.create(userId);
	auth.setCookie(event.cookies, token);
}

/** The client's address as adapter-node sees it; a missing proxy header must not be a 500. */
export function clientAddress(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
