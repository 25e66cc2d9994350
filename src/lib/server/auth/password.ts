// Password hashing with argon2id at the OWASP minimum parameters (19 MiB, 2 passes, 1 lane).
// verifyPassword reads the parameters from the stored hash, so raising them later still
// verifies old hashes.
import { hash, verify, type Algorithm } from '@node-rs/argon2';

// The package exports Algorithm as a `const enum`, which isolated-module builds cannot read;
// 2 is its Argon2id member (see @node-rs/argon2's index.d.ts).
const ARGON2ID = 2 as Algorithm;

export const HASH_OPTIONS = {
	algorithm: ARGON2ID,
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1,
	outputLen: 32
} as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, HASH_OPTIONS);
}

/** False for a wrong password and for a stored value that is not an argon2 hash at all. */
export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

// A hash nobody knows the password of, made once per process with the same parameters, so a
// sign-in for an unknown e-mail costs the same time as one for a real account.
let dummy: Promise<string> | null = null;
export async function burnVerify(password: string): Promise<false> {
	dummy ??= hashPassword(crypto.randomUUID());
	await verifyPassword(await dummy, password);
	return false;
}
