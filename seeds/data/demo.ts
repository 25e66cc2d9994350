// The demo scenario (invented for the demo only): one club, its people and three forces, a game
// in progress between Ada and Tomas, and an upcoming event of the club.
export const DEMO_PASSWORD = 'tabletop-demo-1';

export interface DemoPerson {
	key: string;
	email: string;
	displayName: string;
	roles: ('player' | 'judge' | 'organiser' | 'admin')[];
}

export const DEMO_PEOPLE: DemoPerson[] = [
	{ key: 'ada', email: 'ada@demo.inchwarden.test', displayName: 'Ada Brightwater', roles: ['player'] },
	{ key: 'tomas', email: 'tomas@demo.inchwarden.test', displayName: 'Tomas Reyl', roles: ['player'] },
	{ key: 'mira', email: 'mira@demo.inchwarden.test', displayName: 'Mira Okafor', roles: ['player'] },
	{ key: 'jun', email: 'jun@demo.inchwarden.test', displayName: 'Jun Halloway', roles: ['player', 'judge'] },
	{ key: 'priya', email: 'priya@demo.inchwarden.test', displayName: 'Priya Castellan', roles: ['player', 'organiser'] },
	{ key: 'sam', email: 'sam@demo.inchwarden.test', displayName: 'Sam Ordway', roles: ['player', 'admin'] }
];

export const DEMO_CLUB = { name: 'Fennmoor Tape & Terrain Club', town: 'Fennmoor' };

/** A unit as rosters keep it (the shared schema in src/lib/schemas/roster.ts checks these). */
export type DemoUnit = import('../../src/lib/schemas/roster').RosterInput['units'][number];

export const DEMO_FORCES: { owner: string; name: string; force: string; units: DemoUnit[] }[] = [
	{
		owner: 'ada',
		name: 'Copperline first muster',
		force: 'The Copperline Compact',
		units: [
			{
				name: 'Lamplighter Warband', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 32 }, pieces: 10, value: 1, points: 100,
				leader: { name: 'Lampwright Corin', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 40 }, pieces: 1, value: 1, ring: { radiusIn: 6, label: 'Kindled resolve' }, points: 45 }
			},
			{ name: 'Signal Mast Crew', class: 'foot', flies: false, allowanceIn: 5, footprint: { shape: 'round', diameterMm: 40 }, pieces: 3, value: 1, ring: { radiusIn: 6, label: 'Steady signal' }, points: 85 },
			{ name: 'Brass Strider', class: 'vehicle', flies: false, allowanceIn: 10, footprint: { shape: 'hull', points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] }, pieces: 1, value: 0, points: 160 },
			{ name: 'Kestrel Riders', class: 'mounted', flies: false, allowanceIn: 10, footprint: { shape: 'oval', lengthMm: 75, widthMm: 42 }, pieces: 3, value: 1, points: 95 }
		]
	},
	{
		owner: 'tomas',
		name: 'Thornwake vanguard',
		force: 'The Thornwake Host',
		units: [
			{ name: 'Briar Stalkers', class: 'beast', flies: false, allowanceIn: 8, footprint: { shape: 'oval', lengthMm: 60, widthMm: 35 }, pieces: 5, value: 1, points: 90 },
			{ name: 'Moth Swarm', class: 'swarm', flies: true, allowanceIn: 12, footprint: { shape: 'round', diameterMm: 40 }, pieces: 3, value: 0, points: 60 },
			{ name: 'Root Colossus', class: 'monster', flies: false, allowanceIn: 8, footprint: { shape: 'oval', lengthMm: 170, widthMm: 105 }, pieces: 1, value: 2, ring: { radiusIn: 6, label: 'Deep roots' }, points: 210 },
			{ name: 'Thorn Wardens', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 28.5 }, pieces: 8, value: 1, points: 80 }
		]
	},
	{
		owner: 'mira',
		name: 'Saltmarsh wardens',
		force: 'The Saltmarsh Reeve',
		units: [
			{ name: 'Reed Pikes', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 28.5 }, pieces: 10, value: 1, points: 90 },
			{ name: 'Heron Lancers', class: 'mounted', flies: false, allowanceIn: 10, footprint: { shape: 'oval', lengthMm: 75, widthMm: 42 }, pieces: 3, value: 1, ring: { radiusIn: 6, label: 'Tidecall' }, points: 110 },
			{ name: 'Mudskipper Raft', class: 'vehicle', flies: false, allowanceIn: 8, footprint: { shape: 'hull', points: [[-2, -1], [2, -1], [2.5, 0], [2, 1], [-2, 1]] }, pieces: 1, value: 0, points: 120 }
		]
	}
];

/** The game in progress that the demo seed plays through the app's own game actions. */
export const DEMO_GAME = {
	title: 'Crossroads friendly',
	layoutName: 'Fennmoor crossroads',
	sides: { a: { player: 'ada', roster: 'Copperline first muster' }, b: { player: 'tomas', roster: 'Thornwake vanguard' } }
} as const;

/** The club's upcoming one-day event; `daysAhead` from the day the seed runs. */
export const DEMO_EVENT = {
	name: 'Fennmoor Spring Muster',
	venue: 'Fennmoor village hall',
	daysAhead: 24,
	rounds: 3,
	capacity: 16,
	entryFeeCents: 1200,
	currency: 'eur' as const,
	organiser: 'priya',
	judges: ['jun'],
	/** entered and paid (marked paid by the seed: demo data, no provider involved) */
	entrants: [
		{ player: 'ada', roster: 'Copperline first muster' },
		{ player: 'mira', roster: 'Saltmarsh wardens' }
	]
};
