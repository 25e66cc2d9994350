// Rosters and unit profiles: the one set of rules that the editor (live hints), the import
// parser and the API routes all check against. Inches inside (allowanceIn, hull points,
// ring radiusIn); millimetres only for bases, because that is how bases are sold and named.
import { z } from 'zod';
import { hullProblem } from '$lib/rosters/footprint';

export const PIECE_CLASSES = ['foot', 'beast', 'swarm', 'mounted', 'vehicle', 'monster'] as const;
export type PieceClass = (typeof PIECE_CLASSES)[number];

/** Common hobby base sizes, from memory (no published source); any other size is allowed. */
export const ROUND_BASES_MM = [25, 28.5, 32, 40, 50, 60] as const;
export const OVAL_BASES_MM: readonly (readonly [lengthMm: number, widthMm: number])[] = [
	[60, 35],
	[75, 42],
	[90, 52],
	[105, 70],
	[120, 92],
	[170, 105]
];

/** Bounds that keep a roster sane and a request small; none of them is a game rule. */
export const ROSTER_LIMITS = {
	nameChars: 80,
	forceChars: 80,
	units: 100,
	piecesPerUnit: 100,
	allowanceMaxIn: 60, // the long edge of a large table
	baseMaxMm: 500,
	hullMaxPoints: 64,
	hullMaxIn: 30,
	valueMax: 10,
	ringMaxIn: 36,
	ringLabelChars: 60,
	pointsMax: 10000
} as const;
const L = ROSTER_LIMITS;

const missing = (what: string) => (iss: { input: unknown }) =>
	iss.input === undefined || iss.input === null ? `${what} is missing` : `${what} must be a number`;

const baseMm = (what: string) =>
	z
		.number({ error: missing(what) })
		.gt(0, `${what} must be more than 0 mm`)
		.max(L.baseMaxMm, `${what} may be at most ${L.baseMaxMm} mm`);

const coordIn = z
	.number({ error: 'Hull coordinates must be numbers (inches)' })
	.min(-L.hullMaxIn, `Hull points must lie within ${L.hullMaxIn} in of the piece's reference point`)
	.max(L.hullMaxIn, `Hull points must lie within ${L.hullMaxIn} in of the piece's reference point`);

export const roundFootprintSchema = z.object({
	shape: z.literal('round'),
	diameterMm: baseMm('The round base diameter')
});

export const ovalFootprintSchema = z
	.object({
		shape: z.literal('oval'),
		lengthMm: baseMm('The oval base length'),
		widthMm: baseMm('The oval base width')
	})
	// Length lies along the facing; a "wider than long" oval is the same base turned, and
	// keeping one spelling means the facing of a deployed piece always means the same thing.
	.refine((f) => f.widthMm <= f.lengthMm, {
		path: ['widthMm'],
		message: 'An oval base is given length first: its width may not exceed its length'
	});

export const hullFootprintSchema = z
	.object({
		shape: z.literal('hull'),
		points: z
			.array(z.tuple([coordIn, coordIn], { error: 'Each hull point is a pair [x, y] in inches' }), {
				error: 'A hull needs its outline points'
			})
			.min(3, { error: (iss) => `A hull needs at least 3 points (this one has ${(iss.input as unknown[]).length})` })
			.max(L.hullMaxPoints, `A hull may have at most ${L.hullMaxPoints} points`)
	})
	.superRefine((f, ctx) => {
		// zod runs this even when the points failed their own checks: those are reported already.
		const readable = Array.isArray(f.points) && f.points.every((p) => Array.isArray(p) && p.length === 2 && p.every(Number.isFinite));
		if (!readable || f.points.length < 3 || f.points.length > L.hullMaxPoints) return;
		const problem = hullProblem(f.points);
		if (problem) ctx.addIssue({ code: 'custom', path: ['points'], message: problem });
	});

export const footprintSchema = z.discriminatedUnion('shape', [roundFootprintSchema, ovalFootprintSchema, hullFootprintSchema], {
	error: (iss) =>
		iss.input === undefined ? 'The footprint is missing' : 'The footprint shape must be round, oval or hull'
});

// Names appear in one-line places (a CSV preamble, a table label): no line breaks in them.
const oneLine = (s: string) => !/[\r\n]/.test(s);

const nameSchema = (what: string) =>
	z
		.string({ error: `${what} is missing` })
		.trim()
		.min(1, `${what} is missing`)
		.max(L.nameChars, `${what} may have at most ${L.nameChars} characters`)
		.refine(oneLine, `${what} must fit on one line`);

