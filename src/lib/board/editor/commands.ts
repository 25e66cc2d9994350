// Editor commands as pure functions: perform(layout, command) → the next layout. A command
// that does not apply (unknown id, out-of-range value) returns the same layout object, so the
// history can tell a no-op from an edit. Layouts are never mutated.
import type { Layout, LayoutObjective, LayoutTerrain, Point, Side, Zone } from '$lib/schemas/layout';
import { boardSizeSchema } from '$lib/schemas/layout';
import { LIMITS } from '$lib/schemas/check';
import { centroid, frameBox, rotatePoints, tidyPoints, tidy, translatePoints } from '../geometry';

/** Smallest side of a resized outline, in: below this a piece of terrain cannot be picked. */
export const MIN_SIZE_IN = 0.25;
export const MAX_HEIGHT_IN = 100;

/** Which corner of the item's own box stays put while resizing (0 top-left, clockwise), or the centre. */
export type Anchor = 0 | 1 | 2 | 3 | 'centre';

export type Command =
	| { type: 'add-terrain'; terrain: LayoutTerrain }
	| { type: 'add-objective'; objective: LayoutObjective }
	| { type: 'add-zone'; zone: Zone }
	| { type: 'move'; ids: string[]; dx: number; dy: number }
	| { type: 'rotate'; id: string; deg: number; about?: Point }
	| { type: 'resize'; id: string; widthIn: number; depthIn: number; anchor: Anchor }
	| { type: 'set-outline'; id: string; outline: Point[] }
	| { type: 'set-height'; id: string; heightIn: number }
	| { type: 'add-wall'; id: string; wall: Point[] }
	| { type: 'remove-wall'; id: string; index: number }
	| { type: 'rename'; id: string; name: string }
	| { type: 'set-side'; id: string; side: Side }
	| { type: 'delete'; ids: string[] }
	| { type: 'set-board'; width: number; depth: number }
	| { type: 'set-layout-name'; name: string };

/** The next free id with this prefix ("block-3"), unique across the whole layout. */
export function nextId(layout: Layout, prefix: string): string {
	const taken = new Set(allIds(layout));
	let n = 1;
	for (const id of taken) {
		const m = id.startsWith(prefix + '-') ? Number(id.slice(prefix.length + 1)) : NaN;
		if (Number.isInteger(m) && m >= n) n = m + 1;
	}
	while (taken.has(`${prefix}-${n}`)) n++;
	return `${prefix}-${n}`;
}

export function allIds(layout: Layout): string[] {
	return [...layout.terrain.map((t) => t.id), ...layout.objectives.map((o) => o.id), ...layout.zones.map((z) => z.id)];
}

/** Whatever has this id, with its collection name. */
export function findItem(layout: Layout, id: string) {
	const t = layout.terrain.find((x) => x.id === id);
	if (t) return { collection: 'terrain' as const, item: t };
	const o = layout.objectives.find((x) => x.id === id);
	if (o) return { collection: 'objectives' as const, item: o };
	const z = layout.zones.find((x) => x.id === id);
	if (z) return { collection: 'zones' as const, item: z };
	return null;
}

const validOutline = (o: readonly (readonly [number, number])[]) =>
	o.length >= 3 && o.length <= LIMITS.outlinePoints && o.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y));

/** Apply a point map to an item's outline and walls (terrain, zones). */
function mapShape<T extends LayoutTerrain | Zone>(item: T, f: (pts: Point[]) => Point[]): T {
	const next = { ...item, outline: tidyPoints(f(item.outline as Point[])) } as T;
	if ('walls' in item && item.walls) (next as { walls?: Point[][] }).walls = item.walls.map((w) => tidyPoints(f(w as Point[])));
	return next;
}

