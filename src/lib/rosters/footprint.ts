// Footprint geometry the roster needs (not the referee's): hull polygon sanity, the hull's
// typed-points text form, and each footprint's extent in millimetres for the to-scale preview.

/** 25.4 mm per inch exactly (NIST SP 811, appendix B). */
export const MM_PER_IN = 25.4;

export type HullPointIn = [number, number];

export type Footprint =
	| { shape: 'round'; diameterMm: number }
	| { shape: 'oval'; lengthMm: number; widthMm: number }
	| { shape: 'hull'; points: HullPointIn[] };

/** Signed shoelace area in square inches (positive when the points run counter-clockwise). */
export function signedAreaIn2(points: readonly HullPointIn[]): number {
	let twice = 0;
	for (let i = 0; i < points.length; i++) {
		const [x1, y1] = points[i];
		const [x2, y2] = points[(i + 1) % points.length];
		twice += x1 * y2 - x2 * y1;
	}
	return twice / 2;
}

function orient(a: HullPointIn, b: HullPointIn, c: HullPointIn): number {
	return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function onSegment(a: HullPointIn, b: HullPointIn, p: HullPointIn): boolean {
	return (
		Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) &&
		Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1])
	);
}

/** Closed-segment intersection, touching and collinear overlap included. */
function segmentsMeet(a: HullPointIn, b: HullPointIn, c: HullPointIn, d: HullPointIn): boolean {
	const o1 = orient(a, b, c);
	const o2 = orient(a, b, d);
	const o3 = orient(c, d, a);
	const o4 = orient(c, d, b);
	if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true;
	return (
		(o1 === 0 && onSegment(a, b, c)) ||
		(o2 === 0 && onSegment(a, b, d)) ||
		(o3 === 0 && onSegment(c, d, a)) ||
		(o4 === 0 && onSegment(c, d, b))
	);
}

/**
 * Why a hull outline cannot be measured from, or null when it can. The referee treats a hull
 * as one simple polygon: a figure-of-eight or a flat outline would make "distance to the
 * hull" ambiguous, so the roster refuses them at the door. O(n²) is fine for ≤ 64 points.
 */
export function hullProblem(points: readonly HullPointIn[]): string | null {
	if (points.length < 3) return `A hull needs at least 3 points (this one has ${points.length})`;
	for (let i = 0; i < points.length; i++) {
		const a = points[i];
		const b = points[(i + 1) % points.length];
		if (a[0] === b[0] && a[1] === b[1]) return `Hull points ${i + 1} and ${((i + 1) % points.length) + 1} are the same point`;
	}
	const n = points.length;
	for (let i = 0; i < n; i++) {
		// Neighbouring edges that double back along one line overlap: a spike of zero width.
		const [a, b, c] = [points[i], points[(i + 1) % n], points[(i + 2) % n]];
		const dot = (b[0] - a[0]) * (c[0] - b[0]) + (b[1] - a[1]) * (c[1] - b[1]);
		if (orient(a, b, c) === 0 && dot < 0) return `The hull outline doubles back on itself at point ${((i + 1) % n) + 1}`;
	}
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			// Neighbouring edges share a point by construction; only the others may not meet.
			if (j === i + 1 || (i === 0 && j === n - 1)) continue;
			if (segmentsMeet(points[i], points[(i + 1) % n], points[j], points[(j + 1) % n])) {
				return `The hull outline crosses itself (edges ${i + 1} and ${j + 1} meet)`;
			}
		}
	}
	// Below a hundredth of a square inch an outline is a line drawn twice, not a model.
	if (Math.abs(signedAreaIn2(points)) < 0.01) return 'The hull outline encloses no area: its points lie on one line';
	return null;
}

/** "x y; x y; …" — the typed form used by the editor and by the CSV column hull_in. */
export function formatHullPoints(points: readonly HullPointIn[]): string {
	return points.map(([x, y]) => `${x} ${y}`).join('; ');
}

/**
 * Reads the typed form back. Points are separated by ";" or new lines, coordinates by
 * spaces or a comma. Returns the points or a sentence saying which one could not be read.
 */
export function parseHullPoints(text: string): { ok: true; points: HullPointIn[] } | { ok: false; message: string } {
	const parts = text
		.split(/[;\n]/)
		.map((p) => p.trim())
		.filter((p) => p.length > 0);
	const points: HullPointIn[] = [];
	for (let i = 0; i < parts.length; i++) {
		const coords = parts[i].split(/[\s,]+/).filter((c) => c.length > 0);
		const nums = coords.map((c) => (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(c) ? Number(c) : NaN));
		if (nums.length !== 2 || nums.some((v) => !Number.isFinite(v))) {
			return { ok: false, message: `Hull point ${i + 1} ("${parts[i]}") is not two numbers "x y" in inches` };
		}
		points.push([nums[0], nums[1]]);
	}
	return { ok: true, points };
}

/** Axis-aligned extent of a footprint around its reference point, in millimetres. */
export interface ExtentMm {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

export function footprintExtentMm(f: Footprint): ExtentMm {
	switch (f.shape) {
		case 'round':
			return { minX: -f.diameterMm / 2, minY: -f.diameterMm / 2, maxX: f.diameterMm / 2, maxY: f.diameterMm / 2 };
		case 'oval':
			// The length lies along the facing (local x), as the referee API defines it.
			return { minX: -f.lengthMm / 2, minY: -f.widthMm / 2, maxX: f.lengthMm / 2, maxY: f.widthMm / 2 };
		case 'hull': {
			const xs = f.points.map((p) => p[0] * MM_PER_IN);
			const ys = f.points.map((p) => p[1] * MM_PER_IN);
			if (xs.length === 0) return { minX: 0, minY: 0, maxX: 0, maxY: 0 };
			return { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
		}
	}
}

/** A short label: "32 mm round", "75 × 42 mm oval", "hull, 4 points, 5 × 3 in". */
export function describeFootprint(f: Footprint): string {
	switch (f.shape) {
		case 'round':
			return `${f.diameterMm} mm round`;
		case 'oval':
			return `${f.lengthMm} × ${f.widthMm} mm oval`;
		case 'hull': {
			const e = footprintExtentMm(f);
			const w = Math.round(((e.maxX - e.minX) / MM_PER_IN) * 100) / 100;
			const d = Math.round(((e.maxY - e.minY) / MM_PER_IN) * 100) / 100;
			return `hull, ${f.points.length} points, ${w} × ${d} in`;
		}
	}
}
