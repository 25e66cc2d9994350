// Creating accounts: hashes the password and maps the unique-e-mail clash to a plain answer.
import { users, DuplicateEmailError } from '$lib/server/db/users';
import type { SignUpInput } from '$lib/schemas/auth';
import { hashPassword } from './password';

export const DUPLICATE_EMAIL = 'an account with this e-mail already exists';

export async function signUp(
	input: SignUpInput
): Promise<{ ok: true; userId: string } | { ok: false; reason: 'duplicate' }> {
	// Checked first to skip the argon2 work in the common case; the unique index still decides
	// when two sign-ups race.
	if (await users.findByEmail(input.email)) return { ok: false, reason: 'duplicate' };
	const passwordHash = await hashPassword(input.password);
	try {
		const user = await users.add({ email: input.email, displayName: input.displayName, passwordHash });
		return { ok: true, userId: user.id };
	} catch (e) {
		if (e instanceof DuplicateEmailError) return { ok: false, reason: 'duplicate' };
		throw e;
	}
}
