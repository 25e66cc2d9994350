// Role guards: 401 (or a sign-in redirect for pages) when signed out, 403 without the role,
// and a `next` target that can only be a path on this site.
import { describe, expect, it } from 'vitest';
import { isHttpError, isRedirect } from '@sveltejs/kit';
import type { User } from 'lucia';
import { hasRole, requireRole, requireUser, safeNext } from '$lib/server/auth/roles';

const player: User = { id: 'p', email: 'p@example.test', displayName: 'P', roles: ['player'] };
const judge: User = { id: 'j', email: 'j@example.test', displayName: 'J', roles: ['player', 'judge'] };
const locals = (user: User | null) => ({ user, session: null }) as App.Locals;

function thrown(f: () => unknown): unknown {
	try {
		f();
	} catch (e) {
		return e;
	}
	throw new Error('expected a throw');
}

describe('role guards', () => {
	it('answers 401 to a signed-out caller', () => {
		const e = thrown(() => requireRole(locals(null), 'judge'));
		expect(isHttpError(e, 401)).toBe(true);
	});

	it('sends a signed-out page visit to sign-in with the way back', () => {
		const e = thrown(() => requireUser(locals(null), new URL('http://x.test/admin/roles?q=1')));
		expect(isRedirect(e) && e.status === 303 && e.location).toBe('/sign-in?next=%2Fadmin%2Froles%3Fq%3D1');
	});

	it('answers 403 to a signed-in user without the role', () => {
		const e = thrown(() => requireRole(locals(player), 'admin'));
		expect(isHttpError(e, 403)).toBe(true);
	});

	it('lets the holder of the role (or of any of a list) through', () => {
		expect(requireRole(locals(judge), 'judge')).toBe(judge);
		expect(requireRole(locals(judge), ['organiser', 'judge'])).toBe(judge);
		expect(isHttpError(thrown(() => requireRole(locals(judge), ['organiser', 'admin'])), 403)).toBe(true);
		expect(hasRole(player, 'player')).toBe(true);
		expect(hasRole(null, 'player')).toBe(false);
	});
});

describe('safeNext', () => {
	it('keeps same-site paths and refuses everything else', () => {
		expect(safeNext('/games/3?turn=2')).toBe('/games/3?turn=2');
		for (const bad of [null, '', 'games', '//evil.example', '/\\evil.example', 'https://evil.example/', 'javascript:alert(1)']) {
			expect(safeNext(bad), String(bad)).toBe('/dashboard');
		}
	});
});
