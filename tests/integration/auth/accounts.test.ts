// Accounts over real HTTP against the built app and its PostgreSQL: sign-up, sign-in, the
// guarded area, sign-out, and what the session cookie and the sessions table hold.
import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { alertText, BASE, Client, closeTestDb, freshEmail, testDb } from '../helpers';

const sha256hex = (s: string) => createHash('sha256').update(s).digest('hex');
const PASSWORD = 'long enough password';

afterAll(closeTestDb);

describe('sign-up, sign-in, guarded page, sign-out', () => {
	it('walks the whole path', async () => {
		const email = freshEmail('walk');
		const signup = await new Client().signUp(email, PASSWORD, 'Walker');
		expect(signup.status).toBe(303);
		expect(signup.headers.get('location')).toBe('/dashboard');

		const c = new Client();
		const before = await c.get('/dashboard');
		expect(before.status).toBe(303);
		expect(before.headers.get('location')).toBe('/sign-in?next=%2Fdashboard');

		const signin = await c.signIn(email, PASSWORD);
		expect(signin.status).toBe(303);
		expect(signin.headers.get('location')).toBe('/dashboard');
		expect(c.session()).toMatch(/^[a-z2-7]{32}$/);

		const dash = await c.get('/dashboard');
		expect(dash.status).toBe(200);
		expect(await dash.text()).toContain('Walker');

		const token = c.session()!;
		const out = await c.post('/sign-out', {});
		expect(out.status).toBe(303);
		expect(out.headers.get('location')).toBe('/sign-in?signed-out');
		expect(c.session()).toBeUndefined();
		expect(await testDb()('sessions').where({ id: sha256hex(token) }).first()).toBeUndefined();

		// The old token is dead even if someone kept a copy of the cookie.
		const replay = new Client();
		replay.cookies.set('inchwarden_session', token);
		const after = await replay.get('/dashboard');
		expect(after.status).toBe(303);
		expect(after.headers.get('location')).toMatch(/^\/sign-in/);
	});

	it('comes back to the page asked for after sign-in, but never to another site', async () => {
		const email = freshEmail('next');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		const res = await c.post('/sign-in?next=%2Fadmin%2Froles', { email, password: PASSWORD, next: '/admin/roles' });
		expect(res.headers.get('location')).toBe('/admin/roles');
		const evil = await new Client().post('/sign-in', { email, password: PASSWORD, next: '//evil.example/x' });
		expect(evil.headers.get('location')).toBe('/dashboard');
	});
});

describe('sign-up refusals', () => {
	it('refuses a second account for the same e-mail, whatever its case', async () => {
		const email = freshEmail('dup');
		expect((await new Client().signUp(email, PASSWORD)).status).toBe(303);
		const again = await new Client().signUp(email.toUpperCase(), PASSWORD);
		expect(again.status).toBe(400);
		expect(await again.text()).toContain('an account with this e-mail already exists');
		const rows = await testDb()('users').whereRaw('lower(email) = lower(?)', [email]);
		expect(rows).toHaveLength(1);
	});

	it('refuses a password under 10 characters and creates nothing', async () => {
		const email = freshEmail('short');
		const res = await new Client().signUp(email, '123456789');
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('The password needs at least 10 characters');
		expect(await testDb()('users').whereRaw('lower(email) = lower(?)', [email]).first()).toBeUndefined();
	});

	it('answers 400, never 500, to a malformed or empty form', async () => {
		const c = new Client();
		expect((await c.post('/sign-up', {})).status).toBe(400);
		expect((await c.post('/sign-up', { email: 'not-an-address', displayName: 'x', password: PASSWORD })).status).toBe(400);
		const json = await c.send('POST', '/sign-up', '{"email":1}', { 'content-type': 'application/json' });
		expect(json.status).toBeGreaterThanOrEqual(400);
		expect(json.status).toBeLessThan(500);
	});
});

describe('wrong credentials', () => {
	it('says the same for a wrong password and an unknown e-mail', async () => {
		const email = freshEmail('wrong');
		await new Client().signUp(email, PASSWORD);

		const wrongPassword = await new Client().signIn(email, 'not the password');
		const unknownEmail = await new Client().signIn(freshEmail('nobody'), 'not the password');
		expect(wrongPassword.status).toBe(400);
		expect(unknownEmail.status).toBe(400);
		const a = alertText(await wrongPassword.text());
		const b = alertText(await unknownEmail.text());
		expect(a).toBe('E-mail or password is wrong');
		expect(b).toBe(a);
		expect(wrongPassword.headers.getSetCookie()).toEqual([]);
	});

	it('gives the JSON sign-in the same generic 401', async () => {
		const email = freshEmail('jsonwrong');
		await new Client().signUp(email, PASSWORD);
		const headers = { 'content-type': 'application/json' };
		const a = await new Client().send('POST', '/api/v1/session', JSON.stringify({ email, password: 'nope nope nope' }), headers);
		const b = await new Client().send('POST', '/api/v1/session', JSON.stringify({ email: freshEmail('x'), password: 'nope' }), headers);
		expect([a.status, b.status]).toEqual([401, 401]);
		expect(await a.json()).toEqual(await b.json());
		const bad = await new Client().send('POST', '/api/v1/session', '{not json', headers);
		expect(bad.status).toBe(400);
	});
});

