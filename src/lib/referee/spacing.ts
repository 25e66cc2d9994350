// The spacing graph of a unit after its move: edges join unit-mates within the spacing distance
// edge to edge; each piece needs k such neighbours (k = 2 in large units), optionally one group.
import type { Finding, Profile } from '../schemas/check';
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
				if (c - disks[i].outerIn - disks[j].outerIn > within) {
					v = Infinity; // surely apart; measured later only if the figure is reported
					sure[i][j] = sure[j][i] = true;
				} else if (c - disks[i].innerIn - disks[j].innerIn <= within) {
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
	const out: Finding[] = [];
	for (let i = 0; i < n; i++) {
		const inRange = dist[i].filter((v, j) => j !== i && v <= within).length;
		if (inRange >= k) continue;
		const sorted = dist[i].map((_, j) => (j === i ? Infinity : exact(i, j))).sort((a, b) => a - b);
		const kth = sorted[k - 1];
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
			let gap = Infinity;
			for (const i of g) for (let j = 0; j < n; j++) if (!g.includes(j) && exact(i, j) < gap) gap = dist[i][j];
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
