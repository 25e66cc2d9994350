// Tokens for cookies and reset links, and the hashes stored in their place.
import { describe, expect, it } from 'vitest';
import { decodeBase32IgnorePadding } from '@oslojs/encoding';
import {
	generateResetToken,
	generateSessionToken,
	hashToken,
	isResetTokenShape,
	isSessionTokenShape
} from '$lib/server/auth/token';

describe('tokens', () => {
	it('session tokens are 20 random bytes in lowercase base32 without padding', () => {
		const t = generateSessionToken();
		expect(t).toMatch(/^[a-z2-7]{32}$/);
		expect(decodeBase32IgnorePadding(t.toUpperCase())).toHaveLength(20);
		expect(isSessionTokenShape(t)).toBe(true);
	});

	it('reset tokens are 32 random bytes in lowercase base32 without padding', () => {
		const t = generateResetToken();
		expect(t).toMatch(/^[a-z2-7]{52}$/);
		expect(decodeBase32IgnorePadding(t.toUpperCase())).toHaveLength(32);
		expect(isResetTokenShape(t)).toBe(true);
		expect(isSessionTokenShape(t)).toBe(false);
	});

	it('never repeats in a few thousand draws', () => {
		const seen = new Set(Array.from({ length: 5000 }, generateSessionToken));
		expect(seen.size).toBe(5000);
	});

	it('hashes to hex SHA-256 of the token text', () => {
		// Test vectors from FIPS 180-2, appendix B.1 ("abc") and the empty message.
		expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
		expect(hashToken('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
	});

	it('refuses junk by shape: wrong length, upper case, padding, other alphabets', () => {
		for (const junk of ['', 'a'.repeat(31), 'a'.repeat(33), 'A'.repeat(32), 'a'.repeat(30) + '==', '1'.repeat(32), "'; drop table".padEnd(32, 'a')]) {
			expect(isSessionTokenShape(junk), junk).toBe(false);
		}
	});
});
