// The sliding-window estimate behind the shared rate limits. Values worked by hand from the
// definition (the usual two-window approximation: common practice, no published source).
import { describe, expect, it } from 'vitest';
import { estimate, verdict } from '$lib/server/limits/window';

describe('sliding-window rate limit arithmetic', () => {
	it('counts the previous window in proportion to its overlap', () => {
		// 30 s into a 60 s slot: half of the previous slot's 8 hits still count.
		expect(estimate({ current: 3, previous: 8, elapsedSeconds: 30, windowSeconds: 60 })).toBeCloseTo(7, 9);
		expect(estimate({ current: 3, previous: 8, elapsedSeconds: 0, windowSeconds: 60 })).toBeCloseTo(11, 9);
	});

	it('allows a counted hit up to the limit and refuses the one after', () => {
		const at = (current: number) => verdict({ current, previous: 0, elapsedSeconds: 10, windowSeconds: 60 }, 5, true);
		expect(at(5).allowed).toBe(true);
		expect(at(6).allowed).toBe(false);
		// peek asks about one more: with 4 counted, a fifth is allowed; with 5 it is not.
		expect(verdict({ current: 4, previous: 0, elapsedSeconds: 10, windowSeconds: 60 }, 5, false).allowed).toBe(true);
		expect(verdict({ current: 5, previous: 0, elapsedSeconds: 10, windowSeconds: 60 }, 5, false).allowed).toBe(false);
	});

	it('says how long until one more hit is allowed', () => {
		// 6 hits in this slot, limit 5, 10 s in: the slot ends in 50 s, then its share must fall
		// to 4/6, which takes a further 60 * (1 - 4/6) = 20 s: 70 s in all.
		expect(verdict({ current: 6, previous: 0, elapsedSeconds: 10, windowSeconds: 60 }, 5, true).retryAfterSeconds).toBe(70);
		// 2 now and 6 before, limit 5, 15 s in (estimate 2 + 4.5 = 6.5): the share must fall to
		// (4 - 2) / 6 = 1/3, at 40 s into the slot, 25 s from now.
		const v = verdict({ current: 2, previous: 6, elapsedSeconds: 15, windowSeconds: 60 }, 5, true);
		expect(v.allowed).toBe(false);
		expect(v.retryAfterSeconds).toBe(25);
		// An allowed hit waits for nothing.
		expect(verdict({ current: 1, previous: 0, elapsedSeconds: 1, windowSeconds: 60 }, 5, true).retryAfterSeconds).toBe(0);
	});

	it('waits at least a second and a full window when the limit is one', () => {
		const v = verdict({ current: 2, previous: 0, elapsedSeconds: 59.5, windowSeconds: 60 }, 1, true);
		// room 0: the current slot must end (0.5 s) and then leave the window entirely (60 s).
		expect(v.retryAfterSeconds).toBe(61);
	});
});
