// Sessions and sign-in under pressure, and the security headers everywhere: a planted session
// is never adopted, an expired one is refused on the API and its cookie cleared, one near its
// end is renewed, sign-out everywhere ends every tablet's session at once, the rate limits
// hold against attempts made in parallel, a reset link works exactly once even when sent
// twenty times at once, and every page passes its own content security policy in Chromium.
import { createHash } from 'node:crypto';
import { chromium } from '@playwright/test';
import { afterAll, describe, expect, it } from 'vitest';
import { BASE, Client, closeTestDb, freshAddress, freshEmail, testDb, waitForMail } from '../helpers';
import { call, gameInMovePhase, person, PASSWORD, secondTablet } from './world';

const sha256hex = (s: string) => createHash('sha256').update(s).digest('hex');
afterAll(closeTestDb);

describe('sessions', () => {
	it('never adopts a planted session id: sign-in issues a new one, the planted one stays unknown', async () => {
		const p = await person('fixation');
		const c = new Client();
		const planted = 'a'.repeat(40);
		c.cookies.set('inchwarden_session', planted);
		const r = await call(c, 'POST', '/api/v1/session', { email: p.email, password: PASSWORD });
		expect(r.status).toBe(200);
		expect(c.session()).toBeDefined();
		expect(c.session()).not.toBe(planted);
		expect(await testDb()('sessions').where({ id: sha256hex(planted) }).first()).toBeUndefined();
		const attacker = new Client();
		attacker.cookies.set('inchwarden_session', planted);
		expect((await call(attacker, 'GET', '/api/v1/session')).status).toBe(401);
	});

	it('refuses an expired session on the API (401) and clears its cookie; renews one past half-life', async () => {
		const p = await person('expiry');
		const other = await secondTablet(p);
		const hash = (c: Client) => sha256hex(c.session()!);
		await testDb()('sessions').where({ id: hash(p.c) }).update({ expires_at: new Date(Date.now() - 1000) });
		const res = await p.c.send('GET', '/api/v1/session', undefined, { accept: 'application/json' });
		expect(res.status).toBe(401);
		expect(res.headers.getSetCookie().some((s) => /^inchwarden_session=;/.test(s) || /max-age=0/i.test(s))).toBe(true);
		// The other tablet's session, 20 days from its end, is moved forward and its cookie re-set.
		await testDb()('sessions').where({ id: hash(other) }).update({ expires_at: new Date(Date.now() + 10 * 86_400_000) });
		const renewed = await other.send('GET', '/api/v1/session', undefined, { accept: 'application/json' });
		expect(renewed.status).toBe(200);
		expect(renewed.headers.getSetCookie().some((s) => s.startsWith('inchwarden_session='))).toBe(true);
		const row = await testDb()('sessions').where({ id: hash(other) }).first();
		expect(row.expires_at.getTime()).toBeGreaterThan(Date.now() + 29 * 86_400_000);
	});

	it('sign-out everywhere ends the sessions of all five tablets at once, and a live stream’s next request', async () => {
		const p = await person('everywhere');
		const tablets = [p.c, ...(await Promise.all(Array.from({ length: 4 }, () => secondTablet(p))))];
		for (const t of tablets) expect((await call(t, 'GET', '/api/v1/session')).status).toBe(200);
		const out = await tablets[2].post('/sign-out', { scope: 'everywhere' });
		expect(out.status).toBe(303);
		const after = await Promise.all(tablets.map((t) => call(t, 'GET', '/api/v1/session')));
		expect(after.map((r) => r.status)).toEqual([401, 401, 401, 401, 401]);
		expect(await testDb()('sessions').where({ user_id: p.id })).toHaveLength(0);
	});
});

describe('rate limits under parallel attempts', () => {
	it('40 wrong passwords at once from 40 addresses: at most 5 are even checked, the rest 429, then the right one is 429 too', async () => {
		const p = await person('parallel-limit');
		const attempts = await Promise.all(Array.from({ length: 40 }, () => call(new Client(freshAddress()), 'POST', '/api/v1/session', { email: p.email, password: 'not the password at all' })));
		const counts = attempts.reduce<Record<number, number>>((m, r) => ({ ...m, [r.status]: (m[r.status] ?? 0) + 1 }), {});
		console.log(`parallel sign-in attempts: ${JSON.stringify(counts)}`);
		expect(Object.keys(counts).sort()).toEqual(['401', '429']);
		expect(counts[401]).toBeLessThanOrEqual(5);
		for (const r of attempts.filter((x) => x.status === 429)) expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
		expect((await call(new Client(freshAddress()), 'POST', '/api/v1/session', { email: p.email, password: PASSWORD })).status).toBe(429);
	});

	it('60 attempts at once from one address across 60 accounts: at most 20 are checked', async () => {
		const address = freshAddress();
		const attempts = await Promise.all(Array.from({ length: 60 }, (_, i) => call(new Client(address), 'POST', '/api/v1/session', { email: `nobody-${i}-${Date.now()}@example.test`, password: 'whatever it is' })));
		const checked = attempts.filter((r) => r.status === 401).length;
		expect(checked).toBeLessThanOrEqual(20);
		expect(attempts.filter((r) => r.status === 429).length).toBe(60 - checked);
	});
});

