// Entry of the rules engine: checkMove(request) → report, pure and synchronous (referee-api.md),
// and the pieces it is made of, for the board's live feedback, the route finder and the tests.
import type { CheckReport, CheckRequest } from '../schemas/check';
import { runCheck } from './check';

export type { CheckReport, CheckRequest, Finding, Profile } from '../schemas/check';

/**
 * Checks a proposed move. Accepts the request as sent (unset profile settings take the "Table
 * Standard" defaults); expects input that checkRequestSchema accepts. The same request always
 * gives the same report.
 */
export function checkMove(request: CheckRequest): CheckReport {
	return runCheck(request);
}

export { MM_PER_IN, mmToIn, resolveProfile, TABLE_STANDARD } from './profile';
export { localFootprint, place, ovalVertexCount, OVAL_CHORD_ERROR_IN, type LocalFootprint } from './footprints';
export { footprintDistance, placedFootprint } from './distance';
export { signedDistance, convexHull, minkowskiSum, type Rounded } from './convex';
export { translationSweep, pivotSweep, sweptDistance } from './sweep';
export { pathSteps, endPose, horizontalIn, pivotIn, climbIn, angleDeltaDeg, type PathStep, type Touch } from './path-cost';
export { spacingFindings, neighboursNeeded, spacingGroups, distanceMatrix } from './spacing';
export { objectiveSummaries, ringSummaries } from './summaries';
export { prepareTerrain, meetsRegion, touchIntervals, overhangOf, wallMet } from './terrain';
