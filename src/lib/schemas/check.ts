// The JSON contract of POST /api/v1/check (docs referee-api.md), as zod schemas shared by the
// board in the browser, the API route and the engine's types. Field names follow the contract.
import { z } from 'zod';

/** Hard limits of the API (referee-api.md); the route also caps the body at 1 MiB. */
export const LIMITS = {
	pieces: 2000,
	terrain: 500,
	waypoints: 200,
	outlinePoints: 1000,
	walls: 200,
	wallPoints: 200,
	hullPoints: 64,
	objectives: 100,
	bodyBytes: 1024 * 1024
} as const;

// Sane ranges keep arithmetic far from overflow and catch unit mistakes (mm sent as inches).
const COORD_IN = 10_000;
const id = z.string().min(1).max(100);
const coordIn = z.number().min(-COORD_IN).max(COORD_IN);
const lengthIn = (max: number) => z.number().min(0).max(max);
const xy = z.tuple([coordIn, coordIn]);

export const pieceClassSchema = z.enum(['foot', 'beast', 'swarm', 'mounted', 'vehicle', 'monster']);
export const moveKindSchema = z.enum(['hold', 'move', 'dash', 'withdraw']);

// ---------------------------------------------------------------------------------------------
// Profile: every number and class rule of a game. Defaults are the "Table Standard" profile.

const classList = z.array(pieceClassSchema).max(6);

export const profileSchema = z.object({
	/** keep-out distance, in, edge to edge */
	keepOut: lengthIn(100).default(1),
	/** group spacing, in, edge to edge */
	spacing: lengthIn(100).default(2),
	/** a unit with this many pieces or more needs largeUnitNeighbours unit-mates in range */
	largeUnit: z.int().min(1).max(10_000).default(7),
	largeUnitNeighbours: z.int().min(1).max(100).default(2),
	/** ε, in: "within X" means ≤ X + ε; overlaps shallower than ε are contact */
	tolerance: lengthIn(1).default(0.005),
	/** a piece holds an objective within this of the marker's edge, in */
	objectiveRange: lengthIn(100).default(3),
	markerMm: z.number().min(0).max(1000).default(40),
	/** pivot cost: 'arc' = r_max × |Δθ|; 'fixed' = pivotFixedIn per pivot. Round bases are free. */
	pivot: z.enum(['arc', 'fixed']).default('arc'),
	pivotFixedIn: lengthIn(100).default(1),
	/** profile option: the unit must also form one connected group */
	spacingConnected: z.boolean().default(false),
	/** classes that may cross and climb blocks, paying the climb cost */
	climbers: classList.default(['foot', 'beast', 'swarm']),
	/** classes that pass through ruin walls */
	wallPassers: classList.default(['foot', 'beast']),
	/** classes that may not pass through each other */
	bulky: classList.default(['vehicle', 'monster']),
	/** fliers pay the climb cost over blocks */
	fliersPayClimb: z.boolean().default(true),
	/** fliers may pass over impassable terrain (never end on it) */
	fliersCrossImpassable: z.boolean().default(true),
	/** a piece ending on a ruin's outline must lie wholly within it */
	ruinFloorOverhang: z.boolean().default(true),
	/** support ring radius when a piece's ring gives none, in */
	ringRadius: lengthIn(100).default(6),
	/** objective value of a piece that gives none */
	pieceValue: z.number().min(0).max(1e6).default(1)
});

export type Profile = z.output<typeof profileSchema>;
export type ProfileInput = z.input<typeof profileSchema>;

// ---------------------------------------------------------------------------------------------
// Request

export const footprintSchema = z.discriminatedUnion('shape', [
	z.object({ shape: z.literal('round'), diameterMm: z.number().min(1).max(2000) }),
	z.object({
		shape: z.literal('oval'),
		lengthMm: z.number().min(1).max(2000),
		widthMm: z.number().min(1).max(2000)
	}),
	z.object({
		shape: z.literal('hull'),
		// inches relative to `at`, before rotation by facing
		points: z
			.array(z.tuple([z.number().min(-200).max(200), z.number().min(-200).max(200)]))
			.min(3)
			.max(LIMITS.hullPoints)
			.refine((pts) => hullArea(pts) >= 0.01, 'a hull must enclose an area (at least 0.01 sq in)')
	})
]);

/** Area of the convex hull of the points (gift wrapping; hulls are small). */
function hullArea(pts: [number, number][]): number {
	const s = [...pts].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
	const turn = (o: number[], a: number[], b: number[]) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
	const chain = (list: [number, number][]) => {
		const h: [number, number][] = [];
		for (const p of list) {
			while (h.length >= 2 && turn(h[h.length - 2], h[h.length - 1], p) <= 0) h.pop();
			h.push(p);
		}
		return h.slice(0, -1);
	};
	const hull = [...chain(s), ...chain([...s].reverse())];
	let a = 0;
	for (let i = 0; i < hull.length; i++) {
		const [x0, y0] = hull[i];
		const [x1, y1] = hull[(i + 1) % hull.length];
		a += x0 * y1 - x1 * y0;
	}
	return Math.abs(a) / 2;
}

const facingDeg = z.number().min(-36_000).max(36_000);

export const poseSchema = z.object({ x: coordIn, y: coordIn, facing: facingDeg.optional() });

