// The saved table layout (board editor ↔ database ↔ games): a versioned JSON document whose
// terrain and objectives are exactly the engine's shapes (schemas/check.ts), plus names and
// deployment zones, which the engine does not need. `layoutToBoard` hands the engine its part.
import { z } from 'zod';
import { PG_INT_MAX } from './limits';
import { LIMITS, objectiveSchema, terrainSchema, type TerrainIn } from './check';

export const LAYOUT_SCHEMA_VERSION = 1 as const;

/** The table most games are played on, in inches (product vocabulary: "44 × 60 is common"). */
export const DEFAULT_BOARD = { width: 44, depth: 60 } as const;
/** Objective markers are 40 mm discs; a piece holds one within 3 in of the edge (common practice). */
export const OBJECTIVE_MARKER_MM = 40;
export const OBJECTIVE_RANGE_IN = 3;
export const MAX_ZONES = 20;

const nameSchema = z.string().trim().min(1, 'give it a name').max(100);
const labelSchema = z.string().trim().max(60).optional();
const xy = z.tuple([z.number().min(-10_000).max(10_000), z.number().min(-10_000).max(10_000)]);

// The engine's four terrain kinds, each with an optional display name. Built from the engine's
// own option objects so a change there changes the layout document too.
const [blockIn, ruinIn, impassableIn, areaIn] = terrainSchema.options;
export const layoutTerrainSchema = z.discriminatedUnion('kind', [
	blockIn.extend({ name: labelSchema }),
	ruinIn.extend({ name: labelSchema }),
	impassableIn.extend({ name: labelSchema }),
	areaIn.extend({ name: labelSchema })
]);

export const layoutObjectiveSchema = objectiveSchema.extend({ name: labelSchema });

export const sideSchema = z.enum(['a', 'b']);

export const zoneSchema = z.object({
	id: z.string().min(1).max(100),
	side: sideSchema,
	outline: z.array(xy).min(3).max(LIMITS.outlinePoints),
	name: labelSchema
});

export const boardSizeSchema = z.object({
	width: z.number().min(6, 'at least 6 in').max(200, 'at most 200 in'),
	depth: z.number().min(6, 'at least 6 in').max(200, 'at most 200 in')
});

/** Twice the signed area of a polygon (shoelace); zero for a degenerate outline. */
export function signedArea2(outline: readonly (readonly [number, number])[]): number {
	let s = 0;
	for (let i = 0; i < outline.length; i++) {
		const [x1, y1] = outline[i];
		const [x2, y2] = outline[(i + 1) % outline.length];
		s += x1 * y2 - x2 * y1;
	}
	return s;
}

/** An outline smaller than this (in²) is a slip of the finger, not terrain. */
export const MIN_OUTLINE_AREA_IN2 = 0.01;

export const layoutSchema = z
	.object({
		schemaVersion: z.literal(LAYOUT_SCHEMA_VERSION),
		name: nameSchema,
		board: boardSizeSchema.prefault(DEFAULT_BOARD),
		terrain: z.array(layoutTerrainSchema).max(LIMITS.terrain).default([]),
		objectives: z.array(layoutObjectiveSchema).max(LIMITS.objectives).default([]),
		zones: z.array(zoneSchema).max(MAX_ZONES).default([])
	})
	.superRefine((doc, ctx) => {
		// One id space for everything on the table: the editor selects and the move log names by id.
		const seen = new Set<string>();
		const claim = (id: string, path: (string | number)[]) => {
			if (seen.has(id)) ctx.addIssue({ code: 'custom', path, message: `duplicate id "${id}"` });
			seen.add(id);
		};
		doc.terrain.forEach((t, i) => {
			claim(t.id, ['terrain', i, 'id']);
			if (Math.abs(signedArea2(t.outline)) / 2 < MIN_OUTLINE_AREA_IN2) {
				ctx.addIssue({ code: 'custom', path: ['terrain', i, 'outline'], message: 'the outline encloses no area' });
			}
		});
		doc.zones.forEach((z, i) => {
			claim(z.id, ['zones', i, 'id']);
			if (Math.abs(signedArea2(z.outline)) / 2 < MIN_OUTLINE_AREA_IN2) {
				ctx.addIssue({ code: 'custom', path: ['zones', i, 'outline'], message: 'the outline encloses no area' });
			}
		});
		doc.objectives.forEach((o, i) => {
			claim(o.id, ['objectives', i, 'id']);
			// A marker off the table could never be held; it is always a mistake.
			if (o.x < 0 || o.y < 0 || o.x > doc.board.width || o.y > doc.board.depth) {
				ctx.addIssue({ code: 'custom', path: ['objectives', i], message: 'the objective is off the table' });
			}
		});
	});

