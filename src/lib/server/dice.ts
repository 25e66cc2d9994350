// Server-side die rolls: the browser never rolls a die that counts. crypto.randomInt draws
// uniformly without modulo bias (Node's documented guarantee), so each face has chance 1/6.
import { randomInt } from 'node:crypto';

/** One six-sided die, 1–6. */
export function rollD6(): number {
	return randomInt(1, 7);
}

export const dice = { rollD6 };
