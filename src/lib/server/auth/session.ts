// Sessions on Lucia 3: the cookie carries a random token, the database the token's hash.
// 30-day sessions, renewed (and the cookie re-set) once half the time is gone.
import { Lucia, TimeSpan, type Adapter, type Session, type User } from 'lucia';
import type { Cookies } from '@sveltejs/kit';
import { withPlayer, type Role } from '$lib/schemas/auth';
import { generateSessionToken, hashToken, isSessionTokenShape } from './token';

export const SESSION_COOKIE = 'inchwarden_session';
export const SESSION_DAYS = 30;

interface UserAttributes {
	email: string;
	displayName: string;
	roles: Role[];
}
interface DatabaseUserAttributes {
	email: string;
	display_name: string;
	roles: string[];
}

declare module 'lucia' {
	interface Register {
		Lucia: Lucia<Record<never, never>, UserAttributes>;
		DatabaseUserAttributes: DatabaseUserAttributes;
	}
}

/**
 * Secure cookies everywhere except a plain-http loopback origin (local runs and tests), where
 * a browser would still accept them but curl-style clients and http test servers would not.
 */
export function cookieSecure(origin: string | undefined): boolean {
	if (!origin) return true;
	try {
		const url = new URL(origin);
		const loopback = ['localhost', '127.0.0.1', '[::1]'].includes(url.hostname);
		return !(url.protocol === 'http:' && loopback);
	} catch {
		return true;
	}
}

export type Validated = { user: User; session: Session } | { user: null; session: null };

export function createSessionManager(adapter: Adapter, options: { secure: boolean }) {
	const lucia = new Lucia(adapter, {
		sessionExpiresIn: new TimeSpan(SESSION_DAYS, 'd'),
		sessionCookie: { name: SESSION_COOKIE, attributes: { secure: options.secure, sameSite: 'lax', path: '/' } },
		getUserAttributes: (a) => ({ email: a.email, displayName: a.display_name, roles: withPlayer(a.roles) })
	});

	return {
		lucia,

		/** A brand-new session (new token, new id) — called on every sign-in against fixation. */
		async create(userId: string): Promise<{ token: string; session: Session }> {
			const token = generateSessionToken();
			const session = await lucia.createSession(userId, {}, { sessionId: hashToken(token) });
			return { token, session };
		},

		async validate(token: string | undefined | null): Promise<Validated> {
			if (!token || !isSessionTokenShape(token)) return { user: null, session: null };
			return lucia.validateSession(hashToken(token));
		},

		invalidate: (sessionId: string) => lucia.invalidateSession(sessionId),
		invalidateAll: (userId: string) => lucia.invalidateUserSessions(userId),
		deleteExpired: () => lucia.deleteExpiredSessions(),

		setCookie(cookies: Cookies, token: string): void {
			const c = lucia.createSessionCookie(token);
			cookies.set(c.name, c.value, { ...c.attributes, path: '/' });
		},

		clearCookie(cookies: Cookies): void {
			const c = lucia.createBlankSessionCookie();
			cookies.set(c.name, c.value, { ...c.attributes, path: '/' });
		}
	};
}

export type SessionManager = ReturnType<typeof createSessionManager>;
