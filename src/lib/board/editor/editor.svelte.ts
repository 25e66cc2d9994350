// The board editor's state for one page: the layout history, the tool, the selection, snapping
// and the gesture in progress. Pointer gestures from BoardCanvas become pure commands
// (commands.ts); while a drag is in progress the canvas shows a preview, and only the release
// is recorded as one undo step. Created per page (never a module singleton).
import type { Layout, Point } from '$lib/schemas/layout';
import type { BoardPointer, Overlay } from '../types';
import { centroid, frameBox, rectOutline, rotatePoint, DEG } from '../geometry';
import { perform, nextId, findItem, type Anchor, type Command } from './commands';
import { canRedo, canUndo, execute, redo, startHistory, undo, type History } from './history';
import { DEFAULT_SNAP, nextGrid, snapAngle, snapDelta, snapPoint, snapValue, type SnapOptions } from './snap';

export type Tool = 'select' | 'block' | 'ruin' | 'wall' | 'impassable' | 'area' | 'objective' | 'zone-a' | 'zone-b';
export const SHAPE_TOOLS: readonly Tool[] = ['block', 'ruin', 'impassable', 'area', 'zone-a', 'zone-b'];

/** A press that moves less than this (in) is a tap: it adds a polygon vertex instead of a rectangle. */
const TAP_IN = 0.3;
/** Default height of a new block, in (a common two-storey piece; common practice, no published source). */
export const DEFAULT_BLOCK_HEIGHT_IN = 3;
/** Distance of the rotate handle beyond the item's top edge, in. */
const ROTATE_HANDLE_IN = 1.5;

type Draft =
	| { kind: 'rect'; from: Point; to: Point; downAt: Point }
	| { kind: 'poly'; points: Point[]; hover: Point | null }
	| { kind: 'wall'; ruinId: string; points: Point[]; downAt: Point | null; hover: Point | null };

type Drag =
	| { kind: 'move'; start: Layout; from: Point; ids: string[]; ref: Point }
	| { kind: 'rotate'; start: Layout; id: string; centre: Point; fromDeg: number }
	| { kind: 'resize'; start: Layout; id: string; corner: 0 | 1 | 2 | 3; deg: number; centre: Point; anchorFrame: Point };

export class BoardEditor {
	history = $state.raw<History>(startHistory({} as Layout));
	/** the layout as dragged, not yet recorded */
	preview = $state.raw<Layout | null>(null);
	tool = $state<Tool>('select');
	selectedId = $state<string | null>(null);
	selectedWall = $state<number | null>(null);
	snap = $state<SnapOptions>({ ...DEFAULT_SNAP });
	draft = $state.raw<Draft | null>(null);
	/** a one-line explanation of what the tool expects next, for the status bar */
	hint = $state('');
	#drag: Drag | null = null;

	layout = $derived(this.preview ?? this.history.present);
	canUndo = $derived(canUndo(this.history));
	canRedo = $derived(canRedo(this.history));
	selected = $derived(this.selectedId ? findItem(this.layout, this.selectedId) : null);

	constructor(layout: Layout) {
		this.history = startHistory(layout);
		this.setTool('select');
	}

	// --- commands --------------------------------------------------------------------------

	run(cmd: Command): void {
		this.history = execute(this.history, cmd);
	}
	undo(): void {
		this.cancelDraft();
		this.history = undo(this.history);
		this.#dropStaleSelection();
	}
	redo(): void {
		this.cancelDraft();
		this.history = redo(this.history);
		this.#dropStaleSelection();
	}
	/** Replace the whole document (after loading a saved copy); a fresh history. */
	reset(layout: Layout): void {
		this.history = startHistory(layout);
		this.preview = null;
		this.draft = null;
		this.selectedId = null;
	}

	deleteSelected(): void {
		if (!this.selectedId) return;
		this.run({ type: 'delete', ids: [this.selectedId] });
		this.selectedId = null;
		this.selectedWall = null;
	}

	removeSelectedWall(): void {
		if (this.selectedId && this.selectedWall !== null) {
			this.run({ type: 'remove-wall', id: this.selectedId, index: this.selectedWall });
			this.selectedWall = null;
		}
	}

	cycleGrid(): void {
		this.snap = { ...this.snap, gridIn: nextGrid(this.snap.gridIn) };
	}
	toggleAngleSnap(): void {
		this.snap = { ...this.snap, angle: !this.snap.angle };
	}

	setTool(tool: Tool): void {
		this.cancelDraft();
		this.tool = tool;
		this.hint = HINTS[tool];
		if (tool === 'wall' && this.selected?.collection === 'terrain' && this.selected.item.kind === 'ruin') {
			this.hint = 'Drag inside the ruin for a straight wall, or tap points and press “Finish wall”.';
		}
	}