/** What every piece of a unit (or of its joined leader) shares. */
export const profileSchema = z.object({
	name: nameSchema('The name'),
	class: z.enum(PIECE_CLASSES, {
		error: (iss) =>
			iss.input === undefined
				? 'The class is missing'
				: typeof iss.input === 'string'
					? `The class "${iss.input.slice(0, 40)}" is not one of ${PIECE_CLASSES.join(', ')}`
					: `The class must be one of ${PIECE_CLASSES.join(', ')}` // never String() an arbitrary object: it may not convert
	}),
	flies: z.boolean({ error: 'Flier must be yes or no' }).default(false),
	allowanceIn: z
		.number({ error: missing('The move allowance') })
		.min(0, 'The move allowance cannot be negative')
		.max(L.allowanceMaxIn, `The move allowance may be at most ${L.allowanceMaxIn} in`),
	footprint: footprintSchema,
	pieces: z
		.number({ error: missing('The number of pieces') })
		.int('The number of pieces must be a whole number')
		.min(1, 'A unit needs at least 1 piece')
		.max(L.piecesPerUnit, `A unit may have at most ${L.piecesPerUnit} pieces`),
	value: z
		.number({ error: missing('The objective value') })
		.int('The objective value must be a whole number')
		.min(0, 'The objective value cannot be negative')
		.max(L.valueMax, `The objective value may be at most ${L.valueMax}`)
		.default(0),
	ring: z
		.object({
			radiusIn: z
				.number({ error: missing('The support ring radius') })
				.gt(0, 'The support ring radius must be more than 0 in')
				.max(L.ringMaxIn, `The support ring radius may be at most ${L.ringMaxIn} in`),
			label: z
				.string({ error: 'The support ring needs a label' })
				.trim()
				.min(1, 'The support ring needs a label')
				.max(L.ringLabelChars, `The support ring label may have at most ${L.ringLabelChars} characters`)
				.refine(oneLine, 'The support ring label must fit on one line')
		})
		.optional(),
	points: z
		.number({ error: missing('The points cost') })
		.int('The points cost must be a whole number')
		.min(0, 'The points cost cannot be negative')
		.max(L.pointsMax, `The points cost may be at most ${L.pointsMax}`)
});

/** A unit; its joined leader's pieces move and are checked as part of it. */
export const unitSchema = profileSchema.extend({ leader: profileSchema.optional() });

const sameName = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

export const unitsSchema = z
	.array(unitSchema, { error: 'The units must be a list' })
	.max(L.units, `A roster may have at most ${L.units} units`)
	.superRefine((units, ctx) => {
		// Unit names identify a unit in the CSV format (a leader's "joins" column) and at the table.
		units.forEach((u, i) => {
			const first = units.findIndex((v) => sameName(v.name, u.name));
			if (first < i) {
				ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `Another unit is already called "${u.name}"` });
			}
		});
	});

export const rosterSchema = z.object({
	name: nameSchema('The roster name'),
	force: z
		.string({ error: 'The force must be text' })
		.trim()
		.max(L.forceChars, `The force may have at most ${L.forceChars} characters`)
		.refine(oneLine, 'The force must fit on one line')
		.default(''),
	units: unitsSchema
});

export type Footprint = z.output<typeof footprintSchema>;
export type Profile = z.output<typeof profileSchema>;
export type Unit = z.output<typeof unitSchema>;
export type Roster = z.output<typeof rosterSchema>;
export type RosterInput = z.input<typeof rosterSchema>;

/** Points of a unit with its joined leader. */
export const unitPoints = (u: Unit): number => u.points + (u.leader?.points ?? 0);
export const rosterPoints = (units: readonly Unit[]): number => units.reduce((s, u) => s + unitPoints(u), 0);
export const rosterPieces = (units: readonly Unit[]): number =>
	units.reduce((s, u) => s + u.pieces + (u.leader?.pieces ?? 0), 0);

/** Issues as the API answers them: a path of strings and a sentence. */
export function issueList(error: z.ZodError): { path: string[]; message: string }[] {
	return error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
}

/** POST /api/v1/rosters/import: which stored upload, and whether to take only the good rows. */
export const importRequestSchema = z.object({
	fileId: z.uuid({ error: 'fileId must be the id of an uploaded file' }),
	onlyGoodRows: z.boolean({ error: 'onlyGoodRows must be true or false' }).default(false),
	name: z.string().max(L.nameChars).optional(),
	force: z.string().max(L.forceChars).optional()
});

export const EXPORT_FORMATS = ['csv', 'json'] as const;
export const exportFormatSchema = z.enum(EXPORT_FORMATS, { error: 'format must be csv or json' });
