// Random tokens handed to browsers (session cookie, reset link) and the hashes we store for
// them. Only the hash reaches the database, so a copy of the tables signs nobody in.
import { sha256 } from '@oslojs/crypto/sha2';
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';

function randomToken(bytes: number): string {
	const buf = new Uint8Array(bytes);
	crypto.getRandomValues(buf);
	return encodeBase32LowerCaseNoPadding(buf);
}

/** 20 random bytes (160 bits), base32: 32 characters from a-z and 2-7. */
export const generateSessionToken = (): string => randomToken(20);
/** 32 random bytes (256 bits), base32: 52 characters from a-z and 2-7. */
export const generateResetToken = (): string => randomToken(32);

/** Hex SHA-256 of the token's text; the stored id of a session, the stored key of a reset. */
export function hashToken(token: string): string {
	return encodeHexLowerCase(sha256(new TextEncoder().encode(token)));
}

// Shape checks let us answer "no such session / link" for junk without touching the database.
export const isSessionTokenShape = (v: string): boolean => /^[a-z2-7]{32}$/.test(v);
export const isResetTokenShape = (v: string): boolean => /^[a-z2-7]{52}$/.test(v);
