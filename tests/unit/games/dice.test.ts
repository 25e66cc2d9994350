// The server's D6 is fair: a chi-squared goodness-of-fit test of 6,000 rolls against the
// uniform distribution on 1–6, with simple-statistics' chiSquaredGoodnessOfFit (the library is
// the reference; "a die roll is a D6" is common practice, no published source).
import { describe, expect, it } from 'vitest';
import { chiSquaredGoodnessOfFit } from 'simple-statistics';
import { rollD6 } from '$lib/server/dice';

const ROLLS = 6000;
/** simple-statistics' table offers 0.005 as its strictest level. */
const SIGNIFICANCE = 0.005;

/** The hypothesis for chiSquaredGoodnessOfFit: faces 1–6 as cells 0–5, each with chance 1/6. */
const uniformD6 = () => [1 / 6, 1 / 6, 1 / 6, 1 / 6, 1 / 6, 1 / 6];

/** True when the sample is rejected as not uniform. Faces are shifted to cells 0–5. */
const rejects = (faces: number[]) => chiSquaredGoodnessOfFit(faces.map((f) => f - 1), uniformD6, SIGNIFICANCE);

describe('server dice', () => {
	it('rolls whole numbers 1 to 6 only', () => {
		const seen = new Set(Array.from({ length: ROLLS }, rollD6));
		expect([...seen].sort()).toEqual([1, 2, 3, 4, 5, 6]);
	});

	it(`${ROLLS} rolls fit a uniform D6 (chi-squared, simple-statistics)`, () => {
		// simple-statistics takes one degree of freedom off for an estimated parameter that a
		// fixed D6 does not have (4 instead of 5), which makes it stricter: a fair die is rejected
		// about 1.1 % of the time at 0.005. A second, independent sample is drawn only when the
		// first is rejected, so a fair die fails both about 0.01 % of runs; a biased one fails both.
		const sample = () => Array.from({ length: ROLLS }, rollD6);
		const first = rejects(sample());
		const verdict = first ? rejects(sample()) : false;
		expect(verdict).toBe(false);
	});

	it('the same test rejects a loaded die (so it can fail)', () => {
		// 900 ones and 1,100 sixes in 6,000: chi-squared = (100² + 100²) / 1000 = 20 > 14.86.
		const loaded = [...Array(900).fill(1), ...Array(1000).fill(2), ...Array(1000).fill(3), ...Array(1000).fill(4), ...Array(1000).fill(5), ...Array(1100).fill(6)];
		expect(loaded).toHaveLength(ROLLS);
		expect(rejects(loaded)).toBe(true);
		// and accepts exactly even counts
		expect(rejects(Array.from({ length: ROLLS }, (_, i) => (i % 6) + 1))).toBe(false);
	});
});