function updateShaped(layout: Layout, id: string, f: (item: LayoutTerrain | Zone) => LayoutTerrain | Zone | null): Layout {
	const ti = layout.terrain.findIndex((t) => t.id === id);
	if (ti >= 0) {
		const next = f(layout.terrain[ti]);
		if (!next) return layout;
		const terrain = layout.terrain.slice();
		terrain[ti] = next as LayoutTerrain;
		return { ...layout, terrain };
	}
	const zi = layout.zones.findIndex((z) => z.id === id);
	if (zi >= 0) {
		const next = f(layout.zones[zi]);
		if (!next) return layout;
		const zones = layout.zones.slice();
		zones[zi] = next as Zone;
		return { ...layout, zones };
	}
	return layout;
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

export function perform(layout: Layout, cmd: Command): Layout {
	switch (cmd.type) {
		case 'add-terrain': {
			if (findItem(layout, cmd.terrain.id) || !validOutline(cmd.terrain.outline) || layout.terrain.length >= LIMITS.terrain) return layout;
			return { ...layout, terrain: [...layout.terrain, mapShape(cmd.terrain, (p) => p)] };
		}
		case 'add-objective': {
			const { x, y } = cmd.objective;
			if (findItem(layout, cmd.objective.id) || layout.objectives.length >= LIMITS.objectives) return layout;
			if (x < 0 || y < 0 || x > layout.board.width || y > layout.board.depth) return layout;
			return { ...layout, objectives: [...layout.objectives, { ...cmd.objective, x: tidy(x), y: tidy(y) }] };
		}
		case 'add-zone': {
			if (findItem(layout, cmd.zone.id) || !validOutline(cmd.zone.outline)) return layout;
			return { ...layout, zones: [...layout.zones, mapShape(cmd.zone, (p) => p)] };
		}
		case 'move': {
			if ((cmd.dx === 0 && cmd.dy === 0) || !Number.isFinite(cmd.dx) || !Number.isFinite(cmd.dy)) return layout;
			const ids = new Set(cmd.ids);
			let changed = false;
			const shift = <T extends LayoutTerrain | Zone>(item: T): T => {
				if (!ids.has(item.id)) return item;
				changed = true;
				return mapShape(item, (p) => translatePoints(p, cmd.dx, cmd.dy));
			};
			const terrain = layout.terrain.map(shift);
			const zones = layout.zones.map(shift);
			const objectives = layout.objectives.map((o) => {
				if (!ids.has(o.id)) return o;
				changed = true;
				// a marker stays on the table: off it, it could never be held
				return { ...o, x: tidy(clamp(o.x + cmd.dx, 0, layout.board.width)), y: tidy(clamp(o.y + cmd.dy, 0, layout.board.depth)) };
			});
			return changed ? { ...layout, terrain, zones, objectives } : layout;
		}
		case 'rotate': {
			if (!Number.isFinite(cmd.deg) || cmd.deg % 360 === 0) return layout;
			return updateShaped(layout, cmd.id, (item) => {
				const about = cmd.about ?? centroid(item.outline);
				return mapShape(item, (p) => rotatePoints(p, about, cmd.deg));
			});
		}
		case 'resize': {
			if (!(cmd.widthIn >= MIN_SIZE_IN) || !(cmd.depthIn >= MIN_SIZE_IN) || cmd.widthIn > 1000 || cmd.depthIn > 1000) return layout;
			return updateShaped(layout, cmd.id, (item) => {
				// scale in the item's own frame so a rotated rectangle stays a rectangle
				const { box, deg, centre } = frameBox(item.outline);
				const w = box.maxX - box.minX;
				const h = box.maxY - box.minY;
				if (w < 1e-9 || h < 1e-9) return null;
				const sx = cmd.widthIn / w;
				const sy = cmd.depthIn / h;
				if (Math.abs(sx - 1) < 1e-9 && Math.abs(sy - 1) < 1e-9) return null;
				const corners: Point[] = [
					[box.minX, box.minY],
					[box.maxX, box.minY],
					[box.maxX, box.maxY],
					[box.minX, box.maxY]
				];
				const [ax, ay] = cmd.anchor === 'centre' ? [(box.minX + box.maxX) / 2, (box.minY + box.maxY) / 2] : corners[cmd.anchor];
				return mapShape(item, (p) =>
					rotatePoints(
						rotatePoints(p, centre, -deg).map(([x, y]): Point => [ax + (x - ax) * sx, ay + (y - ay) * sy]),
						centre,
						deg
					)
				);
			});
		}
		case 'set-outline':
			if (!validOutline(cmd.outline)) return layout;
			return updateShaped(layout, cmd.id, (item) => ({ ...item, outline: tidyPoints(cmd.outline) }));
		case 'set-height': {
			if (!(cmd.heightIn >= 0 && cmd.heightIn <= MAX_HEIGHT_IN)) return layout;
			const i = layout.terrain.findIndex((t) => t.id === cmd.id);
			const t = layout.terrain[i];
			if (!t || t.kind !== 'block' || t.height === cmd.heightIn) return layout;
			const terrain = layout.terrain.slice();
			terrain[i] = { ...t, height: tidy(cmd.heightIn) };
			return { ...layout, terrain };
		}
		case 'add-wall': {
			const i = layout.terrain.findIndex((t) => t.id === cmd.id);
			const t = layout.terrain[i];
			if (!t || t.kind !== 'ruin' || cmd.wall.length < 2 || cmd.wall.length > LIMITS.wallPoints) return layout;
			if ((t.walls ?? []).length >= LIMITS.walls) return layout;
			const terrain = layout.terrain.slice();
			terrain[i] = { ...t, walls: [...(t.walls ?? []), tidyPoints(cmd.wall)] };
			return { ...layout, terrain };
		}
		case 'remove-wall': {
			const i = layout.terrain.findIndex((t) => t.id === cmd.id);
			const t = layout.terrain[i];
			if (!t || t.kind !== 'ruin' || !t.walls || cmd.index < 0 || cmd.index >= t.walls.length) return layout;
			const terrain = layout.terrain.slice();
			terrain[i] = { ...t, walls: t.walls.filter((_, k) => k !== cmd.index) };
			return { ...layout, terrain };
		}
		case 'rename': {
			const name = cmd.name.trim().slice(0, 60);
			const found = findItem(layout, cmd.id);
			if (!found || (found.item.name ?? '') === name) return layout;
			const rename = <T extends { id: string; name?: string }>(x: T): T => {
				if (x.id !== cmd.id) return x;
				const next = { ...x };
				if (name) next.name = name;
				else delete next.name;
				return next;
			};
			return { ...layout, terrain: layout.terrain.map(rename), objectives: layout.objectives.map(rename), zones: layout.zones.map(rename) };
		}
		case 'set-side': {
			const i = layout.zones.findIndex((z) => z.id === cmd.id);
			if (i < 0 || layout.zones[i].side === cmd.side) return layout;
			const zones = layout.zones.slice();
			zones[i] = { ...zones[i], side: cmd.side };
			return { ...layout, zones };
		}
		case 'delete': {
			const ids = new Set(cmd.ids);
			const terrain = layout.terrain.filter((t) => !ids.has(t.id));
			const objectives = layout.objectives.filter((o) => !ids.has(o.id));
			const zones = layout.zones.filter((z) => !ids.has(z.id));
			if (terrain.length + objectives.length + zones.length === layout.terrain.length + layout.objectives.length + layout.zones.length) return layout;
			return { ...layout, terrain, objectives, zones };
		}
		case 'set-board': {
			if (!boardSizeSchema.safeParse({ width: cmd.width, depth: cmd.depth }).success) return layout;
			if (cmd.width === layout.board.width && cmd.depth === layout.board.depth) return layout;
			// markers that would fall off a smaller table are pulled to its edge, not lost
			const objectives = layout.objectives.map((o) =>
				o.x <= cmd.width && o.y <= cmd.depth ? o : { ...o, x: Math.min(o.x, cmd.width), y: Math.min(o.y, cmd.depth) }
			);
			return { ...layout, board: { width: cmd.width, depth: cmd.depth }, objectives };
		}
		case 'set-layout-name': {
			const name = cmd.name.trim().slice(0, 100);
			if (!name || name === layout.name) return layout;
			return { ...layout, name };
		}
	}
}
