// Games at the table: the pieces on it, the state kept in the game row, the move log's entries
// and the bodies of the game API (/api/v1/games/**), shared by the play screen and the server.
import { z } from 'zod';
import { PG_INT_MAX } from './limits';
import { checkReportSchema, footprintSchema, moveKindSchema, pieceClassSchema, poseSchema, profileSchema, waypointSchema, LIMITS } from './check';
import { layoutSchema, sideSchema, type Side } from './layout';

export { sideSchema, type Side };

export const otherSide = (s: Side): Side => (s === 'a' ? 'b' : 'a');

/** A piece as the game keeps it: what the engine needs, plus names for the screen. */
export const gamePieceSchema = z.object({
	/** `a-u1-p3`: side, unit number, piece number (a joined leader's pieces: `a-u1-l1`) */
	id: z.string().min(1).max(100),
	side: sideSchema,
	/** `a-u1` */
	unit: z.string().min(1).max(100),
	unitName: z.string().max(200),
	leader: z.boolean().default(false),
	class: pieceClassSchema,
	flies: z.boolean(),
	allowance: z.number().min(0).max(1000),
	footprint: footprintSchema,
	value: z.number().min(0).max(1e6),
	ring: z.object({ radius: z.number().min(0).max(1000), label: z.string().max(100).optional() }).optional(),
	/** null while the piece waits in the roster panel (not deployed) */
	at: poseSchema.nullable()
});
export type GamePiece = z.output<typeof gamePieceSchema>;
export type Pose = z.output<typeof poseSchema>;

export const phaseSchema = z.enum(['setup', 'deploy', 'move']);
export type Phase = z.output<typeof phaseSchema>;

/** The move awaiting the opponent's acceptance, with what is needed to take it back. */
export const pendingMoveSchema = z.object({
	seq: z.int().lte(PG_INT_MAX),
	unit: z.string(),
	kind: moveKindSchema,
	side: sideSchema,
	actor: z.string(),
	/** where the unit's pieces stood before it */
	before: z.record(z.string(), poseSchema),
	die: z.int().lte(PG_INT_MAX).min(1).max(6).optional(),
	/** the log entry of a dash's roll: a take-back hands the same die back */
	rollSeq: z.int().lte(PG_INT_MAX).optional()
});
export type PendingMove = z.output<typeof pendingMoveSchema>;

export const gameStateSchema = z.object({
	phase: phaseSchema,
	/** 0 during setup and deployment, then 1, 2, … */
	round: z.int().lte(PG_INT_MAX).min(0),
	/** the side whose turn it is (deploying, then moving) */
	activeSide: sideSchema,
	/** which side moves first in every round */
	firstSide: sideSchema,
	pieces: z.array(gamePieceSchema),
	/** units that moved (or held) in the current turn: each moves once per movement part */
	movedUnits: z.array(z.string()),
	pending: pendingMoveSchema.nullable(),
	/** a dash die rolled and not yet spent on its move */
	die: z.object({ unit: z.string(), value: z.int().lte(PG_INT_MAX).min(1).max(6), seq: z.int().lte(PG_INT_MAX) }).nullable(),
	/** the last move's summaries (objectives held, support rings) for the panel */
	summaries: checkReportSchema.shape.summaries.nullable()
});
export type GameState = z.output<typeof gameStateSchema>;

export const moveLogKindSchema = z.enum([
	'roster',
	'deploy',
	'roll',
	'move',
	'refused',
	'accept',
	'take-back',
	'ruling-request',
	'end-turn',
	/** a judge's ruling on an earlier entry (the judge desk; never an edit of what it rules on) */
	'ruling'
]);
export type MoveLogKind = z.output<typeof moveLogKindSchema>;

/** One entry of the move log, as the API shows it. */
export interface MoveLogEntry {
	seq: number;
	kind: MoveLogKind;
	actor: string;
	actorName: string;
	side: Side | null;
	round: number;
	payload: Record<string, unknown>;
	report: z.output<typeof checkReportSchema> | null;
	createdAt: string;
}

export interface GamePlayerView {
	side: Side;
	userId: string | null;
	displayName: string | null;
	rosterId: number | null;
	rosterName: string | null;
	/** the invitation waiting for this side, shown to the game's creator only */
	invited?: string | null;
}

/** What GET /api/v1/games/[id] answers: everything the play screen draws. */
export interface GameView {
	id: number;
	title: string;
	seq: number;
	layout: z.output<typeof layoutSchema>;
	profile: z.output<typeof profileSchema>;
	state: GameState;
	players: GamePlayerView[];
	/** the sides the asking user plays (both on a shared tablet) */
	mySides: Side[];
}

// ---------------------------------------------------------------------------------------------
// API bodies

const email = z.string().trim().toLowerCase().email('give a valid e-mail address').max(254);

export const createGameSchema = z
	.object({
		title: z.string().trim().min(1, 'give the game a name').max(100),
		/** a saved layout to snapshot… */
		layoutId: z.int().lte(PG_INT_MAX).positive().optional(),
		/** …or a whole layout document */
		layout: layoutSchema.optional(),
		profile: profileSchema.prefault({}),
		/** 'invite': side b is the player at `opponentEmail`; 'shared': one tablet, I play both */
		opponent: z.discriminatedUnion('mode', [
			z.object({ mode: z.literal('invite'), email }),
			z.object({ mode: z.literal('shared') })
		]),
		/** rosters may be chosen now or later, each by the player of that side */
		rosterA: z.int().lte(PG_INT_MAX).positive().optional(),
		rosterB: z.int().lte(PG_INT_MAX).positive().optional(),
		firstSide: sideSchema.default('a')
	})
	.strict();
export type CreateGame = z.output<typeof createGameSchema>;

/** Every change names the last seq its sender saw; a stale one is answered 409. */
const seq = z.int().lte(PG_INT_MAX).min(0);

export const chooseRosterSchema = z.object({ seq, side: sideSchema, rosterId: z.int().lte(PG_INT_MAX).positive() }).strict();

export const deploySchema = z
	.object({
		seq,
		side: sideSchema,
		placements: z
			.array(z.object({ piece: z.string().min(1).max(100), at: poseSchema }))
			.min(1)
			.max(LIMITS.pieces)
	})
	.strict();

export const rollSchema = z.object({ seq, unit: z.string().min(1).max(100) }).strict();

export const proposeMoveSchema = z
	.object({
		seq,
		unit: z.string().min(1).max(100),
		kind: moveKindSchema,
		paths: z.record(z.string().min(1).max(100), z.array(waypointSchema).min(1).max(LIMITS.waypoints)).optional()
	})
	.strict();
export type ProposeMove = z.output<typeof proposeMoveSchema>;

export const seqOnlySchema = z.object({ seq }).strict();

export const rulingRequestSchema = z
	.object({ seq, note: z.string().trim().min(1, 'say what the judge should look at').max(2000) })
	.strict();

export const joinSchema = z.object({ token: z.string().min(1).max(200) }).strict();

export const gameIdSchema = z.coerce.number().int().positive().lte(PG_INT_MAX);
