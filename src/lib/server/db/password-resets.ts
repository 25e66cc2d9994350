// Password reset tokens, stored only as their SHA-256 hash. A token is spent by one atomic
// update, so two concurrent uses of the same link cannot both succeed.
import { use, type Db } from './index';

export interface PasswordResetRow {
	tokenHash: string;
	userId: string;
	expiresAt: Date;
	usedAt: Date | null;
}

export async function add(
	input: { tokenHash: string; userId: string; expiresAt: Date },
	trx?: Db
): Promise<void> {
	await use(trx)('password_resets').insert({
		token_hash: input.tokenHash,
		user_id: input.userId,
		expires_at: input.expiresAt
	});
}

export async function find(tokenHash: string, trx?: Db): Promise<PasswordResetRow | null> {
	const row: { token_hash: string; user_id: string; expires_at: Date; used_at: Date | null } | undefined =
		await use(trx)('password_resets')
			.select('token_hash', 'user_id', 'expires_at', 'used_at')
			.where({ token_hash: tokenHash })
			.first();
	if (!row) return null;
	return { tokenHash: row.token_hash, userId: row.user_id, expiresAt: row.expires_at, usedAt: row.used_at };
}

/** Marks the token used if it is still unused and unexpired at `now`; returns its user or null. */
export async function spend(tokenHash: string, now: Date, trx?: Db): Promise<string | null> {
	const rows: { user_id: string }[] = await use(trx)('password_resets')
		.where({ token_hash: tokenHash })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.update({ used_at: now })
		.returning('user_id');
	return rows[0]?.user_id ?? null;
}

/** Once a password is reset, the user's other outstanding links must stop working too. */
export async function spendAllForUser(userId: string, now: Date, trx?: Db): Promise<void> {
	await use(trx)('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: now });
}

export const passwordResets = { add, find, spend, spendAllForUser };
