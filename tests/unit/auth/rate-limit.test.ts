// The sign-in limiter with a hand-driven clock: N failures allowed per window, then refused
// until the oldest counted failure is older than the window.
import { describe, expect, it } from 'vitest';
import { RateLimiter, signInLimitsFromEnv } from '$lib/server/auth/rate-limit';

function clock(start = 1_000_000) {
	let t = start;
	return { now: () => t, advance: (ms: number) => (t += ms) };
}

describe('RateLimiter', () => {
	it('allows `limit` failures and refuses the next attempt', () => {
		const c = clock();
		const rl = new RateLimiter({ limit: 5, windowMs: 900_000, now: c.now });
		for (let i = 0; i < 5; i++) {
			expect(rl.check('ada@example.test').allowed).toBe(true);
			rl.fail('ada@example.test');
			c.advance(1000);
		}
		const v = rl.check('ada@example.test');
		expect(v.allowed).toBe(false);
		// Oldest failure at t0, window 900 s, now t0 + 5 s: free again in 895 s.
		expect(v.retryAfterSeconds).toBe(895);
	});

	it('counts keys apart', () => {
		const c = clock();
		const rl = new RateLimiter({ limit: 2, windowMs: 60_000, now: c.now });
		rl.fail('a');
		rl.fail('a');
		expect(rl.check('a').allowed).toBe(false);
		expect(rl.check('b').allowed).toBe(true);
	});

	it('slides: each failure leaves the count when it is a window old', () => {
		const c = clock();
		const rl = new RateLimiter({ limit: 3, windowMs: 60_000, now: c.now });
		rl.fail('k'); // t = 0
		c.advance(20_000);
		rl.fail('k'); // t = 20 s
		c.advance(20_000);
		rl.fail('k'); // t = 40 s
		expect(rl.check('k').allowed).toBe(false);
		c.advance(19_999); // t = 59.999 s: the first is still inside
		expect(rl.check('k').allowed).toBe(false);
		c.advance(1); // t = 60 s: the first has left
		expect(rl.check('k').allowed).toBe(true);
		rl.fail('k');
		expect(rl.check('k')).toEqual({ allowed: false, retryAfterSeconds: 20 });
	});

	it('forgets everything after a quiet window', () => {
		const c = clock();
		const rl = new RateLimiter({ limit: 1, windowMs: 1000, now: c.now });
		rl.fail('k');
		expect(rl.check('k').allowed).toBe(false);
		c.advance(1000);
		expect(rl.check('k').allowed).toBe(true);
		expect(rl.size).toBe(0);
	});

	it('reset clears one key only', () => {
		const rl = new RateLimiter({ limit: 1, windowMs: 1000, now: clock().now });
		rl.fail('a');
		rl.fail('b');
		rl.reset('a');
		expect(rl.check('a').allowed).toBe(true);
		expect(rl.check('b').allowed).toBe(false);
	});

	it('remembers at most maxKeys keys, dropping expired ones first, then the stalest', () => {
		const c = clock();
		const rl = new RateLimiter({ limit: 1, windowMs: 10_000, now: c.now, maxKeys: 3 });
		rl.fail('old');
		c.advance(10_000); // 'old' has expired
		rl.fail('a');
		rl.fail('b');
		rl.fail('c');
		expect(rl.size).toBe(3);
		expect(rl.check('a').allowed).toBe(false);
		rl.fail('d'); // over the bound with nothing expired: 'a' failed longest ago
		expect(rl.size).toBe(3);
		expect(rl.check('a').allowed).toBe(true);
		expect(rl.check('d').allowed).toBe(false);
	});

	it('refuses nonsense settings instead of never limiting', () => {
		expect(() => new RateLimiter({ limit: 0, windowMs: 1000 })).toThrow();
		expect(() => new RateLimiter({ limit: 5, windowMs: 0 })).toThrow();
		expect(() => new RateLimiter({ limit: Number.NaN, windowMs: 1000 })).toThrow();
	});
});

describe('signInLimitsFromEnv', () => {
	it('reads SIGNIN_* settings and falls back to the documented defaults on bad values', () => {
		const set = signInLimitsFromEnv({ SIGNIN_ACCOUNT_LIMIT: '3', SIGNIN_ADDRESS_LIMIT: '7', SIGNIN_WINDOW_SECONDS: '60' });
		expect([set.account.limit, set.address.limit, set.account.windowMs]).toEqual([3, 7, 60_000]);
		const bad = signInLimitsFromEnv({ SIGNIN_ACCOUNT_LIMIT: '-1', SIGNIN_ADDRESS_LIMIT: 'many', SIGNIN_WINDOW_SECONDS: '1.5' });
		// Defaults from .env.example: 5 per account, 20 per address, 900 s.
		expect([bad.account.limit, bad.address.limit, bad.address.windowMs]).toEqual([5, 20, 900_000]);
	});
});
