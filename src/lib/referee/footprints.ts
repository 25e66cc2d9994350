// Footprints as rounded convex sets: a round base is a point grown by its radius, an oval a fine
// polygon grown by half its chord error, a hull its convex hull. Each also has an "inner" form
// shrunk by the tolerance ε, used to decide whether a touch with terrain is more than contact.
import type { FootprintIn } from '../schemas/check';
import { convexHull, erodeConvex, type Rounded } from './convex';
import { mmToIn } from './profile';

/** Largest gap between an oval and its polygon before the half-gap rounding, in inches. */
export const OVAL_CHORD_ERROR_IN = 4e-4;

export interface LocalFootprint {
	/** around the reference point, facing 0 */
	outer: Rounded;
	inner: Rounded;
	/** distance from the reference point to the farthest point of the footprint */
	rMaxIn: number;
	round: boolean;
}

/** Vertices of an oval polygon so its chords stay within OVAL_CHORD_ERROR_IN of the curve. */
export function ovalVertexCount(semiLengthIn: number): number {
	// chord gap of an N-gon inscribed in a circle of radius a is a(1 − cos(π/N)); the affine
	// squash to an ellipse never lengthens it.
	const a = Math.max(semiLengthIn, 1e-9);
	const x = 1 - OVAL_CHORD_ERROR_IN / a;
	const n = x <= -1 ? 16 : Math.ceil(Math.PI / Math.acos(Math.max(-1, Math.min(1, x))));
	return Math.min(1024, Math.max(16, n));
}

function ovalPolygon(a: number, b: number, inset: number): { pts: number[]; chordError: number } {
	// the count follows the larger semi-axis, so an oval wider than long is as fine as any
	const major = Math.max(a, b);
	const n = ovalVertexCount(major);
	const pts: number[] = [];
	for (let i = 0; i < n; i++) {
		const t = (2 * Math.PI * i) / n;
		const c = Math.cos(t);
		const s = Math.sin(t);
		let x = a * c;
		let y = b * s;
		if (inset > 0) {
			// the inner parallel curve: step ε along the inward normal (b cos t, a sin t)/|…|
			const nx = b * c;
			const ny = a * s;
			const len = Math.hypot(nx, ny);
			x -= (inset * nx) / len;
			y -= (inset * ny) / len;
		}
		pts.push(x, y);
	}
	return { pts, chordError: major * (1 - Math.cos(Math.PI / n)) };
}

const cache = new Map<string, LocalFootprint>();

/** The footprint around its reference point at facing 0, memoised (results do not depend on it). */
export function localFootprint(fp: FootprintIn, toleranceIn: number): LocalFootprint {
	const key =
		fp.shape === 'round'
			? `r${fp.diameterMm}|${toleranceIn}`
			: fp.shape === 'oval'
				? `o${fp.lengthMm}x${fp.widthMm}|${toleranceIn}`
				: `h${fp.points.join(';')}|${toleranceIn}`;
	let hit = cache.get(key);
	if (hit) return hit;
	hit = buildLocal(fp, toleranceIn);
	if (cache.size > 512) cache.clear();
	cache.set(key, hit);
	return hit;
}

function buildLocal(fp: FootprintIn, eps: number): LocalFootprint {
	if (fp.shape === 'round') {
		const r = mmToIn(fp.diameterMm) / 2;
		return { outer: { pts: [0, 0], r }, inner: { pts: [0, 0], r: Math.max(0, r - eps) }, rMaxIn: r, round: true };
	}
	if (fp.shape === 'oval') {
		const a = mmToIn(fp.lengthMm) / 2;
		const b = mmToIn(fp.widthMm) / 2;
		const outer = ovalPolygon(a, b, 0);
		// the inner parallel curve is a convex curve only while ε is below the least radius of
		// curvature b²/a; beyond that the footprint is thinner than the tolerance anyway
		const inset = Math.min(eps, (0.99 * Math.min(a, b) ** 2) / Math.max(a, b));
		const inner = ovalPolygon(a, b, inset);
		return {
			outer: { pts: outer.pts, r: outer.chordError / 2 },
			inner: { pts: inner.pts, r: inner.chordError / 2 },
			rMaxIn: Math.max(a, b),
			round: false
		};
	}
	const flat: number[] = [];
	for (const [x, y] of fp.points) flat.push(x, y);
	const hull = convexHull(flat);
	let rMax = 0;
	for (let i = 0; i < hull.length; i += 2) rMax = Math.max(rMax, Math.hypot(hull[i], hull[i + 1]));
	return { outer: { pts: hull, r: 0 }, inner: { pts: erodeConvex(hull, eps), r: 0 }, rMaxIn: rMax, round: false };
}

/** The set placed at (x, y) turned CCW by facingDeg. */
export function place(local: Rounded, x: number, y: number, facingDeg: number): Rounded {
	const p = local.pts;
	if (p.length === 2) return { pts: [x + p[0], y + p[1]], r: local.r };
	const th = (facingDeg * Math.PI) / 180;
	const c = Math.cos(th);
	const s = Math.sin(th);
	const out = new Array<number>(p.length);
	for (let i = 0; i < p.length; i += 2) {
		out[i] = x + p[i] * c - p[i + 1] * s;
		out[i + 1] = y + p[i] * s + p[i + 1] * c;
	}
	return { pts: out, r: local.r };
}
