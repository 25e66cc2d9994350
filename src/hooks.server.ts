// Request hooks: load the session and user into locals, add security headers, and keep
// unexpected errors from leaking details. Combined with `sequence`.
import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { auth, SESSION_COOKIE } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';
import { installRequestSignals } from '$lib/server/request-signal';

// Before the first request: requests keep their abort signal without a finalizer per request
// (request-signal.ts says why).
export const init: ServerInit = () => {
	installRequestSignals();
};

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

/** Requests whose error handleError recognised as the database being out of reach. */
const databaseDownSeen = new WeakSet<object>();

/** Connection refused or lost, PostgreSQL shutting down or starting up, no pool connection. */
function isDatabaseDown(e: unknown, depth = 0): boolean {
	if (!e || typeof e !== 'object' || depth > 4) return false;
	const { code, message, cause, errors } = e as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
	if (typeof code === 'string' && (/^(ECONNREFUSED|ECONNRESET|ETIMEDOUT|EHOSTUNREACH|ENOTFOUND|EPIPE)$/.test(code) || /^(08|57P0[123])/.test(code))) return true;
	if (typeof message === 'string' && /Connection terminated|Timeout acquiring a connection|connection error|the database system is (starting up|shutting down)/i.test(message)) return true;
	if (Array.isArray(errors) && errors.some((x) => isDatabaseDown(x, depth + 1))) return true;
	return isDatabaseDown(cause, depth + 1);
}

/**
 * While PostgreSQL is out of reach every request that needs it answers 503 (JSON for the API,
 * a plain page otherwise) instead of 500; the pool reconnects by itself once it is back.
 */
export const handleDatabaseDown: Handle = async ({ event, resolve }) => {
	const down = (): Response => {
		const headers: Record<string, string> = {
			'retry-after': '5',
			'cache-control': 'no-store',
			'x-content-type-options': 'nosniff',
			'x-frame-options': 'DENY',
			'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'"
		};
		const message = 'The database is out of reach just now: try again in a moment';
		if (event.url.pathname.startsWith('/api/')) {
			return new Response(JSON.stringify({ error: { message } }), { status: 503, headers: { ...headers, 'content-type': 'application/json' } });
		}
		const page = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Back in a moment · Inchwarden</title></head><body style="font-family:system-ui,sans-serif;background:#f3f5f0;color:#14171c;padding:2rem"><h1>Back in a moment</h1><p role="alert">&#9650; ${message}.</p><p><a href="" style="color:#45533a;font-weight:600">Try again</a></p></body></html>`;
		return new Response(page, { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
	};
	let response: Response;
	try {
		response = await resolve(event);
	} catch (e) {
		// handleSession reads the session before any route runs: its failure lands here.
		if (!isDatabaseDown(e)) throw e;
		console.error('database out of reach:', (e as Error).message);
		return down();
	}
	return response.status >= 500 && databaseDownSeen.has(event.locals) ? down() : response;
};

export const handle = sequence(handleDatabaseDown, handleSession, handleSecurityHeaders);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseDown(error)) {
		// One line, not a stack per request, while the database is away; the answer becomes 503.
		databaseDownSeen.add(event.locals);
		console.error('database out of reach:', (error as Error).message);
		return { message: 'The database is out of reach just now' };
	}
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
