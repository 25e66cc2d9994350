// Password reset end to end: the form, the mail caught by the fake SMTP server, the link,
// the new password; links are stored hashed, work once, expire, and end every session.
import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { alertText, BASE, Client, closeTestDb, freshEmail, statusText, testDb, waitForMail } from '../helpers';

const sha256hex = (s: string) => createHash('sha256').update(s).digest('hex');
const OLD = 'the old password';
const NEW = 'the brand new password';

afterAll(closeTestDb);

function linkIn(text: string): { path: string; token: string } {
	const m = text.match(new RegExp(`${BASE.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(/reset-password/([a-z2-7]{52}))`));
	if (!m) throw new Error(`no reset link in:\n${text}`);
	return { path: m[1], token: m[2] };
}

async function askForLink(email: string, already = 0) {
	const res = await new Client().post('/forgot-password', { email });
	expect(res.status).toBe(200);
	const mails = await waitForMail(email, already + 1);
	return { notice: statusText(await res.text()), mail: mails[0], ...linkIn(mails[0].text) };
}

describe('password reset', () => {
	it('resets the password through the e-mailed link and signs the account out everywhere', async () => {
		const email = freshEmail('reset');
		const owner = new Client();
		await owner.signUp(email, OLD);
		expect((await owner.get('/dashboard')).status).toBe(200);

		const { notice, mail, path, token } = await askForLink(email);
		expect(notice).toBe(`If an account exists for ${email}, we sent a link to it. Check your inbox.`);
		expect(mail.subject).toBe('Reset your Inchwarden password');
		expect(mail.to).toEqual([email]);

		// Only the hash of the token is stored.
		const db = testDb();
		expect(await db('password_resets').where({ token_hash: token }).first()).toBeUndefined();
		expect(await db('password_resets').where({ token_hash: sha256hex(token) }).first()).toBeDefined();

		const visitor = new Client();
		const form = await visitor.get(path);
		expect(form.status).toBe(200);
		const html = await form.text();
		expect(html).toContain('New password');
		expect(alertText(html)).toBeNull();

		const done = await visitor.post(path, { password: NEW, confirm: NEW });
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/sign-in?reset');

		// The session that was open before the reset is gone.
		expect((await owner.get('/dashboard')).status).toBe(303);
		expect((await new Client().signIn(email, OLD)).status).toBe(400);
		expect((await new Client().signIn(email, NEW)).status).toBe(303);
	});

	it('answers the same for an unknown e-mail and sends nothing', async () => {
		const known = freshEmail('known');
		await new Client().signUp(known, OLD);
		const unknown = freshEmail('unknown');
		const a = await new Client().post('/forgot-password', { email: known });
		const b = await new Client().post('/forgot-password', { email: unknown });
		expect([a.status, b.status]).toEqual([200, 200]);
		expect(statusText(await b.text())).toBe(statusText(await a.text())!.replace(known, unknown));
		await waitForMail(known);
		const all = (await (await fetch(`${process.env.FAKE_SMTP_API ?? 'http://127.0.0.1:2580'}/messages`)).json()) as { to: string[] }[];
		expect(all.some((m) => m.to.includes(unknown))).toBe(false);
	});

	it('works once: a used link is refused', async () => {
		const email = freshEmail('once');
		await new Client().signUp(email, OLD);
		const { path } = await askForLink(email);
		const c = new Client();
		expect((await c.post(path, { password: NEW, confirm: NEW })).status).toBe(303);

		const again = await c.post(path, { password: 'a third password', confirm: 'a third password' });
		expect(again.status).toBe(400);
		expect(alertText(await again.text())).toMatch(/expired or was already used/);
		expect(alertText(await (await c.get(path)).text())).toMatch(/expired or was already used/);
		expect((await new Client().signIn(email, 'a third password')).status).toBe(400);
		expect((await new Client().signIn(email, NEW)).status).toBe(303);
	});

	it('a reset spends the account\'s other outstanding links too', async () => {
		const email = freshEmail('others');
		await new Client().signUp(email, OLD);
		const first = await askForLink(email);
		const second = await askForLink(email, 1);
		expect(second.token).not.toBe(first.token);
		expect((await new Client().post(second.path, { password: NEW, confirm: NEW })).status).toBe(303);
		expect((await new Client().post(first.path, { password: 'other password!', confirm: 'other password!' })).status).toBe(400);
	});

	it('refuses an expired link', async () => {
		const email = freshEmail('expired');
		await new Client().signUp(email, OLD);
		const { path, token } = await askForLink(email);
		await testDb()('password_resets')
			.where({ token_hash: sha256hex(token) })
			.update({ expires_at: new Date(Date.now() - 1000) });
		const c = new Client();
		expect(alertText(await (await c.get(path)).text())).toMatch(/expired or was already used/);
		const res = await c.post(path, { password: NEW, confirm: NEW });
		expect(res.status).toBe(400);
		expect((await new Client().signIn(email, OLD)).status).toBe(303);
	});

	it('sets the expiry RESET_TOKEN_MINUTES ahead', async () => {
		const email = freshEmail('lifetime');
		await new Client().signUp(email, OLD);
		const { token } = await askForLink(email);
		const row = await testDb()('password_resets').where({ token_hash: sha256hex(token) }).first();
		const minutes = (new Date(row.expires_at).getTime() - Date.now()) / 60_000;
		const expected = Number(process.env.RESET_TOKEN_MINUTES ?? 30);
		expect(minutes).toBeGreaterThan(expected - 1);
		expect(minutes).toBeLessThanOrEqual(expected);
	});

	it('checks the new password and the link without a 500', async () => {
		const email = freshEmail('checks');
		await new Client().signUp(email, OLD);
		const { path } = await askForLink(email);
		const c = new Client();
		const short = await c.post(path, { password: 'short', confirm: 'short' });
		expect(short.status).toBe(400);
		expect(await short.text()).toContain('The password needs at least 10 characters');
		const differ = await c.post(path, { password: NEW, confirm: NEW + '!' });
		expect(differ.status).toBe(400);
		expect(await differ.text()).toContain('The two passwords differ');
		// The failed tries did not spend the link.
		expect((await c.post(path, { password: NEW, confirm: NEW })).status).toBe(303);

		for (const junk of ['abc', 'A'.repeat(52), '%27%3B--']) {
			const res = await c.get(`/reset-password/${junk}`);
			expect(res.status, junk).toBe(200);
			expect(alertText(await res.text())).toMatch(/expired or was already used/);
			expect((await c.post(`/reset-password/${junk}`, { password: NEW, confirm: NEW })).status).toBe(400);
		}
		expect((await c.post('/forgot-password', { email: 'not an address' })).status).toBe(400);
	});
});