export const pieceSchema = z.object({
	id,
	side: id,
	unit: id,
	/** a joined leader: the id of the unit it has joined; it moves and is spaced with that unit */
	leaderOf: id.optional(),
	class: pieceClassSchema,
	flies: z.boolean().optional(),
	allowance: lengthIn(1000),
	footprint: footprintSchema,
	at: poseSchema,
	value: z.number().min(0).max(1e6).optional(),
	ring: z.object({ radius: lengthIn(1000).optional() }).optional()
});

const outline = z.array(xy).min(3).max(LIMITS.outlinePoints);
const wall = z.array(xy).min(2).max(LIMITS.wallPoints);

export const terrainSchema = z.discriminatedUnion('kind', [
	z.object({ id, kind: z.literal('block'), outline, height: lengthIn(1000) }),
	z.object({ id, kind: z.literal('ruin'), outline, walls: z.array(wall).max(LIMITS.walls).optional() }),
	z.object({ id, kind: z.literal('impassable'), outline }),
	z.object({ id, kind: z.literal('area'), outline })
]);

export const objectiveSchema = z.object({ id, x: coordIn, y: coordIn });

export const boardSchema = z.object({
	width: z.number().gt(0).max(1000),
	depth: z.number().gt(0).max(1000),
	terrain: z.array(terrainSchema).max(LIMITS.terrain).optional(),
	objectives: z.array(objectiveSchema).max(LIMITS.objectives).optional()
});

export const waypointSchema = poseSchema;

export const moveSchema = z.object({
	unit: id,
	kind: moveKindSchema,
	/** the D6 result, for a dash only */
	die: z.int().min(1).max(6).optional(),
	paths: z.record(id, z.array(waypointSchema).min(1).max(LIMITS.waypoints)).optional()
});

export const checkRequestSchema = z
	.object({
		profile: profileSchema.prefault({}),
		board: boardSchema,
		pieces: z.array(pieceSchema).min(1).max(LIMITS.pieces),
		move: moveSchema
	})
	.superRefine((req, ctx) => {
		// Cross-field checks the engine relies on: ids are unique and the move names real pieces.
		const seen = new Set<string>();
		req.pieces.forEach((p, i) => {
			if (seen.has(p.id)) ctx.addIssue({ code: 'custom', path: ['pieces', i, 'id'], message: `duplicate piece id "${p.id}"` });
			seen.add(p.id);
		});
		const members = new Set(
			req.pieces.filter((p) => p.unit === req.move.unit || p.leaderOf === req.move.unit).map((p) => p.id)
		);
		if (members.size === 0) {
			ctx.addIssue({ code: 'custom', path: ['move', 'unit'], message: `no piece belongs to unit "${req.move.unit}"` });
		}
		for (const pieceId of Object.keys(req.move.paths ?? {})) {
			if (!members.has(pieceId)) {
				ctx.addIssue({
					code: 'custom',
					path: ['move', 'paths', pieceId],
					message: `"${pieceId}" is not a piece of unit "${req.move.unit}"`
				});
			}
		}
		if (req.move.kind === 'dash' && req.move.die === undefined) {
			ctx.addIssue({ code: 'custom', path: ['move', 'die'], message: 'a dash needs the die result (1-6)' });
		}
	});

/** The request as sent (optional fields optional); checkMove accepts it directly. */
export type CheckRequest = z.input<typeof checkRequestSchema>;
/** The request after parsing, defaults filled. */
export type ParsedCheckRequest = z.output<typeof checkRequestSchema>;
export type PieceIn = z.input<typeof pieceSchema>;
export type TerrainIn = z.input<typeof terrainSchema>;
export type FootprintIn = z.input<typeof footprintSchema>;
export type Waypoint = z.input<typeof waypointSchema>;
export type PieceClass = z.output<typeof pieceClassSchema>;
export type MoveKind = z.output<typeof moveKindSchema>;

// ---------------------------------------------------------------------------------------------
// Report

export const findingCodeSchema = z.enum([
	'over-allowance',
	'locked',
	'not-in-contact',
	'through-enemy',
	'enters-keep-out',
	'bulky-through-bulky',
	'wall-blocked',
	'climb-blocked',
	'impassable',
	'off-board',
	'ends-overlapping',
	'ends-in-keep-out',
	'overhang',
	'spacing'
]);

export const findingSchema = z.object({
	code: findingCodeSchema,
	severity: z.enum(['error', 'warning']).default('error'),
	/** the subject piece first, then any other piece involved */
	pieces: z.array(z.string()),
	/** inches, unrounded */
	measured: z.number(),
	/** inches */
	limit: z.number(),
	message: z.string(),
	/** optional addition: the terrain piece involved */
	terrain: z.string().optional()
});

export const pieceReportSchema = z.object({
	cost: z.number(),
	allowance: z.number(),
	findings: z.array(findingSchema)
});

export const checkReportSchema = z.object({
	verdict: z.enum(['legal', 'illegal']),
	pieces: z.record(z.string(), pieceReportSchema),
	findings: z.array(findingSchema),
	summaries: z.object({
		objectives: z.array(
			z.object({
				id: z.string(),
				pieces: z.array(z.string()),
				/** optional addition: the units those pieces belong to */
				units: z.array(z.string()).optional(),
				value: z.record(z.string(), z.number())
			})
		),
		rings: z.array(z.object({ source: z.string(), covers: z.array(z.string()), lost: z.array(z.string()) }))
	})
});

export type FindingCode = z.output<typeof findingCodeSchema>;
export type Finding = z.output<typeof findingSchema>;
export type PieceReport = z.output<typeof pieceReportSchema>;
export type CheckReport = z.output<typeof checkReportSchema>;
