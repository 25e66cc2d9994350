// The distance brackets that let the check skip exact distances (src/lib/referee/bounds.ts):
// on seeded random pairs of round, oval (long and wide) and hull footprints (reference point
// inside or outside), the lower bounds never exceed the exact signed distance of the engine's
// own shapes, and the upper bound never falls below it; the brackets are tight enough to be
// worth having (a lower bound within 0.02 in of the figure on most apart pairs).
import { describe, expect, it } from 'vitest';
import { frameOf, lowerGap, lowerSweepGap, reachOfLocal, upperGap } from '../../../src/lib/referee/bounds';
import { signedDistance, signedDistancePointConvex } from '../../../src/lib/referee/convex';
import { localFootprint, place } from '../../../src/lib/referee/footprints';
import { translationSweep } from '../../../src/lib/referee/sweep';
import type { FootprintIn } from '../../../src/lib/schemas/check';
import { EPS, rng } from './helpers';

function randomFootprint(r: () => number): FootprintIn {
	const roll = r();
	if (roll < 0.25) return { shape: 'round', diameterMm: 1 + r() * 120 };
	if (roll < 0.7) return { shape: 'oval', lengthMm: 5 + r() * 150, widthMm: 5 + r() * 150 };
	// a quadrilateral or pentagon, sometimes shifted so its reference point lies outside it
	const shift = r() < 0.4 ? 2 + r() * 2 : 0;
	const n = 4 + Math.floor(r() * 2);
	const points: [number, number][] = [];
	for (let i = 0; i < n; i++) {
		const t = (2 * Math.PI * i) / n + r() * 0.5;
		const rad = 0.3 + r() * 2;
		points.push([shift + rad * Math.cos(t), rad * Math.sin(t)]);
	}
	return { shape: 'hull', points };
}

function reachFor(fp: FootprintIn) {
	const local = localFootprint(fp, EPS);
	if (fp.shape === 'oval') return reachOfLocal(local, 'oval', fp.lengthMm / 25.4 / 2, fp.widthMm / 25.4 / 2);
	if (fp.shape === 'round') return reachOfLocal(local, 'round');
	const sd = signedDistancePointConvex(0, 0, local.outer.pts);
	return reachOfLocal(local, 'hull', 0, 0, sd <= 0 ? -sd : -Infinity);
}

describe('distance brackets', () => {
	it('bracket the exact signed distance of placed footprints, apart, touching and overlapping', () => {
		const r = rng(20_240);
		let tight = 0;
		let apart = 0;
		let upperUsed = 0;
		for (let i = 0; i < 3000; i++) {
			const fa = randomFootprint(r);
			const fb = randomFootprint(r);
			const pa = { x: 20 + r() * 4, y: 20 + r() * 4, facing: r() * 360 };
			const pb = { x: 20 + r() * 8, y: 20 + r() * 8, facing: r() * 360 };
			const A = place(localFootprint(fa, EPS).outer, pa.x, pa.y, pa.facing);
			const B = place(localFootprint(fb, EPS).outer, pb.x, pb.y, pb.facing);
			const exact = signedDistance(A, B);
			const ra = reachFor(fa);
			const rb = reachFor(fb);
			const framA = frameOf(pa.x, pa.y, pa.facing);
			const framB = frameOf(pb.x, pb.y, pb.facing);
			const lo = lowerGap(ra, framA, rb, framB);
			const hi = upperGap(ra, framA, rb, framB);
			expect(lo).toBeLessThanOrEqual(exact);
			expect(hi).toBeGreaterThanOrEqual(exact);
			if (hi < Infinity) upperUsed++;
			if (exact > 0) {
				apart++;
				if (exact - lo < 0.02) tight++;
			}
			// a straight sweep of A from its pose against B
			const dx = (r() - 0.5) * 10;
			const dy = (r() - 0.5) * 10;
			const swept = signedDistance(translationSweep(A, dx, dy), B);
			expect(lowerSweepGap(ra, framA, dx, dy, rb, framB)).toBeLessThanOrEqual(swept);
		}
		expect(apart).toBeGreaterThan(500);
		expect(tight / apart).toBeGreaterThan(0.3);
		expect(upperUsed).toBeGreaterThan(1000);
	});

	it('give no upper bound for a hull whose reference point lies outside it', () => {
		const fp: FootprintIn = { shape: 'hull', points: [[2, 0], [3, 0], [3, 1], [2, 1]] };
		const R = reachFor(fp);
		expect(upperGap(R, frameOf(0, 0, 0), R, frameOf(1, 0, 180))).toBe(Infinity);
	});
});
