// Checks an e-mail and password, with the per-account and per-address limits. Both kinds of
// wrong answer (unknown e-mail, wrong password) cost one argon2 verify and read the same.
import { users } from '$lib/server/db/users';
import { burnVerify, verifyPassword } from './password';
import { signInLimitsFromEnv } from './rate-limit';

export const WRONG_CREDENTIALS = 'E-mail or password is wrong';
export const TOO_MANY = 'Too many attempts. Wait a few minutes and try again.';

const limits = signInLimitsFromEnv(process.env);
/** Attempts being verified right now, per key (the limiters only hear of them afterwards). */
const inFlight = { address: new Map<string, number>(), account: new Map<string, number>() };

export type SignInResult =
	| { kind: 'ok'; userId: string }
	| { kind: 'wrong' }
	| { kind: 'limited'; retryAfterSeconds: number };

export async function checkCredentials(input: {
	email: string;
	password: string;
	address: string;
}): Promise<SignInResult> {
	const accountKey = input.email.trim().toLowerCase();
	const held = [
		[limits.address, inFlight.address, input.address],
		[limits.account, inFlight.account, accountKey]
	] as const;
	// Refused before any password work: a blocked caller learns nothing, not even "right".
	// Attempts still being verified count too, or parallel attempts would all pass the check.
	for (const [limiter, pending, key] of held) {
		const verdict = limiter.check(key, pending.get(key) ?? 0);
		if (!verdict.allowed) return { kind: 'limited', retryAfterSeconds: verdict.retryAfterSeconds };
	}
	for (const [, pending, key] of held) pending.set(key, (pending.get(key) ?? 0) + 1);

	let user: Awaited<ReturnType<typeof users.findByEmail>>;
	let ok: boolean;
	try {
		user = await users.findByEmail(accountKey);
		ok = user ? await verifyPassword(user.passwordHash, input.password) : await burnVerify(input.password);
	} finally {
		for (const [, pending, key] of held) {
			const n = (pending.get(key) ?? 1) - 1;
			if (n > 0) pending.set(key, n);
			else pending.delete(key);
		}
	}
	if (!user || !ok) {
		limits.account.fail(accountKey);
		limits.address.fail(input.address);
		return { kind: 'wrong' };
	}
	// Only the account's count is cleared: clearing the address's would let one known account
	// reset the limit for guessing at all the others from the same address.
	limits.account.reset(accountKey);
	return { kind: 'ok', userId: user.id };
}
