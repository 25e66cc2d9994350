// Sign-in limits over real HTTP: per account (SIGNIN_ACCOUNT_LIMIT, 5 by default) across
// addresses, and per address (SIGNIN_ADDRESS_LIMIT, 20) across accounts. Each test uses its
// own made-up x-forwarded-for addresses, which the test server trusts.
import { describe, expect, it } from 'vitest';
import { alertText, Client, freshAddress, freshEmail } from '../helpers';

const ACCOUNT_LIMIT = Number(process.env.SIGNIN_ACCOUNT_LIMIT ?? 5);
const ADDRESS_LIMIT = Number(process.env.SIGNIN_ADDRESS_LIMIT ?? 20);
const PASSWORD = 'long enough password';

describe('sign-in rate limits', () => {
	it('refuses an account with 429 after too many failures, even with the right password from elsewhere', async () => {
		const email = freshEmail('limited');
		await new Client().signUp(email, PASSWORD);
		const guesser = new Client();
		for (let i = 0; i < ACCOUNT_LIMIT; i++) {
			const res = await guesser.signIn(email, `guess number ${i}`);
			expect(res.status, `attempt ${i + 1}`).toBe(400);
		}
		const owner = new Client(freshAddress());
		const refused = await owner.signIn(email, PASSWORD);
		expect(refused.status).toBe(429);
		expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
		expect(alertText(await refused.text())).toMatch(/^Too many attempts/);
		expect(owner.session()).toBeUndefined();
		// Another account from the guesser's address is not affected by this account's count.
		const other = freshEmail('unaffected');
		await new Client().signUp(other, PASSWORD);
		expect((await guesser.signIn(other, PASSWORD)).status).toBe(303);
	});

	it('counts the e-mail without regard to case', async () => {
		const email = freshEmail('casing');
		await new Client().signUp(email, PASSWORD);
		for (let i = 0; i < ACCOUNT_LIMIT; i++) {
			await new Client().signIn(i % 2 ? email.toUpperCase() : email, 'wrong wrong');
		}
		expect((await new Client().signIn(email, PASSWORD)).status).toBe(429);
	});

	it('refuses an address with 429 after too many failures across many e-mails', async () => {
		const sprayer = new Client();
		for (let i = 0; i < ADDRESS_LIMIT; i++) {
			const res = await sprayer.signIn(freshEmail('spray'), 'some password');
			expect(res.status, `attempt ${i + 1}`).toBe(400);
		}
		const email = freshEmail('victim');
		await new Client().signUp(email, PASSWORD);
		expect((await sprayer.signIn(email, PASSWORD)).status).toBe(429);
		// The same account signs in fine from another address.
		expect((await new Client().signIn(email, PASSWORD)).status).toBe(303);
	});

	it('answers 429 on the JSON sign-in too', async () => {
		const email = freshEmail('jsonlimit');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		const body = JSON.stringify({ email, password: 'wrong password' });
		const headers = { 'content-type': 'application/json' };
		for (let i = 0; i < ACCOUNT_LIMIT; i++) expect((await c.send('POST', '/api/v1/session', body, headers)).status).toBe(401);
		const res = await c.send('POST', '/api/v1/session', JSON.stringify({ email, password: PASSWORD }), headers);
		expect(res.status).toBe(429);
		expect((await res.json()).error.message).toMatch(/^Too many attempts/);
	});

	it('clears the account count after a successful sign-in', async () => {
		const email = freshEmail('forgiven');
		await new Client().signUp(email, PASSWORD);
		const c = new Client();
		for (let i = 0; i < ACCOUNT_LIMIT - 1; i++) await c.signIn(email, 'wrong wrong');
		expect((await c.signIn(email, PASSWORD)).status).toBe(303);
		c.cookies.clear(); // signed in, the sign-in page would send it on to the dashboard
		for (let i = 0; i < ACCOUNT_LIMIT - 1; i++) expect((await c.signIn(email, 'wrong again')).status).toBe(400);
		expect((await c.signIn(email, PASSWORD)).status).toBe(303);
	});
});
