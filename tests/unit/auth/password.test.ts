// Password hashing: argon2id at the OWASP minimum, salted, and a verify that never throws.
import { describe, expect, it } from 'vitest';
import { burnVerify, hashPassword, verifyPassword } from '$lib/server/auth/password';

describe('password hashing', () => {
	it('makes an argon2id hash in PHC form with 19 MiB, 2 passes and 1 lane', async () => {
		const h = await hashPassword('correct horse battery');
		// PHC string format of the argon2 reference implementation: $argon2id$v=19$m=…,t=…,p=…$salt$hash
		expect(h.startsWith('$argon2id$')).toBe(true);
		expect(h).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]{43}$/);
	});

	it('verifies the right password and refuses a wrong one', async () => {
		const h = await hashPassword('correct horse battery');
		expect(await verifyPassword(h, 'correct horse battery')).toBe(true);
		expect(await verifyPassword(h, 'correct horse batterY')).toBe(false);
		expect(await verifyPassword(h, '')).toBe(false);
	});

	it('salts every hash, so the same password hashes differently', async () => {
		const [a, b] = await Promise.all([hashPassword('same password'), hashPassword('same password')]);
		expect(a).not.toBe(b);
		expect(await verifyPassword(b, 'same password')).toBe(true);
	});

	it('answers false, not an exception, for a stored value that is no argon2 hash', async () => {
		expect(await verifyPassword('not-a-hash', 'anything')).toBe(false);
		expect(await verifyPassword('', 'anything')).toBe(false);
	});

	it('spends about as long on an unknown account as on a real verify', async () => {
		const h = await hashPassword('a real password');
		await burnVerify('warm-up'); // the first call also makes the dummy hash
		const median = async (f: () => Promise<unknown>) => {
			const times: number[] = [];
			for (let i = 0; i < 5; i++) {
				const t0 = performance.now();
				await f();
				times.push(performance.now() - t0);
			}
			return times.sort((x, y) => x - y)[2];
		};
		const real = await median(() => verifyPassword(h, 'a wrong password'));
		const burned = await median(() => burnVerify('a wrong password'));
		expect(await burnVerify('a real password')).toBe(false);
		// Same parameters, so the same cost; the wide band only absorbs noise from a busy
		// machine. A shortcut that skipped the verify would take well under a millisecond.
		expect(burned).toBeGreaterThan(real * 0.33);
		expect(burned).toBeLessThan(real * 3);
	});
});
