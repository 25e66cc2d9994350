// Request hooks: load the session and user into locals, add security headers, and keep
// unexpected errors from leaking details. Combined with `sequence`.
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { auth, SESSION_COOKIE } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';

export const handleSession: Handle = async ({ event, resolve }) => {
	const token = event.cookies.get(SESSION_COOKIE);
	if (!token) {
		event.locals.user = null;
		event.locals.session = null;
		return resolve(event);
	}
	const { user, session } = await auth.validate(token);
	if (session?.fresh) {
		// Lucia moved the expiry forward (half the 30 days were gone): the cookie must follow.
		auth.setCookie(event.cookies, token);
	}
	if (!session) auth.clearCookie(event.cookies);
	event.locals.user = user;
	event.locals.session = session;
	return resolve(event);
};

export const handleSecurityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	// Some responses (redirects from fetch, static assets) arrive with immutable headers.
	try {
		response.headers.set('X-Content-Type-Options', 'nosniff');
		response.headers.set('X-Frame-Options', 'DENY');
		response.headers.set('Referrer-Policy', 'same-origin');
	} catch {
		/* immutable headers: leave them */
	}
	return response;
};

export const handle = sequence(handleSession, handleSecurityHeaders);

export const handleError: HandleServerError = ({ error, status, message }) => {
	if (status >= 500) console.error(error);
	return { message: status >= 500 ? 'Something went wrong on our side' : message };
};

// Expired sessions are also refused on read; this only keeps the table small.
const sweep = setInterval(
	() => auth.deleteExpired().catch((e) => console.error('session sweep failed', e)),
	60 * 60 * 1000
);
sweep.unref();

// adapter-node waits for open handles on SIGTERM; the pg pool is one of them.
process.on('sveltekit:shutdown', () => {
	clearInterval(sweep);
	void closeDb();
});