/** A layout as stored and edited (after parsing: defaults filled). */
export type Layout = z.output<typeof layoutSchema>;
export type LayoutInput = z.input<typeof layoutSchema>;
export type LayoutTerrain = z.output<typeof layoutTerrainSchema>;
export type TerrainKind = LayoutTerrain['kind'];
export type LayoutObjective = z.output<typeof layoutObjectiveSchema>;
export type Zone = z.output<typeof zoneSchema>;
export type Side = z.output<typeof sideSchema>;
export type Point = [number, number];

/** An empty table of the default size. */
export function emptyLayout(name = 'New table'): Layout {
	return {
		schemaVersion: LAYOUT_SCHEMA_VERSION,
		name,
		board: { ...DEFAULT_BOARD },
		terrain: [],
		objectives: [],
		zones: []
	};
}

/** The engine's `board` (check request) from a layout: names and zones dropped, shapes as they are. */
export function layoutToBoard(layout: Layout): {
	width: number;
	depth: number;
	terrain: TerrainIn[];
	objectives: { id: string; x: number; y: number }[];
} {
	const terrain: TerrainIn[] = layout.terrain.map((t): TerrainIn => {
		const outline = t.outline.map(([x, y]) => [x, y] as [number, number]);
		switch (t.kind) {
			case 'block':
				return { id: t.id, kind: 'block', outline, height: t.height };
			case 'ruin':
				return { id: t.id, kind: 'ruin', outline, walls: (t.walls ?? []).map((w) => w.map(([x, y]) => [x, y] as [number, number])) };
			case 'impassable':
				return { id: t.id, kind: 'impassable', outline };
			case 'area':
				return { id: t.id, kind: 'area', outline };
		}
	});
	return {
		width: layout.board.width,
		depth: layout.board.depth,
		terrain,
		objectives: layout.objectives.map((o) => ({ id: o.id, x: o.x, y: o.y }))
	};
}

// ---------------------------------------------------------------------------------------------
// The JSON API (/api/v1/layouts)

export const layoutIdSchema = z.coerce.number().int().positive().lte(PG_INT_MAX);

/**
 * POST: a new layout, either a whole document ({ doc }) or a copy of a saved one
 * ({ copyOf, name? }: anyone may reuse). One object, not a union, so a bad document's
 * issues keep their paths (doc.terrain.0.height) instead of one "no branch matched".
 */
export const createLayoutSchema = z
	.object({
		doc: layoutSchema.optional(),
		copyOf: z.number().int().positive().lte(PG_INT_MAX).optional(),
		name: nameSchema.optional()
	})
	.strict()
	.superRefine((b, ctx) => {
		if ((b.doc === undefined) === (b.copyOf === undefined)) {
			ctx.addIssue({ code: 'custom', path: [], message: 'send either "doc" (a layout) or "copyOf" (a saved layout id)' });
		}
		if (b.doc !== undefined && b.name !== undefined) {
			ctx.addIssue({ code: 'custom', path: ['name'], message: '"name" goes inside "doc"' });
		}
	});

/** PUT: the new document and the version it was edited from; a stale version gets 409. */
export const updateLayoutSchema = z
	.object({ doc: layoutSchema, version: z.number().int().positive().lte(PG_INT_MAX) })
	.strict();

export interface LayoutSummary {
	id: number;
	name: string;
	ownerId: string;
	ownerName: string;
	version: number;
	terrainCount: number;
	objectiveCount: number;
	createdAt: string;
	updatedAt: string;
}

export interface SavedLayout extends LayoutSummary {
	doc: Layout;
}