describe('password reset links', () => {
	it('twenty uses of one link at once: exactly one resets the password', async () => {
		const email = freshEmail('reset-race');
		await new Client().signUp(email, PASSWORD);
		expect((await new Client().post('/forgot-password', { email })).status).toBe(200);
		const [mail] = await waitForMail(email);
		const path = mail.text.match(/\/reset-password\/[a-z2-7]+/)![0];
		const tries = await Promise.all(Array.from({ length: 20 }, (_, i) => new Client().post(path, { password: `new password number ${i}`, confirm: `new password number ${i}` })));
		const won = tries.map((r, i) => ({ r, i })).filter(({ r }) => r.status === 303);
		expect(won).toHaveLength(1);
		expect(tries.filter((r) => r.status !== 303).every((r) => r.status === 400)).toBe(true);
		expect((await new Client().signIn(email, `new password number ${won[0].i}`)).status).toBe(303);
		const loser = (won[0].i + 1) % 20;
		expect((await new Client().signIn(email, `new password number ${loser}`)).status).toBe(400);
	});

	it('an expired link is refused and changes nothing', async () => {
		const email = freshEmail('reset-expired');
		await new Client().signUp(email, PASSWORD);
		await new Client().post('/forgot-password', { email });
		const [mail] = await waitForMail(email);
		const token = mail.text.match(/\/reset-password\/([a-z2-7]+)/)![1];
		await testDb()('password_resets').where({ token_hash: sha256hex(token) }).update({ expires_at: new Date(Date.now() - 1000) });
		expect((await new Client().post(`/reset-password/${token}`, { password: 'a late new password', confirm: 'a late new password' })).status).toBe(400);
		expect((await new Client().signIn(email, PASSWORD)).status).toBe(303);
	});
});

describe('security headers', () => {
	const csp = (h: Headers) => h.get('content-security-policy') ?? '';

	it('every page carries a CSP without inline scripts and with frame-ancestors none; pages and API forbid sniffing and framing', async () => {
		const p = await person('headers');
		for (const [c, path] of [
			[new Client(), '/sign-in'],
			[new Client(), '/'],
			[p.c, '/dashboard'],
			[p.c, '/games'],
			[p.c, '/layouts/new'],
			[p.c, '/rosters']
		] as const) {
			const res = await c.get(path);
			expect(res.status, path).toBe(200);
			const policy = csp(res.headers);
			expect(policy, path).toMatch(/frame-ancestors 'none'/);
			expect(policy, path).toMatch(/default-src 'self'/);
			const script = policy.split(';').map((d) => d.trim()).find((d) => d.startsWith('script-src'))!;
			expect(script, path).toMatch(/'nonce-[^']+'|'sha256-[^']+'/);
			expect(script, path).not.toMatch(/unsafe-inline|unsafe-eval/);
			expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
			expect(res.headers.get('x-frame-options'), path).toBe('DENY');
		}
		for (const [c, path] of [[new Client(), '/api/v1/session'], [p.c, '/api/v1/games']] as const) {
			const res = await c.send('GET', path, undefined, { accept: 'application/json' });
			expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
		}
	});

	it('Chromium loads the pages, the play screen with its canvas included, without one CSP violation', async () => {
		const a = await person('csp-a');
		const b = await person('csp-b');
		const game = await gameInMovePhase(a, b, 'CSP game');
		const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: ['--no-sandbox'] });
		try {
			const context = await browser.newContext({ viewport: { width: 1024, height: 768 }, extraHTTPHeaders: { 'x-forwarded-for': a.c.address } });
			await context.addCookies([{ name: 'inchwarden_session', value: a.c.session()!, url: BASE }]);
			const page = await context.newPage();
			const violations: string[] = [];
			let at = '';
			await page.exposeFunction('reportViolation', (v: string) => violations.push(`${at}: ${v}`));
			await page.addInitScript(() => {
				document.addEventListener('securitypolicyviolation', (e) => (window as unknown as { reportViolation: (s: string) => void }).reportViolation(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}`));
			});
			page.on('console', (m) => {
				if (/Content Security Policy/i.test(m.text())) violations.push(`${at}: ${m.text()}`);
			});
			for (const path of ['/dashboard', '/games', `/games/${game.id}`, `/games/${game.id}/replay`, '/layouts/new', '/rosters', '/clubs', '/events']) {
				at = path;
				const res = await page.goto(BASE + path, { waitUntil: 'networkidle' });
				expect(res?.status(), path).toBe(200);
				await page.waitForTimeout(200);
			}
			expect(violations).toEqual([]);
		} finally {
			await browser.close();
		}
	}, 60_000);
});
