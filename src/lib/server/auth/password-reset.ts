// Password reset by e-mail: single-use links that expire, stored as hashes. Asking for a link
// answers the same whether or not the account exists, and does the mail work off the
// request's path so the response time does not tell either.
import { db } from '$lib/server/db';
import { users } from '$lib/server/db/users';
import { passwordResets } from '$lib/server/db/password-resets';
import { sessions } from '$lib/server/db/sessions';
import { mail } from '$lib/server/mail';
import { generateResetToken, hashToken, isResetTokenShape } from './token';
import { hashPassword } from './password';
import { RateLimiter } from './rate-limit';

const minutes = Number(process.env.RESET_TOKEN_MINUTES);
export const RESET_TOKEN_MINUTES = Number.isInteger(minutes) && minutes > 0 ? minutes : 30;

// At most a few links per account per hour, so the form cannot be used to flood an inbox.
// Refusals are silent: the page answers the same either way.
const mailLimit = new RateLimiter({ limit: 5, windowMs: 60 * 60 * 1000 });

function origin(): string {
	return (process.env.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

async function issue(email: string): Promise<void> {
	const user = await users.findByEmail(email);
	if (!user) return;
	const key = user.id;
	if (!mailLimit.check(key).allowed) return;
	mailLimit.fail(key);

	const token = generateResetToken();
	await passwordResets.add({
		tokenHash: hashToken(token),
		userId: user.id,
		expiresAt: new Date(Date.now() + RESET_TOKEN_MINUTES * 60 * 1000)
	});
	const link = `${origin()}/reset-password/${token}`;
	await mail.send({
		to: user.email,
		subject: 'Reset your Inchwarden password',
		text:
			`Hello ${user.displayName},\n\n` +
			`Someone asked to reset the password of your Inchwarden account. To choose a new one, open:\n\n` +
			`${link}\n\n` +
			`The link works once and expires in ${RESET_TOKEN_MINUTES} minutes. ` +
			`If you did not ask for it, ignore this message; your password stays as it is.\n`
	});
}

/** Starts a reset for the e-mail if an account has it; never says which. Returns at once. */
export function requestReset(email: string): void {
	issue(email).catch((e) => console.error('password reset mail failed', e));
}

/** Whether the link is still usable, for showing the form or a "link expired" note. */
export async function isUsable(token: string, now = new Date()): Promise<boolean> {
	if (!isResetTokenShape(token)) return false;
	const row = await passwordResets.find(hashToken(token));
	return !!row && !row.usedAt && row.expiresAt > now;
}

/**
 * Spends the token and sets the password in one transaction, then signs the account out
 * everywhere (whoever held a session may be the reason for the reset). False when the link
 * is unknown, used or expired.
 */
export async function resetPassword(token: string, password: string): Promise<boolean> {
	if (!isResetTokenShape(token)) return false;
	const passwordHash = await hashPassword(password);
	const now = new Date();
	return db.transaction(async (trx) => {
		const userId = await passwordResets.spend(hashToken(token), now, trx);
		if (!userId) return false;
		await users.updatePassword(userId, passwordHash, trx);
		await passwordResets.spendAllForUser(userId, now, trx);
		await sessions.removeForUser(userId, trx);
		return true;
	});
}
