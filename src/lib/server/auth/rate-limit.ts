// Counts failed sign-in attempts per key (an account's e-mail, a client address) in a sliding
// window. Kept in the server's memory: one adapter-node process serves the app, and a restart
// forgetting the counts only hands an attacker one more window.
export interface RateLimiterOptions {
	/** Failures allowed within the window; the next attempt is refused. */
	limit: number;
	windowMs: number;
	/** Injected for tests; milliseconds like Date.now. */
	now?: () => number;
	/** Bound on remembered keys, so a flood of made-up addresses cannot exhaust memory. */
	maxKeys?: number;
}

export interface Verdict {
	allowed: boolean;
	/** Whole seconds until the oldest counted failure leaves the window (0 when allowed). */
	retryAfterSeconds: number;
}

export class RateLimiter {
	readonly limit: number;
	readonly windowMs: number;
	private readonly now: () => number;
	private readonly maxKeys: number;
	// Per key, failure times oldest first; never longer than `limit`, older ones cannot matter.
	private readonly failures = new Map<string, number[]>();

	constructor(options: RateLimiterOptions) {
		if (!(options.limit >= 1) || !(options.windowMs > 0)) {
			throw new Error('RateLimiter needs limit >= 1 and windowMs > 0');
		}
		this.limit = Math.floor(options.limit);
		this.windowMs = options.windowMs;
		this.now = options.now ?? Date.now;
		this.maxKeys = options.maxKeys ?? 50_000;
	}

	private recent(key: string, at: number): number[] {
		const times = this.failures.get(key);
		if (!times) return [];
		const kept = times.filter((t) => at - t < this.windowMs);
		if (kept.length === 0) this.failures.delete(key);
		else if (kept.length !== times.length) this.failures.set(key, kept);
		return kept;
	}

	/** `inFlight`: attempts under way for this key whose outcome is not known yet; they count. */
	check(key: string, inFlight = 0): Verdict {
		const at = this.now();
		const times = this.recent(key, at);
		if (times.length + inFlight < this.limit) return { allowed: true, retryAfterSeconds: 0 };
		// Refused only because of attempts still being checked: those end within a second.
		if (times.length < this.limit) return { allowed: false, retryAfterSeconds: 1 };
		const freeAt = times[times.length - this.limit] + this.windowMs;
		return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((freeAt - at) / 1000)) };
	}

	fail(key: string): void {
		const at = this.now();
		const times = this.recent(key, at);
		times.push(at);
		if (times.length > this.limit) times.splice(0, times.length - this.limit);
		// Re-insert so Map order is "least recently failed first" for the eviction below.
		this.failures.delete(key);
		this.failures.set(key, times);
		if (this.failures.size > this.maxKeys) this.evict(at);
	}

	reset(key: string): void {
		this.failures.delete(key);
	}

	get size(): number {
		return this.failures.size;
	}

	private evict(at: number): void {
		for (const key of [...this.failures.keys()]) this.recent(key, at);
		for (const key of this.failures.keys()) {
			if (this.failures.size <= this.maxKeys) break;
			this.failures.delete(key);
		}
	}
}

function positiveInt(raw: string | undefined, fallback: number): number {
	const n = Number(raw);
	return Number.isInteger(n) && n > 0 ? n : fallback;
}

/** The sign-in limits from SIGNIN_* settings (defaults as in .env.example). */
export function signInLimitsFromEnv(env: Record<string, string | undefined>, now?: () => number) {
	const windowMs = positiveInt(env.SIGNIN_WINDOW_SECONDS, 900) * 1000;
	return {
		account: new RateLimiter({ limit: positiveInt(env.SIGNIN_ACCOUNT_LIMIT, 5), windowMs, now }),
		address: new RateLimiter({ limit: positiveInt(env.SIGNIN_ADDRESS_LIMIT, 20), windowMs, now })
	};
}
