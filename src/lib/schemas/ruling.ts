// The judge desk's boundaries: opening a ruling request, a judge's ruling, what a ruling log
// entry holds, and what the API shows of a request. Shared by the desk, the replay and the server.
import { z } from 'zod';
import { PG_INT_MAX } from './limits';
import { checkReportSchema, poseSchema } from './check';
import type { MoveLogEntry, MoveLogKind } from './game';

/** The move log's kinds as the judge desk knows them: the table's, plus its own 'ruling'. */
export type LogKind = MoveLogKind | 'ruling';
/** A log entry whose kind may also be 'ruling' (the table's type predates it). */
export type LogEntry = Omit<MoveLogEntry, 'kind'> & { kind: LogKind };

export const RULING_OUTCOMES = ['uphold', 'overturn', 'adjust'] as const;
export const rulingOutcomeSchema = z.enum(RULING_OUTCOMES);
export type RulingOutcome = z.output<typeof rulingOutcomeSchema>;

/** Photos per request: enough for the table from two sides and a close-up or two. */
export const MAX_PHOTOS = 4;

const seq = z.int().lte(PG_INT_MAX).min(1);

export const openRequestSchema = z
	.object({
		gameId: z.int().lte(PG_INT_MAX).positive(),
		/** the seq of the game the asker saw (a stale one is answered 409, like every table change) */
		seq: z.int().lte(PG_INT_MAX).min(0),
		/** the log entry in question */
		moveSeq: seq,
		note: z.string().trim().min(1, 'say what the judge should look at').max(2000),
		photos: z.array(z.uuid('a photo id from /api/v1/rulings/photos')).max(MAX_PHOTOS, `at most ${MAX_PHOTOS} photos`).default([])
	})
	.strict();
export type OpenRequest = z.output<typeof openRequestSchema>;

export const rulingSchema = z
	.object({
		outcome: rulingOutcomeSchema,
		/** said to both players and kept on the record */
		reason: z.string().trim().min(1, 'give the reason for the ruling').max(2000),
		/** adjust: the corrected end positions, by piece id */
		positions: z.record(z.string().min(1).max(100), poseSchema).optional(),
		/** the judge allows what the engine finds illegal (a refused move, or an adjusted one) */
		allowIllegal: z.boolean().default(false)
	})
	.strict()
	.superRefine((r, ctx) => {
		if (r.outcome === 'adjust' && (!r.positions || Object.keys(r.positions).length === 0)) {
			ctx.addIssue({ code: 'custom', path: ['positions'], message: 'an adjustment places at least one piece' });
		}
		if (r.outcome !== 'adjust' && r.positions && Object.keys(r.positions).length > 0) {
			ctx.addIssue({ code: 'custom', path: ['positions'], message: 'only an adjustment places pieces' });
		}
	});
export type RulingInput = z.output<typeof rulingSchema>;

export const reportLinkSchema = z.object({ round: z.int().lte(PG_INT_MAX).min(0).max(10_000) }).strict();

/** The payload of a 'ruling' log entry. Positions are absolute poses the ruling puts pieces at. */
export const rulingPayloadSchema = z.object({
	requestId: z.int().lte(PG_INT_MAX),
	moveSeq: z.int().lte(PG_INT_MAX),
	outcome: rulingOutcomeSchema,
	reason: z.string(),
	allowIllegal: z.boolean(),
	/** the ruled end poses of the disputed move's pieces, as the ruling decides them */
	ruled: z.record(z.string(), poseSchema),
	/** the pieces the ruling moves now: from `from` (their pose just before it) to `to` */
	changes: z.array(z.object({ piece: z.string(), from: poseSchema.nullable(), to: poseSchema })),
	/** the move awaiting acceptance that this ruling settled, if it was the disputed one */
	settledPending: z.boolean(),
	judge: z.object({ id: z.string(), name: z.string() }),
	signedAt: z.string()
});
export type RulingPayload = z.output<typeof rulingPayloadSchema>;

export type RequestStatus = 'open' | 'taken' | 'ruled';

/** A request as the queue, the game and the desk show it (names only, never e-mail addresses). */
export interface RulingRequestView {
	id: number;
	gameId: number;
	gameTitle: string;
	requestSeq: number;
	moveSeq: number;
	note: string;
	status: RequestStatus;
	requestedBy: { id: string; name: string };
	takenBy: { id: string; name: string } | null;
	takenAt: string | null;
	ruledSeq: number | null;
	ruledAt: string | null;
	createdAt: string;
	event: { id: number; name: string; round: number; table: number | null } | null;
	/** the entry in question: its kind, unit, and the first finding (or a plain "no finding") */
	entry: { kind: LogKind; unit: string | null; verdict: 'legal' | 'illegal' | null; finding: string };
	photos: { id: string; contentType: string; sizeBytes: number }[];
}

export type CheckReportShape = z.output<typeof checkReportSchema>;
