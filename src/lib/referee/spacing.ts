// The spacing graph of a unit after its move: edges join unit-mates within the spacing distance
// edge to edge; each piece needs k such neighbours (k = 2 in large units), optionally one group.
import type { Finding, Profile } from '../schemas/check';
import { lowerGap, upperGap, type Frame, type Reach } from './bounds';
import { signedDistance, type Rounded } from './convex';
import { countWord, inches, limitText, ordinal } from './messages';

/** Neighbours each piece needs: 1, or largeUnitNeighbours once the unit has largeUnit pieces. */
export function neighboursNeeded(unitSize: number, profile: Pick<Profile, 'largeUnit' | 'largeUnitNeighbours'>): number {
	const k = unitSize >= profile.largeUnit ? profile.largeUnitNeighbours : 1;
	return Math.min(k, unitSize - 1);
}

/** Pairwise edge-to-edge distances, symmetric, Infinity on the diagonal. */
export function distanceMatrix(shapes: Rounded[]): number[][] {
	const n = shapes.length;
	const d = shapes.map(() => new Array<number>(n).fill(Infinity));
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			const v = signedDistance(shapes[i], shapes[j]);
			d[i][j] = v;
			d[j][i] = v;
		}
	}
	return d;
}

/** Connected groups of the spacing graph, each listed in input order, first group first. */
export function spacingGroups(dist: number[][], withinIn: number): number[][] {
	const n = dist.length;
	const group = new Array<number>(n).fill(-1);
	const groups: number[][] = [];
	for (let s = 0; s < n; s++) {
		if (group[s] >= 0) continue;
		const g: number[] = [];
		const stack = [s];
		group[s] = groups.length;
		while (stack.length) {
			const i = stack.pop()!;
			g.push(i);
			for (let j = 0; j < n; j++) {
				if (group[j] < 0 && dist[i][j] <= withinIn) {
					group[j] = groups.length;
					stack.push(j);
				}
			}
		}
		groups.push(g.sort((a, b) => a - b));
	}
	return groups;
}

/** Centre and bounding / inscribed disk radii of a footprint, to settle most pairs cheaply. */
export interface Disk {
	x: number;
	y: number;
	outerIn: number;
	innerIn: number;
	/** a non-round footprint's brackets (bounds.ts) at `frame`, tighter than the disks */
	reach?: Reach;
	frame?: Frame;
}

/** A lower bound on the distance of pair (i, j) from their disks and brackets. */
function lowerOf(disks: Disk[], i: number, j: number): number {
	const a = disks[i];
	const b = disks[j];
	const c = Math.hypot(a.x - b.x, a.y - b.y) - a.outerIn - b.outerIn;
	if (!a.frame || !b.frame || (!a.reach && !b.reach)) return c;
	return Math.max(c, lowerGap(a.reach ?? roundReach(a), a.frame, b.reach ?? roundReach(b), b.frame));
}

function upperOf(disks: Disk[], i: number, j: number): number {
	const a = disks[i];
	const b = disks[j];
	if (!a.frame || !b.frame || (!a.reach && !b.reach)) return Infinity;
	return upperGap(a.reach ?? roundReach(a), a.frame, b.reach ?? roundReach(b), b.frame);
}

/** A round base's brackets: its disk. */
function roundReach(d: Disk): Reach {
	return { kind: 0, r: d.outerIn, a: 0, b: 0, innerScale: 0, pts: [], innerDisk: d.outerIn };
}

/**
 * Spacing findings for a unit whose pieces (ids, final footprints) are given in request order.
 * With `disks`, a pair is measured exactly only when its disks cannot settle the question.
 */
export function spacingFindings(ids: string[], shapes: Rounded[], profile: Profile, disks?: Disk[]): Finding[] {
	const n = ids.length;
	if (n < 2) return []; // units of one piece are exempt
	const within = profile.spacing + profile.tolerance;
	const k = neighboursNeeded(n, profile);
	// NaN marks "not measured": in range for sure (−∞ side) or out of range for sure (+∞ side)
	const dist = shapes.map(() => new Array<number>(n).fill(Infinity));
	const sure = shapes.map(() => new Array<boolean>(n).fill(false));
	for (let i = 0; i < n; i++) {
		for (let j = i + 1; j < n; j++) {
			let v: number;
			if (disks) {
				const c = Math.hypot(disks[i].x - disks[j].x, disks[i].y - disks[j].y);
				if (c - disks[i].outerIn - disks[j].outerIn > within || lowerOf(disks, i, j) > within) {
					v = Infinity; // surely apart; measured later only if the figure is reported
					sure[i][j] = sure[j][i] = true;
				} else if (c - disks[i].innerIn - disks[j].innerIn <= within || upperOf(disks, i, j) <= within) {
					v = -Infinity; // surely in range
					sure[i][j] = sure[j][i] = true;
				} else v = signedDistance(shapes[i], shapes[j]);
			} else v = signedDistance(shapes[i], shapes[j]);
			dist[i][j] = v;
			dist[j][i] = v;
		}
	}
	const exact = (i: number, j: number) => {
		if (sure[i][j]) {
			dist[i][j] = dist[j][i] = signedDistance(shapes[i], shapes[j]);
			sure[i][j] = sure[j][i] = false;
		}
		return dist[i][j];
	};
	/** The least exact figure over the pairs, measuring a surely-apart pair only while its lower bound could still beat it. */
	const least = (pairs: [number, number][], count: number): number => {
		const known: number[] = [];
		const pending: [number, number, number][] = [];
		for (const [i, j] of pairs) {
			if (sure[i][j] && dist[i][j] === Infinity && disks) pending.push([lowerOf(disks, i, j), i, j]);
			else known.push(exact(i, j));
		}
		known.sort((a, b) => a - b);
		pending.sort((a, b) => a[0] - b[0]);
		for (const [lb, i, j] of pending) {
			if (known.length >= count && lb >= known[count - 1]) break;
			const v = exact(i, j);
			let at = known.length;
			while (at > 0 && known[at - 1] > v) at--;
			known.splice(at, 0, v);
		}
		return count <= known.length ? known[count - 1] : Infinity;
	};
	const out: Finding[] = [];
	for (let i = 0; i < n; i++) {
		const inRange = dist[i].filter((v, j) => j !== i && v <= within).length;
		if (inRange >= k) continue;
		const row: [number, number][] = [];
		for (let j = 0; j < n; j++) if (j !== i) row.push([i, j]);
		const kth = least(row, k);
		const mate = k === 1 ? 'its nearest unit-mate' : `its ${ordinal(k)} unit-mate`;
		out.push({
			code: 'spacing',
			severity: 'error',
			pieces: [ids[i]],
			measured: kth,
			limit: profile.spacing,
			message: `${ids[i]} is ${inches(kth)} in from ${mate}; it must be within ${limitText(profile.spacing)} in of ${countWord(k)}`
		});
	}
	if (profile.spacingConnected) {
		const groups = spacingGroups(dist, within);
		for (const g of groups.slice(1)) {
			const across: [number, number][] = [];
			for (const i of g) for (let j = 0; j < n; j++) if (!g.includes(j)) across.push([i, j]);
			const gap = least(across, 1);
			const names = g.map((i) => ids[i]);
			out.push({
				code: 'spacing',
				severity: 'error',
				pieces: names,
				measured: gap,
				limit: profile.spacing,
				message: `${names.join(', ')} ${names.length === 1 ? 'is' : 'are'} ${inches(gap)} in from the rest of the unit; the unit must form one group with gaps of at most ${limitText(profile.spacing)} in`
			});
		}
	}
	return out;
}
