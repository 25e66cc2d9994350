// Edge-to-edge distance between two footprints on the table: 0 when touching, minus the
// penetration depth when overlapping. Round–round is the closed form |c1 − c2| − r1 − r2.
import type { FootprintIn } from '../schemas/check';
import { signedDistance, type Rounded } from './convex';
import { localFootprint, place } from './footprints';
import { TABLE_STANDARD } from './profile';

export interface PoseIn {
	x: number;
	y: number;
	facing?: number;
}

/** The footprint as placed on the table (outer form), for measuring. */
export function placedFootprint(fp: FootprintIn, pose: PoseIn, toleranceIn = TABLE_STANDARD.tolerance): Rounded {
	return place(localFootprint(fp, toleranceIn).outer, pose.x, pose.y, pose.facing ?? 0);
}

export function footprintDistance(a: FootprintIn, poseA: PoseIn, b: FootprintIn, poseB: PoseIn): number {
	if (a.shape === 'round' && b.shape === 'round') {
		// closed form, kept separate so the common case never builds a shape
		return Math.hypot(poseA.x - poseB.x, poseA.y - poseB.y) - (a.diameterMm + b.diameterMm) / 2 / 25.4;
	}
	return signedDistance(placedFootprint(a, poseA), placedFootprint(b, poseB));
}

export { signedDistance };
