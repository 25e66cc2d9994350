// The canvas's public vocabulary: pieces, overlays, hit targets and pointer events, all in
// board inches. Shared by BoardCanvas.svelte, the board editor and the play screens.
import type { FootprintIn } from '$lib/schemas/check';
import type { Side } from '$lib/schemas/layout';
import type { PointIn, PointPx } from './view';

/** One figure drawn to scale at its pose. `side` picks the colour; `label` is also drawn. */
export interface BoardPiece {
	id: string;
	side: Side;
	footprint: FootprintIn;
	at: { x: number; y: number; facing?: number };
	/** a short text drawn on the piece (unit initials, a number) — never colour alone */
	label?: string;
	/** ghosted (e.g. the start position while dragging) */
	faded?: boolean;
	/** marked with the signal colour and a warning ring (a finding involves it) */
	flagged?: boolean;
}

/** Colours of our palette by meaning, so callers never pass raw colour codes. */
export type Tone = 'signal' | 'brass' | 'sidea' | 'sideb' | 'ink' | 'felt' | 'ok';

/** Everything drawn above the pieces. Positions in inches; sizes in inches unless named Px. */
export type Overlay =
	/** a circle of radius `radiusIn` about a point (support ring, objective range, reach) */
	| { kind: 'ring'; x: number; y: number; radiusIn: number; tone: Tone; dashed?: boolean; fill?: boolean; label?: string }
	/** the band within `distanceIn` of a piece's footprint edge (keep-out zone), exact for any footprint */
	| { kind: 'keep-out'; pieceId: string; distanceIn: number; tone: Tone }
	/** a straight line between two points (spacing link, measuring tape) with an optional label at its middle */
	| { kind: 'link'; from: PointIn; to: PointIn; tone: Tone; dashed?: boolean; label?: string }
	/** a polyline (a dragged path, a route); `closed` draws a polygon (drawing preview) */
	| { kind: 'path'; points: PointIn[]; tone: Tone; dashed?: boolean; closed?: boolean; fill?: boolean; arrow?: boolean }
	/** text on a pale chip at a point, `sizePx` high on screen */
	| { kind: 'label'; x: number; y: number; text: string; tone: Tone; sizePx?: number }
	/** a touch handle of constant screen size (44 px hit target); hit reports { layer: 'handle', id } */
	| { kind: 'handle'; id: string; x: number; y: number; shape: 'square' | 'round' | 'rotate' }
	/** a marker for a finding at a point: a signal triangle with "!" (shape, not only colour) */
	| { kind: 'warning'; x: number; y: number; label?: string };

export type HitLayer = 'terrain' | 'objective' | 'zone' | 'piece' | 'handle' | 'wall';

/** What is under the pointer. For walls, `id` is the ruin's id and `index` the wall's. */
export interface HitTarget {
	layer: HitLayer;
	id: string;
	index?: number;
}

/**
 * A pointer gesture on the board, already converted to inches.
 * - 'down': return true from the handler to capture the gesture (you then get 'move' and 'up');
 *   otherwise a one-finger or mouse drag pans the board.
 * - 'tap': a down/up without movement that was not captured.
 * - 'cancel': a captured gesture was interrupted (a second finger started a pinch).
 */
export interface BoardPointer {
	phase: 'down' | 'move' | 'up' | 'tap' | 'cancel';
	at: PointIn;
	px: PointPx;
	target: HitTarget | null;
	pointerType: string;
	shiftKey: boolean;
}

export type BoardPointerHandler = (e: BoardPointer) => boolean | void;
