// Units and the "Table Standard" profile: millimetres to inches, and a request's profile with
// every unset setting filled from the defaults (without zod, so it is cheap on every drag frame).
import type { Profile, ProfileInput } from '../schemas/check';

/** International inch (1959): exactly 25.4 mm (NIST SP 811, appendix B). */
export const MM_PER_IN = 25.4;

export function mmToIn(mm: number): number {
	return mm / MM_PER_IN;
}

/** The "Table Standard" profile. Keep in step with profileSchema's defaults (a test checks). */
export const TABLE_STANDARD: Readonly<Profile> = Object.freeze({
	keepOut: 1,
	spacing: 2,
	largeUnit: 7,
	largeUnitNeighbours: 2,
	tolerance: 0.005,
	objectiveRange: 3,
	markerMm: 40,
	pivot: 'arc',
	pivotFixedIn: 1,
	spacingConnected: false,
	climbers: ['foot', 'beast', 'swarm'] as Profile['climbers'],
	wallPassers: ['foot', 'beast'] as Profile['wallPassers'],
	bulky: ['vehicle', 'monster'] as Profile['bulky'],
	fliersPayClimb: true,
	fliersCrossImpassable: true,
	ruinFloorOverhang: true,
	ringRadius: 6,
	pieceValue: 1
});

export function resolveProfile(input: ProfileInput | undefined): Profile {
	const out = { ...TABLE_STANDARD } as Profile;
	if (input) {
		for (const key of Object.keys(TABLE_STANDARD) as (keyof Profile)[]) {
			const v = input[key];
			if (v !== undefined) (out as Record<string, unknown>)[key] = v;
		}
	}
	return out;
}
