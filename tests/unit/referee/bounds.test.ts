// The distance brackets that let the check skip exact distances (src/lib/referee/bounds.ts):
// on seeded random pairs of round, oval (long and wide) and hull footprints (reference point
// inside or outside), the lower bounds never exceed the exact signed distance of the engine's
// own shapes, and the upper bound never falls below it; the brackets are tight enough to be
// worth having (a lower bound within 0.02 in of the figure on most apart pairs). And the fast
// paths of a turn's cover: the hull of two turned copies by merging equals the sorted hull, and
// a piece's box from the copies equals the box of the piece.
import { describe, expect, it } from 'vitest';
import { frameOf, lowerGap, lowerSweepGap, reachOfLocal, upperGap } from '../../../src/lib/referee/bounds';
import { boxOf, convexHull, convexHullOfTwo, signedDistance, signedDistancePointConvex } from '../../../src/lib/referee/convex';
import { localFootprint, place } from '../../../src/lib/referee/footprints';
import { PivotCover, translationSweep } from '../../../src/lib/referee/sweep';
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

describe('turn covers', () => {
	it('hull two turned copies exactly as the sorted hull of all their points does', () => {
		const r = rng(7);
		for (let i = 0; i < 1500; i++) {
			const fp = randomFootprint(r);
			const local = localFootprint(fp, EPS)[r() < 0.5 ? 'outer' : 'inner'];
			const x = r() * 40;
			const y = r() * 40;
			// whole quarter turns too, where vertices share coordinates
			const facing = r() < 0.2 ? Math.round(r() * 8) * 45 : r() * 720 - 360;
			const turn = r() < 0.2 ? 90 : (r() - 0.5) * 6;
			const a = place(local, x, y, facing).pts;
			const b = place(local, x, y, facing + turn).pts;
			expect(convexHullOfTwo(a, b)).toEqual(convexHull(a.concat(b)));
		}
	});

	it("give each piece's box without its hull, equal to the piece's own box", () => {
		const r = rng(8);
		for (let i = 0; i < 200; i++) {
			const fp = randomFootprint(r);
			const local = localFootprint(fp, EPS);
			const cover = new PivotCover(local.outer, local.rMaxIn, r() * 40, r() * 40, r() * 360, (r() - 0.5) * 300);
			for (let k = 0; k < cover.count; k++) {
				const piece = cover.piece(k);
				expect(cover.box(k)).toEqual(boxOf(piece.pts, piece.r));
			}
		}
	});
});
