// Checks an e-mail and password, with the per-account and per-address limits. Both kinds of
// wrong answer (unknown e-mail, wrong password) cost one argon2 verify and read the same.
import { users } from '$lib/server/db/users';
import { burnVerify, verifyPassword } from './password';
import { signInLimitsFromEnv } from './rate-limit';

export const WRONG_CREDENTIALS = 'E-mail or password is wrong';
export const TOO_MANY = 'Too many attempts. Wait a few minutes and try again.';

const limits = signInLimitsFromEnv(process.env);

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
	// Refused before any password work: a blocked caller learns nothing, not even "right".
	for (const [limiter, key] of [
		[limits.address, input.address],
		[limits.account, accountKey]
	] as const) {
		const verdict = limiter.check(key);
		if (!verdict.allowed) return { kind: 'limited', retryAfterSeconds: verdict.retryAfterSeconds };
	}

	const user = await users.findByEmail(accountKey);
	const ok = user ? await verifyPassword(user.passwordHash, input.password) : await burnVerify(input.password);
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