	cancelDraft(): void {
		this.draft = null;
		this.preview = null;
		this.#drag = null;
	}

	/** Close the polygon (or wall) being tapped out. */
	finishDraft(): void {
		const d = this.draft;
		if (!d) return;
		if (d.kind === 'poly' && d.points.length >= 3) this.#addShape(d.points);
		if (d.kind === 'wall' && d.points.length >= 2) this.run({ type: 'add-wall', id: d.ruinId, wall: d.points });
		this.draft = null;
	}

	get draftCanFinish(): boolean {
		const d = this.draft;
		return !!d && ((d.kind === 'poly' && d.points.length >= 3) || (d.kind === 'wall' && d.points.length >= 2));
	}

	#dropStaleSelection() {
		if (this.selectedId && !findItem(this.history.present, this.selectedId)) this.selectedId = null;
	}

	#clampToBoard([x, y]: Point): Point {
		const { width, depth } = this.layout.board;
		return [Math.min(width, Math.max(0, x)), Math.min(depth, Math.max(0, y))];
	}

	#snapIn(p: { x: number; y: number }): Point {
		return snapPoint(this.#clampToBoard([p.x, p.y]), this.snap);
	}

	#addShape(outline: Point[]) {
		const L = this.history.present;
		const t = this.tool;
		let id: string;
		if (t === 'zone-a' || t === 'zone-b') {
			id = nextId(L, 'zone');
			this.run({ type: 'add-zone', zone: { id, side: t === 'zone-a' ? 'a' : 'b', outline } });
		} else if (t === 'block') {
			id = nextId(L, 'block');
			this.run({ type: 'add-terrain', terrain: { id, kind: 'block', outline, height: DEFAULT_BLOCK_HEIGHT_IN } });
		} else if (t === 'ruin') {
			id = nextId(L, 'ruin');
			this.run({ type: 'add-terrain', terrain: { id, kind: 'ruin', outline, walls: [] } });
		} else if (t === 'impassable' || t === 'area') {
			id = nextId(L, t);
			this.run({ type: 'add-terrain', terrain: { id, kind: t, outline } });
		} else return;
		if (findItem(this.history.present, id)) this.selectedId = id;
	}

	// --- gestures ----------------------------------------------------------------------------

	/** BoardCanvas's onboardpointer: true captures the gesture (else the board pans). */
	pointer = (e: BoardPointer): boolean => {
		switch (this.tool) {
			case 'select':
				return this.#selectPointer(e);
			case 'objective':
				if (e.phase === 'down') return true;
				if (e.phase === 'up') {
					const [x, y] = this.#snapIn(e.at);
					const id = nextId(this.history.present, 'objective');
					this.run({ type: 'add-objective', objective: { id, x, y } });
					if (findItem(this.history.present, id)) this.selectedId = id;
				}
				return false;
			case 'wall':
				return this.#wallPointer(e);
			default:
				return this.#shapePointer(e);
		}
	};

	#shapePointer(e: BoardPointer): boolean {
		const p = this.#snapIn(e.at);
		const d = this.draft;
		if (e.phase === 'down') {
			if (d?.kind !== 'poly') this.draft = { kind: 'rect', from: p, to: p, downAt: [e.at.x, e.at.y] };
			else this.draft = { ...d, hover: p };
			return true;
		}
		if (e.phase === 'move') {
			if (d?.kind === 'rect') this.draft = { ...d, to: p };
			else if (d?.kind === 'poly') this.draft = { ...d, hover: p };
			return false;
		}
		if (e.phase === 'cancel') {
			if (d?.kind === 'rect') this.draft = null;
			return false;
		}
		if (e.phase === 'up') {
			if (d?.kind === 'rect') {
				const moved = Math.hypot(e.at.x - d.downAt[0], e.at.y - d.downAt[1]);
				if (moved < TAP_IN) {
					// a tap starts a polygon: each further tap adds a corner
					this.draft = { kind: 'poly', points: [d.from], hover: null };
					this.hint = 'Tap each corner, then press “Finish shape”.';
				} else {
					const outline = rectOutline(d.from, p);
					this.draft = null;
					this.#addShape(outline);
				}
			} else if (d?.kind === 'poly') {
				const last = d.points[d.points.length - 1];
				const same = last && last[0] === p[0] && last[1] === p[1];
				this.draft = { kind: 'poly', points: same ? d.points : [...d.points, p], hover: null };
			}
		}
		return false;
	}

	#wallPointer(e: BoardPointer): boolean {
		const p = this.#snapIn(e.at);
		let d = this.draft;
		if (e.phase === 'down') {
			const ruinId =
				d?.kind === 'wall'
					? d.ruinId
					: e.target && (e.target.layer === 'terrain' || e.target.layer === 'wall') && findItem(this.layout, e.target.id)?.item && isRuin(this.layout, e.target.id)
						? e.target.id
						: this.selectedId && isRuin(this.layout, this.selectedId)
							? this.selectedId
							: null;
			if (!ruinId) {
				this.hint = 'Walls belong to a ruin: tap inside a ruin first (or draw one with the Ruin tool).';
				return false;
			}
			this.selectedId = ruinId;
			d = d?.kind === 'wall' ? { ...d, downAt: p } : { kind: 'wall', ruinId, points: [], downAt: p, hover: p };
			this.draft = d;
			return true;
		}
		if (d?.kind !== 'wall') return false;
		if (e.phase === 'move') this.draft = { ...d, hover: p };
		else if (e.phase === 'cancel') this.draft = { ...d, downAt: null, hover: null };
		else if (e.phase === 'up' && d.downAt) {
			const start = d.downAt;
			if (d.points.length === 0 && Math.hypot(p[0] - start[0], p[1] - start[1]) >= TAP_IN) {
				// a drag from an empty draft is one straight wall
				this.run({ type: 'add-wall', id: d.ruinId, wall: [start, p] });
				this.draft = null;
			} else {
				const last = d.points[d.points.length - 1];
				const same = last && last[0] === p[0] && last[1] === p[1];
				this.draft = { ...d, points: same ? d.points : [...d.points, p], downAt: null, hover: null };
				this.hint = 'Tap the next point of the wall, then press “Finish wall”.';
			}
		}
		return false;
	}

	#selectPointer(e: BoardPointer): boolean {
		const at: Point = [e.at.x, e.at.y];
		if (e.phase === 'tap') {
			// taps on empty felt clear the selection; taps on items were handled at 'down'
			if (!e.target) {
				this.selectedId = null;
				this.selectedWall = null;
			}
			return false;
		}
		if (e.phase === 'down') {
			const t = e.target;
			if (!t) return false;
			const start = this.history.present;
			if (t.layer === 'handle' && this.selectedId) {
				const item = findItem(start, this.selectedId);
				if (!item || item.collection === 'objectives') return false;
				const outline = item.item.outline;
				if (t.id === 'rotate') {
					const centre = centroid(outline);
					this.#drag = { kind: 'rotate', start, id: this.selectedId, centre, fromDeg: Math.atan2(at[1] - centre[1], at[0] - centre[0]) / DEG };
					return true;
				}
				const corner = Number(t.id.replace('corner-', '')) as 0 | 1 | 2 | 3;
				const { box, deg, centre } = frameBox(outline);
				const anchor = (corner + 2) % 4;
				const frameCorners: Point[] = [
					[box.minX, box.minY],
					[box.maxX, box.minY],
					[box.maxX, box.maxY],
					[box.minX, box.maxY]
				];
				this.#drag = { kind: 'resize', start, id: this.selectedId, corner, deg, centre, anchorFrame: frameCorners[anchor] };
				return true;
			}
			const id = t.id;
			const item = findItem(start, id);
			if (!item) return false;
			this.selectedId = id;
			this.selectedWall = t.layer === 'wall' ? (t.index ?? null) : null;
			const ref: Point = item.collection === 'objectives' ? [item.item.x, item.item.y] : (item.item.outline[0] as Point);
			this.#drag = { kind: 'move', start, from: at, ids: [id], ref };
			return true;
		}
		const drag = this.#drag;
		if (!drag) return false;
		if (e.phase === 'cancel') {
			this.#drag = null;
			this.preview = null;
			return false;
		}
		const cmd = this.#dragCommand(drag, at);
		if (e.phase === 'move') this.preview = cmd ? perform(drag.start, cmd) : null;
		if (e.phase === 'up') {
			this.preview = null;
			this.#drag = null;
			if (cmd) this.run(cmd);
		}
		return false;
	}

	#dragCommand(drag: Drag, at: Point): Command | null {
		if (drag.kind === 'move') {
			const [dx, dy] = snapDelta(drag.ref, at[0] - drag.from[0], at[1] - drag.from[1], this.snap);
			return dx === 0 && dy === 0 ? null : { type: 'move', ids: drag.ids, dx, dy };
		}
		if (drag.kind === 'rotate') {
			const now = Math.atan2(at[1] - drag.centre[1], at[0] - drag.centre[0]) / DEG;
			const deg = snapAngle(now - drag.fromDeg, this.snap);
			return deg === 0 ? null : { type: 'rotate', id: drag.id, deg, about: drag.centre };
		}
		// resize: the pointer in the item's own frame, measured from the fixed corner
		const [fx, fy] = rotatePoint(at, drag.centre, -drag.deg);
		const step = this.snap.gridIn;
		const size = (v: number) => Math.max(0.25, step ? snapValue(Math.abs(v), step) || step : Math.abs(v));
		const anchor = ((drag.corner + 2) % 4) as Anchor;
		return { type: 'resize', id: drag.id, widthIn: size(fx - drag.anchorFrame[0]), depthIn: size(fy - drag.anchorFrame[1]), anchor };
	}

	// --- what the canvas draws above the layout ----------------------------------------------

	overlays = $derived.by((): Overlay[] => {
		const out: Overlay[] = [];
		const L = this.layout;
		const sel = this.selectedId ? findItem(L, this.selectedId) : null;
		if (sel && sel.collection !== 'objectives' && this.tool === 'select') {
			const { box, deg, centre } = frameBox(sel.item.outline);
			const corners: Point[] = [
				[box.minX, box.minY],
				[box.maxX, box.minY],
				[box.maxX, box.maxY],
				[box.minX, box.maxY]
			];
			const world = corners.map((c) => rotatePoint(c, centre, deg));
			out.push({ kind: 'path', points: world.map(([x, y]) => ({ x, y })), tone: 'brass', dashed: true, closed: true });
			const top = rotatePoint([(box.minX + box.maxX) / 2, box.minY - ROTATE_HANDLE_IN], centre, deg);
			const topMid = rotatePoint([(box.minX + box.maxX) / 2, box.minY], centre, deg);
			out.push({ kind: 'link', from: { x: topMid[0], y: topMid[1] }, to: { x: top[0], y: top[1] }, tone: 'brass' });
			world.forEach(([x, y], i) => out.push({ kind: 'handle', id: `corner-${i}`, x, y, shape: 'square' }));
			out.push({ kind: 'handle', id: 'rotate', x: top[0], y: top[1], shape: 'rotate' });
			const w = box.maxX - box.minX;
			const h = box.maxY - box.minY;
			const below = rotatePoint([(box.minX + box.maxX) / 2, box.maxY + 0.8], centre, deg);
			out.push({ kind: 'label', x: below[0], y: below[1], text: `${w.toFixed(2)} × ${h.toFixed(2)} in`, tone: 'brass', sizePx: 12 });
		}
		if (sel && sel.collection === 'terrain' && sel.item.kind === 'ruin' && this.selectedWall !== null) {
			const wall = sel.item.walls?.[this.selectedWall];
			if (wall) out.push({ kind: 'path', points: wall.map(([x, y]) => ({ x, y })), tone: 'signal', dashed: true });
		}
		const d = this.draft;
		if (d?.kind === 'rect') {
			const r = rectOutline(d.from, d.to);
			out.push({ kind: 'path', points: r.map(([x, y]) => ({ x, y })), tone: 'brass', closed: true, fill: true, dashed: true });
			const w = Math.abs(d.to[0] - d.from[0]);
			const h = Math.abs(d.to[1] - d.from[1]);
			if (w > 0 || h > 0) out.push({ kind: 'label', x: (d.from[0] + d.to[0]) / 2, y: (d.from[1] + d.to[1]) / 2, text: `${w.toFixed(2)} × ${h.toFixed(2)} in`, tone: 'brass' });
		} else if (d?.kind === 'poly' || d?.kind === 'wall') {
			const pts = d.hover ? [...d.points, d.hover] : d.points;
			if (pts.length > 1) out.push({ kind: 'path', points: pts.map(([x, y]) => ({ x, y })), tone: d.kind === 'wall' ? 'ink' : 'brass', dashed: d.kind === 'poly', closed: d.kind === 'poly' && pts.length > 2, fill: d.kind === 'poly' });
			d.points.forEach(([x, y], i) => out.push({ kind: 'handle', id: `draft-${i}`, x, y, shape: 'round' }));
		}
		return out;
	});
}

function isRuin(layout: Layout, id: string): boolean {
	const f = findItem(layout, id);
	return f?.collection === 'terrain' && f.item.kind === 'ruin';
}

const HINTS: Record<Tool, string> = {
	select: 'Tap an item to select it; drag it to move; use the handles to resize or rotate. Drag the felt to pan.',
	block: 'Drag a rectangle for a block, or tap its corners and press “Finish shape”.',
	ruin: 'Drag a rectangle for the ruin’s floor, or tap its corners; then add walls with the Wall tool.',
	wall: 'Tap inside a ruin, then drag a straight wall or tap its points and press “Finish wall”.',
	impassable: 'Drag a rectangle for impassable ground, or tap its corners and press “Finish shape”.',
	area: 'Drag a rectangle for area terrain, or tap its corners and press “Finish shape”.',
	objective: 'Tap where the objective marker goes.',
	'zone-a': 'Drag a rectangle for side A’s deployment zone, or tap its corners.',
	'zone-b': 'Drag a rectangle for side B’s deployment zone, or tap its corners.'
};
