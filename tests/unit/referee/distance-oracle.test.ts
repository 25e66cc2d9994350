// Footprint distances checked against an outside reference: JSTS (the JavaScript port of the
// JTS Topology Suite, npm "jsts") DistanceOp, on 1,200 seeded random pairs of rotated circles,
// ovals and hulls. JSTS sees circles and ovals as fine polygons (512 vertices, chord error
// below 7e-5 in for the largest oval drawn), hulls as the convex polygons they are.
import { describe, expect, it } from 'vitest';
import GeometryFactory from 'jsts/org/locationtech/jts/geom/GeometryFactory.js';
import Coordinate from 'jsts/org/locationtech/jts/geom/Coordinate.js';
import DistanceOp from 'jsts/org/locationtech/jts/operation/distance/DistanceOp.js';
import { footprintDistance, convexHull } from '../../../src/lib/referee';
import type { FootprintIn } from '../../../src/lib/schemas/check';
import { rng } from './helpers';

const gf = new GeometryFactory();
const FINE = 512;

type Pose = { x: number; y: number; facing: number };

function jstsPolygon(flat: number[]) {
	const coords = [];
	for (let i = 0; i < flat.length; i += 2) coords.push(new Coordinate(flat[i], flat[i + 1]));
	coords.push(new Coordinate(flat[0], flat[1]));
	return gf.createPolygon(gf.createLinearRing(coords));
}

/** The footprint as a world polygon for JSTS, built independently of the engine's shapes. */
function jstsFootprint(fp: FootprintIn, pose: Pose) {
	const th = (pose.facing * Math.PI) / 180;
	const c = Math.cos(th);
	const s = Math.sin(th);
	const flat: number[] = [];
	const put = (lx: number, ly: number) => flat.push(pose.x + lx * c - ly * s, pose.y + lx * s + ly * c);
	if (fp.shape === 'hull') {
		const hull = convexHull(fp.points.flat());
		for (let i = 0; i < hull.length; i += 2) put(hull[i], hull[i + 1]);
	} else {
		const a = (fp.shape === 'round' ? fp.diameterMm : fp.lengthMm) / 25.4 / 2;
		const b = (fp.shape === 'round' ? fp.diameterMm : fp.widthMm) / 25.4 / 2;
		for (let i = 0; i < FINE; i++) {
			const t = (2 * Math.PI * i) / FINE;
			put(a * Math.cos(t), b * Math.sin(t));
		}
	}
	return jstsPolygon(flat);
}

function randomFootprint(r: () => number): FootprintIn {
	const k = r();
	if (k < 0.33) return { shape: 'round', diameterMm: 20 + r() * 140 };
	if (k < 0.66) {
		const w = 20 + r() * 100;
		return { shape: 'oval', lengthMm: w + r() * 100, widthMm: w };
	}
	const n = 3 + Math.floor(r() * 6);
	const points: [number, number][] = [];
	for (let i = 0; i < n; i++) {
		const t = (2 * Math.PI * (i + r() * 0.8)) / n;
		const rad = 0.5 + r() * 3;
		points.push([Math.cos(t) * rad + r() * 0.5, Math.sin(t) * rad]);
	}
	return { shape: 'hull', points };
}

describe('footprint distance against JSTS DistanceOp', () => {
	it('agrees within 0.001 in on 1,200 random rotated pairs (0 for overlaps in JSTS, ≤ 0 here)', () => {
		const r = rng(20240603);
		let apart = 0;
		let overlapping = 0;
		let worst = 0;
		for (let i = 0; i < 1200; i++) {
			const a = randomFootprint(r);
			const b = randomFootprint(r);
			const pa = { x: 20, y: 20, facing: r() * 360 - 180 };
			const gap = r() * 8;
			const dir = r() * 2 * Math.PI;
			const pb = { x: 20 + Math.cos(dir) * gap, y: 20 + Math.sin(dir) * gap, facing: r() * 720 - 360 };
			const ours = footprintDistance(a, pa, b, pb);
			const theirs = DistanceOp.distance(jstsFootprint(a, pa), jstsFootprint(b, pb));
			if (theirs > 0) {
				apart++;
				worst = Math.max(worst, Math.abs(ours - theirs));
				expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(0.001);
			} else {
				overlapping++;
				expect(ours).toBeLessThanOrEqual(0.001);
			}
		}
		// the sample must exercise both sides, or the test proves little
		expect(apart).toBeGreaterThan(400);
		expect(overlapping).toBeGreaterThan(100);
		expect(worst).toBeLessThan(0.001);
	});

	it('agrees on pairs placed a hair apart, where polygon error would show most', () => {
		const r = rng(7);
		for (let i = 0; i < 300; i++) {
			const a = randomFootprint(r);
			const b = randomFootprint(r);
			const pa = { x: 10, y: 10, facing: r() * 360 };
			const pb0 = { x: 10, y: 10, facing: r() * 360 };
			// slide b out along a random direction until they are 0.01–0.05 in apart (bisection on
			// our distance, which only picks the spot; the comparison is with JSTS)
			const dir = r() * 2 * Math.PI;
			let lo = 0;
			let hi = 20;
			const target = 0.01 + r() * 0.04;
			const at = (t: number) => ({ x: pb0.x + Math.cos(dir) * t, y: pb0.y + Math.sin(dir) * t, facing: pb0.facing });
			for (let k = 0; k < 40; k++) {
				const mid = (lo + hi) / 2;
				if (footprintDistance(a, pa, b, at(mid)) < target) lo = mid;
				else hi = mid;
			}
			const pb = at(hi);
			const theirs = DistanceOp.distance(jstsFootprint(a, pa), jstsFootprint(b, pb));
			expect(Math.abs(footprintDistance(a, pa, b, pb) - theirs)).toBeLessThanOrEqual(0.001);
		}
	});
});
