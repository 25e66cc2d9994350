// Role checks for loads, actions and API routes. Pages and endpoints call these themselves:
// a layout's load does not run for form actions or API requests, so it cannot guard them.
import { error, redirect } from '@sveltejs/kit';
import type { User } from 'lucia';
import type { Role } from '$lib/schemas/auth';

export function hasRole(user: User | null | undefined, role: Role): boolean {
	return !!user && user.roles.includes(role);
}

/** Where a signed-out visitor is sent, carrying the page to come back to. */
export function signInUrl(url: URL): string {
	return `/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`;
}

/**
 * Only a same-site path may be a `next` target; anything else ("//evil", "https://…",
 * "/\\evil") falls back to the dashboard, so sign-in cannot be used as an open redirect.
 */
export function safeNext(next: string | null | undefined, fallback = '/dashboard'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
	return next;
}

/** The signed-in user; 401 otherwise, or a redirect to sign-in when `url` is given (pages). */
export function requireUser(locals: App.Locals, url?: URL): User {
	if (locals.user) return locals.user;
	if (url) redirect(303, signInUrl(url));
	error(401, 'Sign in first');
}

/** The signed-in user holding `role` (any of, for a list); 401 signed out, 403 without it. */
export function requireRole(locals: App.Locals, role: Role | readonly Role[], url?: URL): User {
	const user = requireUser(locals, url);
	const wanted = typeof role === 'string' ? [role] : role;
	if (!wanted.some((r) => hasRole(user, r))) error(403, 'You do not have the role this page needs');
	return user;
}
