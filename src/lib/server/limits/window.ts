// The arithmetic of a sliding-window counter, kept apart from the database so it can be tested
// by itself. Two fixed windows are kept per key; the previous one counts in proportion to how
// much of it still lies inside a window ending now (the usual sliding-window approximation).

export interface WindowCounts {
	/** Hits in the current slot (after this hit, when one was counted). */
	current: number;
	/** Hits in the slot before it. */
	previous: number;
	/** Seconds since the current slot began, 0 <= elapsed < window. */
	elapsedSeconds: number;
	windowSeconds: number;
}

export interface LimitVerdict {
	allowed: boolean;
	/** The estimated hits in the window ending now. */
	estimate: number;
	/** Whole seconds until one more hit would be allowed (0 when allowed). */
	retryAfterSeconds: number;
}

/** The estimate of hits in the last window: all of the current slot and the overlapping part of the previous. */
export function estimate(c: WindowCounts): number {
	const share = Math.max(0, 1 - c.elapsedSeconds / c.windowSeconds);
	return c.current + c.previous * share;
}

/**
 * Whether a hit keeps within `limit`: the estimate with that hit in it is at most `limit`.
 * `counted`: the counts already hold the hit (after `hit`); otherwise one more is asked about.
 */
export function verdict(c: WindowCounts, limit: number, counted: boolean): LimitVerdict {
	const est = estimate(c);
	const allowed = (counted ? est : est + 1) <= limit + 1e-9;
	if (allowed) return { allowed, estimate: est, retryAfterSeconds: 0 };
	// The next hit is allowed once the estimate before it has fallen to limit - 1.
	const room = limit - 1;
	const remaining = c.windowSeconds - c.elapsedSeconds;
	let wait: number;
	if (c.current > room) {
		// The current slot alone is over: wait for it to become the previous one, then for
		// its share to shrink enough.
		wait = remaining + c.windowSeconds * (1 - Math.max(0, room) / c.current);
	} else if (c.previous > 0) {
		// share must fall to (room - current) / previous.
		const share = (room - c.current) / c.previous;
		wait = c.windowSeconds * (1 - share) - c.elapsedSeconds;
	} else {
		wait = remaining;
	}
	// Rounded to the millisecond first, so that 25.000000001 s (float error) reads 25.
	return { allowed, estimate: est, retryAfterSeconds: Math.max(1, Math.ceil(Math.round(wait * 1000) / 1000)) };
}
