// Summaries after a move (not findings): who holds each objective marker and each side's value
// there, and which friendly units each support ring covers, and which the move took out of it.
import type { CheckReport } from '../schemas/check';
import { boxOf, signedDistance, type Rounded } from './convex';
import { mmToIn } from './profile';
import { frameOf, lowerGap, type Reach } from './bounds';
import { pairGap, type Scene, type ScenePiece } from './scene';

type Summaries = CheckReport['summaries'];

export function objectiveSummaries(scene: Scene): Summaries['objectives'] {
	const { profile, request } = scene;
	const within = profile.objectiveRange + profile.tolerance;
	const sides: string[] = [];
	for (const p of scene.pieces) if (!sides.includes(p.side)) sides.push(p.side);
	return (request.board.objectives ?? []).map((o) => {
		// the marker is a round footprint of markerMm
		const marker: Rounded = { pts: [o.x, o.y], r: mmToIn(profile.markerMm) / 2 };
		const markerReach: Reach = { kind: 0, r: marker.r, a: 0, b: 0, innerScale: 0, pts: [], innerDisk: marker.r };
		const markerFrame = frameOf(o.x, o.y, 0);
		const holders = scene
			.nearEnd(boxOf(marker.pts, marker.r), within)
			.filter(
				(p) =>
					Math.hypot(p.endPose.x - o.x, p.endPose.y - o.y) - p.reachIn - marker.r <= within &&
					(p.round || lowerGap(p.reach, p.endFrame, markerReach, markerFrame) <= within) &&
					signedDistance(p.end, marker) <= within
			);
		const value: Record<string, number> = {};
		for (const s of sides) value[s] = 0;
		const units: string[] = [];
		for (const p of holders) {
			value[p.side] += p.src.value ?? profile.pieceValue;
			if (!units.includes(p.unit)) units.push(p.unit);
		}
		return { id: o.id, pieces: holders.map((p) => p.id), units, value };
	});
}

function covered(scene: Scene, source: ScenePiece, radiusIn: number, after: boolean): string[] {
	const within = radiusIn + scene.profile.tolerance;
	const shape = after ? source.end : source.start;
	const box = after ? source.endBox : source.startBox;
	const near = after ? scene.nearEnd(box, within) : scene.nearStart(box, within);
	const units: string[] = [];
	for (const p of near) {
		if (p.side !== source.side || units.includes(p.unit)) continue;
		if (pairGap(source, after, p, after) > within) continue;
		if (signedDistance(shape, after ? p.end : p.start) <= within) units.push(p.unit);
	}
	return units;
}

export function ringSummaries(scene: Scene): Summaries['rings'] {
	const out: Summaries['rings'] = [];
	for (const p of scene.pieces) {
		if (!p.src.ring) continue;
		const radius = p.src.ring.radius ?? scene.profile.ringRadius;
		const before = covered(scene, p, radius, false);
		const covers = covered(scene, p, radius, true);
		out.push({ source: p.id, covers, lost: before.filter((u) => !covers.includes(u)) });
	}
	return out;
}
