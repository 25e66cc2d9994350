// An invented table and two small invented rosters for the game tests (no published source).
import type { Layout } from '$lib/schemas/layout';
import type { Unit } from '$lib/schemas/roster';
import { profileSchema } from '$lib/schemas/check';

/** 44 × 60 in; side A deploys in the 12 in strip at y 0–12, side B at y 48–60; one objective mid-table. */
export const LAYOUT: Layout = {
	schemaVersion: 1,
	name: 'Test table',
	board: { width: 44, depth: 60 },
	terrain: [{ id: 'crate-1', kind: 'block', outline: [[30, 28], [32, 28], [32, 32], [30, 32]], height: 2 }],
	objectives: [{ id: 'obj-1', x: 22, y: 30 }],
	zones: [
		{ id: 'zone-a', side: 'a', outline: [[0, 0], [44, 0], [44, 12], [0, 12]] },
		{ id: 'zone-b', side: 'b', outline: [[0, 48], [44, 48], [44, 60], [0, 60]] }
	]
};

export const PROFILE = profileSchema.parse({});

export const UNITS_A: Unit[] = [
	{ name: 'Lantern Guard', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 3, value: 1, points: 50 },
	{ name: 'Beacon Crew', class: 'foot', flies: false, allowanceIn: 5, footprint: { shape: 'round', diameterMm: 40 }, pieces: 1, value: 1, ring: { radiusIn: 6, label: 'Steady' }, points: 40 }
];

export const UNITS_B: Unit[] = [
	{ name: 'Bramble Hounds', class: 'beast', flies: false, allowanceIn: 8, footprint: { shape: 'oval', lengthMm: 60, widthMm: 35 }, pieces: 2, value: 1, points: 45 },
	{
		name: 'Thorn Wardens',
		class: 'foot',
		flies: false,
		allowanceIn: 6,
		footprint: { shape: 'round', diameterMm: 28.5 },
		pieces: 2,
		value: 1,
		points: 30,
		leader: { name: 'Warden Captain', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 1, value: 2, points: 20 }
	}
];
