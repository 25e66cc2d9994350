// Session validation on Lucia over our adapter, with an in-memory store standing in for the
// sessions table: tokens stay in the cookie, hashes in the store, expiry renews at half-life.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Cookies } from '@sveltejs/kit';
import { createAdapter, type SessionStore } from '$lib/server/auth/adapter';
import { cookieSecure, createSessionManager, SESSION_COOKIE } from '$lib/server/auth/session';
import { hashToken } from '$lib/server/auth/token';
import type { SessionRow } from '$lib/server/db/sessions';

const DAY = 24 * 60 * 60 * 1000;
const START = new Date('2027-03-01T12:00:00Z');

function memoryStore() {
	const users = new Map([
		['u1', { id: 'u1', email: 'ada@example.test', displayName: 'Ada', roles: ['judge'] }],
		['u2', { id: 'u2', email: 'bo@example.test', displayName: 'Bo', roles: [] as string[] }]
	]);
	const rows = new Map<string, SessionRow>();
	const calls: string[] = [];
	const store: SessionStore = {
		async findWithUser(id) {
			calls.push(`find ${id}`);
			const s = rows.get(id);
			const u = s && users.get(s.userId);
			return s && u ? { session: { ...s }, user: u } : null;
		},
		async listForUser(userId) {
			return [...rows.values()].filter((r) => r.userId === userId);
		},
		async add(s) {
			rows.set(s.id, { ...s });
		},
		async updateExpiry(id, expiresAt) {
			const s = rows.get(id);
			if (s) s.expiresAt = expiresAt;
		},
		async remove(id) {
			rows.delete(id);
		},
		async removeForUser(userId) {
			for (const [id, r] of rows) if (r.userId === userId) rows.delete(id);
		},
		async removeExpired() {
			for (const [id, r] of rows) if (r.expiresAt.getTime() <= Date.now()) rows.delete(id);
		}
	};
	return { store, rows, calls };
}

let mem: ReturnType<typeof memoryStore>;
let auth: ReturnType<typeof createSessionManager>;

beforeEach(() => {
	vi.useFakeTimers({ toFake: ['Date'] });
	vi.setSystemTime(START);
	mem = memoryStore();
	auth = createSessionManager(createAdapter(mem.store), { secure: true });
});
afterEach(() => vi.useRealTimers());

describe('sessions', () => {
	it('stores the hash of the token, never the token', async () => {
		const { token, session } = await auth.create('u1');
		expect(session.id).toBe(hashToken(token));
		expect([...mem.rows.keys()]).toEqual([hashToken(token)]);
		expect(mem.rows.has(token)).toBe(false);
		expect(mem.rows.get(session.id)!.expiresAt.getTime()).toBe(START.getTime() + 30 * DAY);
	});

	it('validates the cookie token and loads the user with the implicit player role', async () => {
		const { token } = await auth.create('u1');
		const { user, session } = await auth.validate(token);
		expect(user).toEqual({ id: 'u1', email: 'ada@example.test', displayName: 'Ada', roles: ['player', 'judge'] });
		expect(session?.fresh).toBe(false);
	});

	it('does not accept the stored hash itself as a cookie', async () => {
		const { session } = await auth.create('u1');
		expect((await auth.validate(session.id)).user).toBeNull();
	});

	it('refuses an unknown token, and junk without asking the store', async () => {
		await auth.create('u1');
		expect((await auth.validate('a'.repeat(32))).session).toBeNull();
		const before = mem.calls.length;
		for (const junk of [undefined, null, '', 'x', 'A'.repeat(32), '../../etc/passwd']) {
			expect((await auth.validate(junk)).session).toBeNull();
		}
		expect(mem.calls.length).toBe(before);
	});

	it('gives every sign-in a new session id', async () => {
		const a = await auth.create('u1');
		const b = await auth.create('u1');
		expect(a.token).not.toBe(b.token);
		expect(a.session.id).not.toBe(b.session.id);
		expect(mem.rows.size).toBe(2);
	});

	it('keeps the expiry during the first half of the 30 days', async () => {
		const { token, session } = await auth.create('u1');
		vi.setSystemTime(START.getTime() + 14 * DAY);
		const v = await auth.validate(token);
		expect(v.session?.fresh).toBe(false);
		expect(v.session?.expiresAt.getTime()).toBe(session.expiresAt.getTime());
	});

	it('renews to a full 30 days once half is gone, in the store too', async () => {
		const { token } = await auth.create('u1');
		const at = START.getTime() + 16 * DAY;
		vi.setSystemTime(at);
		const v = await auth.validate(token);
		expect(v.session?.fresh).toBe(true);
		expect(v.session?.expiresAt.getTime()).toBe(at + 30 * DAY);
		expect(mem.rows.get(hashToken(token))!.expiresAt.getTime()).toBe(at + 30 * DAY);
	});

	it('refuses and deletes an expired session', async () => {
		const { token } = await auth.create('u1');
		vi.setSystemTime(START.getTime() + 30 * DAY + 1000);
		expect((await auth.validate(token)).user).toBeNull();
		expect(mem.rows.size).toBe(0);
	});

	it('signs out one session, or all of a user', async () => {
		const a = await auth.create('u1');
		const b = await auth.create('u1');
		const c = await auth.create('u2');
		await auth.invalidate(a.session.id);
		expect((await auth.validate(a.token)).user).toBeNull();
		expect((await auth.validate(b.token)).user?.id).toBe('u1');
		await auth.invalidateAll('u1');
		expect((await auth.validate(b.token)).user).toBeNull();
		expect((await auth.validate(c.token)).user?.id).toBe('u2');
	});
});

describe('the session cookie', () => {
	function fakeCookies() {
		const set: { name: string; value: string; opts: Record<string, unknown> }[] = [];
		const cookies = {
			set: (name: string, value: string, opts: Record<string, unknown>) => set.push({ name, value, opts })
		} as unknown as Cookies;
		return { cookies, set };
	}

	it('carries the token, httpOnly, SameSite=Lax, path /, Secure, for 30 days', () => {
		const { cookies, set } = fakeCookies();
		auth.setCookie(cookies, 'tok');
		expect(set).toHaveLength(1);
		expect(set[0]).toMatchObject({
			name: SESSION_COOKIE,
			value: 'tok',
			opts: { httpOnly: true, sameSite: 'lax', path: '/', secure: true, maxAge: 30 * 24 * 60 * 60 }
		});
		expect(SESSION_COOKIE).toBe('inchwarden_session');
	});

	it('is cleared with an empty value that expires at once', () => {
		const { cookies, set } = fakeCookies();
		auth.clearCookie(cookies);
		expect(set[0]).toMatchObject({ name: SESSION_COOKIE, value: '', opts: { maxAge: 0, path: '/' } });
	});

	it('is Secure everywhere except plain http on loopback', () => {
		expect(cookieSecure('http://127.0.0.1:3000')).toBe(false);
		expect(cookieSecure('http://localhost:5173')).toBe(false);
		expect(cookieSecure('http://[::1]:3000')).toBe(false);
		expect(cookieSecure('https://127.0.0.1')).toBe(true);
		expect(cookieSecure('https://inchwarden.example')).toBe(true);
		expect(cookieSecure('http://inchwarden.example')).toBe(true);
		expect(cookieSecure('http://localhost.example.com')).toBe(true);
		expect(cookieSecure(undefined)).toBe(true);
		expect(cookieSecure('not a url')).toBe(true);
	});
});
