// Drawing the route finder's answers on the board (layers in inches, like BoardCanvas's): the
// reach map as one shaded shape (holes cut out by the even-odd rule) with a dashed edge, the route
// as a line with its cost as a chip, and the same as Overlay items for the canvas's overlay list.
import type Konva from 'konva';
import type { ReachMap, RouteResult } from '$lib/referee/route';
import { PALETTE } from '../palette';
import type { Overlay } from '../types';

/** "5.84 in of 6.00": figures with units and two decimals. */
export function costLabel(route: RouteResult): string {
	return `${route.costIn.toFixed(2)} in of ${route.allowanceIn.toFixed(2)}`;
}

/**
 * The reach map as a Konva shape in board inches. `scale` is px per inch (for the edge's width and
 * dashes in screen pixels). The dashed edge carries the meaning too, not only the shading.
 */
export function reachMapShape(K: typeof Konva, map: ReachMap, scale: number, colour: string = PALETTE.ok): Konva.Shape {
	const px = (v: number) => v / scale;
	return new K.Shape({
		listening: false,
		sceneFunc: (ctx) => {
			const c = ctx._context;
			c.beginPath();
			for (const ring of map.rings) {
				for (let i = 0; i < ring.length; i += 2) (i === 0 ? c.moveTo(ring[0], ring[1]) : c.lineTo(ring[i], ring[i + 1]));
				c.closePath();
			}
			c.fillStyle = colour + '2e';
			c.fill('evenodd');
			c.setLineDash([px(7), px(5)]);
			c.lineWidth = px(2);
			c.strokeStyle = colour;
			c.stroke();
			c.setLineDash([]);
		}
	});
}

/** The route from the start as a Konva line (arrow at the end), in board inches. */
export function routeLine(K: typeof Konva, start: { x: number; y: number }, route: RouteResult, scale: number): Konva.Arrow {
	const pts = [start.x, start.y];
	for (const w of route.waypoints) pts.push(w.x, w.y);
	const px = (v: number) => v / scale;
	return new K.Arrow({
		points: pts,
		stroke: route.reachable ? PALETTE.ink700 : PALETTE.signal500,
		fill: route.reachable ? PALETTE.ink700 : PALETTE.signal500,
		strokeWidth: px(3),
		pointerLength: px(10),
		pointerWidth: px(10),
		dash: route.reachable ? undefined : [px(6), px(5)],
		lineCap: 'round',
		lineJoin: 'round',
		listening: false
	});
}

/** The reach map's edges as overlay paths (outlines only: the overlay list cannot cut holes). */
export function reachOverlays(map: ReachMap): Overlay[] {
	return map.rings.map((ring) => {
		const points = [];
		for (let i = 0; i < ring.length; i += 2) points.push({ x: ring[i], y: ring[i + 1] });
		return { kind: 'path', points, tone: 'ok', dashed: true, closed: true } as Overlay;
	});
}

/** The route as overlays: the path with an arrow, its cost as a label, a warning when refused. */
export function routeOverlays(start: { x: number; y: number }, route: RouteResult): Overlay[] {
	const points = [{ x: start.x, y: start.y }, ...route.waypoints];
	const end = points[points.length - 1];
	const out: Overlay[] = [{ kind: 'path', points, tone: route.reachable ? 'ink' : 'signal', dashed: !route.reachable, arrow: true }];
	if (route.costIn < Infinity) out.push({ kind: 'label', x: end.x, y: end.y, text: costLabel(route), tone: route.reachable ? 'ink' : 'signal' });
	if (!route.reachable) out.push({ kind: 'warning', x: end.x, y: end.y, label: route.reason });
	return out;
}