describe('the session cookie and the sessions table', () => {
	it('sets an httpOnly, SameSite=Lax, path-wide cookie for 30 days, not Secure on http loopback', async () => {
		const email = freshEmail('cookie');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		await c.signIn(email, PASSWORD);
		const cookie = c.setCookies.find((s) => s.name === 'inchwarden_session')!;
		expect(cookie.value).toMatch(/^[a-z2-7]{32}$/);
		expect(cookie.attributes.httponly).toBe(true);
		expect(String(cookie.attributes.samesite).toLowerCase()).toBe('lax');
		expect(cookie.attributes.path).toBe('/');
		expect(cookie.attributes['max-age']).toBe(String(30 * 24 * 60 * 60));
		// The test server's ORIGIN is http://127.0.0.1:…; anywhere else the cookie is Secure.
		expect(new URL(BASE).protocol).toBe('http:');
		expect(cookie.attributes.secure).toBeUndefined();
	});

	it('stores only the SHA-256 of the token, with a 30-day expiry', async () => {
		const email = freshEmail('stored');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		await c.signIn(email, PASSWORD);
		const token = c.session()!;
		const db = testDb();
		expect(await db('sessions').where({ id: token }).first()).toBeUndefined();
		const row = await db('sessions').where({ id: sha256hex(token) }).first();
		expect(row).toBeDefined();
		const days = (new Date(row.expires_at).getTime() - Date.now()) / 86_400_000;
		expect(days).toBeGreaterThan(29.9);
		expect(days).toBeLessThanOrEqual(30);
	});

	it('renews the session and re-sets the cookie once half of it is gone', async () => {
		const email = freshEmail('renew');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		await c.signIn(email, PASSWORD);
		const id = sha256hex(c.session()!);
		const db = testDb();
		await db('sessions').where({ id }).update({ expires_at: new Date(Date.now() + 10 * 86_400_000) });
		const before = c.setCookies.length;
		expect((await c.get('/dashboard')).status).toBe(200);
		const renewed = c.setCookies.slice(before).find((s) => s.name === 'inchwarden_session');
		expect(renewed?.attributes['max-age']).toBe(String(30 * 24 * 60 * 60));
		const row = await db('sessions').where({ id }).first();
		expect((new Date(row.expires_at).getTime() - Date.now()) / 86_400_000).toBeGreaterThan(29.9);
	});

	it('refuses an expired session', async () => {
		const email = freshEmail('expired');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		await c.signIn(email, PASSWORD);
		await testDb()('sessions').where({ id: sha256hex(c.session()!) }).update({ expires_at: new Date(Date.now() - 1000) });
		expect((await c.get('/dashboard')).status).toBe(303);
	});

	it('issues a new session id at sign-in and drops the one the browser came with', async () => {
		const email = freshEmail('fixation');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		await c.signIn(email, PASSWORD);
		const first = c.session()!;
		await c.signIn(email, PASSWORD); // signed in already: the form posts anyway
		const second = c.session()!;
		expect(second).not.toBe(first);
		expect(await testDb()('sessions').where({ id: sha256hex(first) }).first()).toBeUndefined();
	});

	it('"sign out everywhere" ends every session of the account', async () => {
		const email = freshEmail('everywhere');
		await new Client().signUp(email, PASSWORD);
		const tablet = new Client();
		const phone = new Client();
		await tablet.signIn(email, PASSWORD);
		await phone.signIn(email, PASSWORD);
		expect((await phone.get('/dashboard')).status).toBe(200);
		expect((await tablet.post('/sign-out', { scope: 'everywhere' })).status).toBe(303);
		expect((await phone.get('/dashboard')).status).toBe(303);
		const user = await testDb()('users').whereRaw('lower(email) = lower(?)', [email]).first();
		expect(await testDb()('sessions').where({ user_id: user.id })).toHaveLength(0);
	});

	it('ignores and clears a junk cookie', async () => {
		const c = new Client();
		c.cookies.set('inchwarden_session', "'; select 1; --");
		const res = await c.get('/dashboard');
		expect(res.status).toBe(303);
		expect(c.session()).toBeUndefined();
	});
});

describe('security headers', () => {
	it('forbids framing and sniffing and keeps referrers on the site', async () => {
		const res = await new Client().get('/sign-in');
		expect(res.status).toBe(200);
		expect(res.headers.get('x-frame-options')).toBe('DENY');
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('referrer-policy')).toBe('same-origin');
	});
});
