// The check itself: applies every rule of the profile to a proposed move and assembles the report
// (verdict, per-piece cost and findings, unit findings, summaries). Pure and deterministic.
import type { CheckReport, CheckRequest, Finding, PieceReport } from '../schemas/check';
import { boxOf, pointSegmentDistance, signedDistance, type Box, type Rounded } from './convex';
import { classList, inches, limitText } from './messages';
import { climbIn, horizontalIn, pathSteps, pivotIn, type PathStep, type Touch } from './path-cost';
import { resolveProfile } from './profile';
import { frameOf, lowerPivotGap, lowerSweepGap } from './bounds';
import { pairGap, Scene, type ScenePiece } from './scene';
import { spacingFindings } from './spacing';
import { objectiveSummaries, ringSummaries } from './summaries';
import { PivotCover, translationSweep } from './sweep';
import { distanceToRegion, meetsRegion, overhangOf, touchIntervals, wallMet, type PreparedTerrain } from './terrain';

function finding(
	code: Finding['code'],
	pieces: string[],
	measured: number,
	limit: number,
	message: string,
	extra: { severity?: Finding['severity']; terrain?: string } = {}
): Finding {
	const f: Finding = { code, severity: extra.severity ?? 'error', pieces, measured, limit, message };
	if (extra.terrain !== undefined) f.terrain = extra.terrain;
	return f;
}

/**
 * The swept regions of one leg, piece by piece (a turn is covered by several): outer (for
 * pieces) and inner (shrunk by ε, for terrain). Each is built only when a test reaches it: the
 * inner forms lie inside the outer ones, so they are needed only when terrain is near the outer.
 */
class Leg {
	/** how many pieces cover the leg */
	readonly count: number;
	private readonly boxes: Box[];
	private readonly outerCover: PivotCover | null = null;
	private innerCover: PivotCover | null = null;
	private outerSweep: Rounded | null = null;
	private innerSweep: Rounded | null = null;
	private _innerStart: Rounded | null = null;

	constructor(
		private readonly scene: Scene,
		private readonly p: ScenePiece,
		readonly step: PathStep
	) {
		const f = step.from;
		if (step.kind === 'move') {
			const outer = translationSweep(placeOuter(p, f.x, f.y, f.facingDeg), step.dx, step.dy);
			this.outerSweep = outer;
			this.count = 1;
			this.boxes = [boxOf(outer.pts, outer.r)];
		} else {
			const cover = new PivotCover(p.local.outer, p.local.rMaxIn, f.x, f.y, f.facingDeg, step.deltaDeg);
			this.outerCover = cover;
			// a round base's copies are one and the same disk: one of them answers for all
			this.count = p.round ? 1 : cover.count;
			this.boxes = [];
			for (let i = 0; i < this.count; i++) this.boxes.push(cover.box(i));
		}
	}

	box(i: number): Box {
		return this.boxes[i];
	}

	outer(i: number): Rounded {
		return this.outerSweep ?? this.outerCover!.piece(i);
	}

	/** the pivot's cover (null for a straight leg), for distance brackets */
	get cover(): PivotCover | null {
		return this.outerCover;
	}

	/** the inner form where the leg starts */
	get innerStart(): Rounded {
		return (this._innerStart ??= this.scene.inner(this.p, this.step.from));
	}

	inner(i: number): Rounded {
		const { step, p } = this;
		if (step.kind === 'move') return (this.innerSweep ??= translationSweep(this.innerStart, step.dx, step.dy));
		const f = step.from;
		this.innerCover ??= new PivotCover(p.local.inner, p.local.rMaxIn, f.x, f.y, f.facingDeg, step.deltaDeg);
		return this.innerCover.piece(i);
	}
}

function legsOf(scene: Scene, p: ScenePiece, steps: PathStep[]): Leg[] {
	return steps.map((step) => new Leg(scene, p, step));
}

function placeOuter(p: ScenePiece, x: number, y: number, facingDeg: number): Rounded {
	if (x === p.startPose.x && y === p.startPose.y && facingDeg === p.startPose.facingDeg) return p.start;
	const lp = p.local.outer.pts;
	if (lp.length === 2) return { pts: [x + lp[0], y + lp[1]], r: p.local.outer.r };
	const th = (facingDeg * Math.PI) / 180;
	const c = Math.cos(th);
	const s = Math.sin(th);
	const pts = new Array<number>(lp.length);
	for (let i = 0; i < lp.length; i += 2) {
		pts[i] = x + lp[i] * c - lp[i + 1] * s;
		pts[i + 1] = y + lp[i] * s + lp[i + 1] * c;
	}
	return { pts, r: p.local.outer.r };
}

/** How far a box reaches beyond the board's edges (≤ 0 when on it). */
function offBoardBy(b: Box, widthIn: number, depthIn: number): number {
	return Math.max(-b.minX, -b.minY, b.maxX - widthIn, b.maxY - depthIn);
}

export function runCheck(request: CheckRequest): CheckReport {
	const profile = resolveProfile(request.profile);
	const eps = profile.tolerance;
	const keepOutWithin = profile.keepOut + eps;
	const scene = new Scene(request, profile);
	const { move } = request;
	const kind = move.kind;
	const members = scene.members;
	const { width: widthIn, depth: depthIn } = request.board;
	const climbers = new Set<string>(profile.climbers);
	const wallPassers = new Set<string>(profile.wallPassers);

	const unitFindings: Finding[] = [];
	const perPiece = new Map<string, Finding[]>();
	const reports: Record<string, PieceReport> = {};
	for (const m of members) perPiece.set(m.id, []);
	const add = (f: Finding) => perPiece.get(f.pieces[0])!.push(f);

	// ---- Start: contact with an enemy at the start of the move
	let closest: { d: number; a: ScenePiece; b: ScenePiece } | null = null;
	for (const m of members) {
		for (const o of scene.nearStart(m.startBox, keepOutWithin)) {
			if (o.side === m.side) continue;
			if (pairGap(m, false, o, false) > keepOutWithin) continue;
			const d = signedDistance(m.start, o.start);
			if (d <= keepOutWithin && (!closest || d < closest.d)) closest = { d, a: m, b: o };
		}
	}
	if (closest && (kind === 'move' || kind === 'dash')) {
		unitFindings.push(
			finding(
				'locked',
				[closest.a.id, closest.b.id],
				closest.d,
				profile.keepOut,
				`${closest.a.id} starts ${inches(closest.d)} in from enemy ${closest.b.id}; a unit within ${limitText(profile.keepOut)} in of an enemy may only hold or withdraw`
			)
		);
	}
	if (!closest && kind === 'withdraw') {
		const nearest = nearestEnemy(scene, members);
		const tail = nearest
			? `its nearest enemy is ${inches(nearest.d)} in away`
			: 'there is no enemy on the table';
		unitFindings.push(
			finding(
				'not-in-contact',
				nearest ? [nearest.a.id, nearest.b.id] : [members[0].id],
				nearest ? nearest.d : Number.MAX_VALUE,
				profile.keepOut,
				`unit ${move.unit} withdraws without being within ${limitText(profile.keepOut)} in of an enemy (${tail}); the withdraw is legal but gives up its move`,
				{ severity: 'warning' }
			)
		);
	}

	const allowanceIn = (m: ScenePiece) =>
		kind === 'hold' ? 0 : kind === 'dash' ? m.src.allowance + (move.die ?? 0) : m.src.allowance;

	// ---- Each piece: cost and path
	for (const m of members) {
		const waypoints = m.moved ? move.paths![m.id] : [];
		const steps = pathSteps(m.src.at, waypoints);
		const legs = legsOf(scene, m, steps);
		const climbs = m.flies ? profile.fliersPayClimb : true;
		const touches: Touch[] = [];
		const blocked = new Map<string, PreparedTerrain>();
		const walled = new Map<string, PreparedTerrain>();
		const impassable = new Map<string, PreparedTerrain>();
		let worstOffBoard = -Infinity;
		const minToOther = new Map<ScenePiece, number>();

		legs.forEach((leg, li) => {
			// the frame the leg starts from, for the sweep's distance brackets (straight legs only)
			const legFrame = leg.step.kind === 'move' ? frameOf(leg.step.from.x, leg.step.from.y, leg.step.from.facingDeg) : null;
			const cover = leg.cover;
			for (let si = 0; si < leg.count; si++) {
				const box = leg.box(si);
				worstOffBoard = Math.max(worstOffBoard, offBoardBy(box, widthIn, depthIn));
				if (!m.flies) {
					const f = leg.step.from;
					const [dx, dy] = leg.step.kind === 'move' ? [leg.step.dx, leg.step.dy] : [0, 0];
					for (const o of scene.nearStart(box, keepOutWithin)) {
						// only enemies (keep-out, through) and bulky pairs matter on the way
						const enemy = o.side !== m.side;
						if (!enemy && !(m.bulky && o.bulky)) continue;
						const need = enemy ? keepOutWithin : 0;
						const lb = pointSegmentDistance(o.startPose.x, o.startPose.y, f.x, f.y, f.x + dx, f.y + dy) - m.reachIn - o.reachIn;
						if (lb > need) continue;
						// unit-mates that also move are not where they started, so they do not block each other;
						// a unit-mate that stays put is an obstacle like any friendly piece
						if (o.member && o.moved) continue;
						if (!(m.round && o.round)) {
							if (legFrame && lowerSweepGap(m.reach, legFrame, dx, dy, o.reach, o.startFrame) > need) continue;
							if (cover && lowerPivotGap(m.reach, cover, si, o.reach, o.startFrame) > need) continue;
						}
						const d = signedDistance(leg.outer(si), o.start);
						const prev = minToOther.get(o);
						if (prev === undefined || d < prev) minToOther.set(o, d);
					}
				}
				// no terrain near the outer sweep: none near the inner one inside it
				if (!scene.anyTerrainNear(box)) continue;
				const inner = leg.inner(si);
				const innerBox = boxOf(inner.pts, inner.r);
				for (const t of scene.terrainNear(innerBox)) {
					if (t.kind === 'impassable' && (!m.flies || !profile.fliersCrossImpassable)) {
						if (!impassable.has(t.id) && meetsRegion(inner, t, innerBox)) impassable.set(t.id, t);
					} else if (t.kind === 'ruin' && !m.flies && !wallPassers.has(m.src.class)) {
						if (!walled.has(t.id) && wallMet(inner, t, innerBox)) walled.set(t.id, t);
					} else if (t.kind === 'block') {
						if (!m.flies && !climbers.has(m.src.class) && !blocked.has(t.id) && meetsRegion(inner, t, innerBox)) blocked.set(t.id, t);
						if (!climbs) continue;
						if (leg.step.kind === 'move') {
							for (const [a, b] of touchIntervals(leg.innerStart, leg.step.dx, leg.step.dy, t)) {
								touches.push({ from: li + a, to: li + b, heightIn: t.heightIn });
							}
						} else if (meetsRegion(inner, t, innerBox)) {
							// a turn touching a block: treat the whole turn as on it (conservative)
							touches.push({ from: li, to: li + 1, heightIn: t.heightIn });
						}
					}
				}
			}
		});

		const horizontal = horizontalIn(steps);
		const pivots = pivotIn(steps, m.local.rMaxIn, m.local.round, profile);
		const climb = climbs ? climbIn(touches, legs.length) : 0;
		const cost = horizontal + pivots + climb;
		const allowance = allowanceIn(m);
		reports[m.id] = { cost, allowance, findings: [] };

		if (cost > allowance + eps) {
			add(
				finding(
					'over-allowance',
					[m.id],
					cost,
					allowance,
					kind === 'hold'
						? `${m.id} moves ${inches(cost)} in during a hold; a holding unit stays put`
						: `${m.id}'s path costs ${inches(cost)} in (${inches(horizontal)} across, ${inches(pivots)} turning, ${inches(climb)} climbing); it may move ${limitText(allowance)} in`
				)
			);
		}
		if (kind === 'hold') continue;

		// pieces met on the way, in request order
		const others = [...minToOther.entries()].sort((a, b) => a[0].idx - b[0].idx);
		for (const [o, d] of others) {
			if (o.side !== m.side && d < -eps) {
				add(finding('through-enemy', [m.id, o.id], d, 0, `${m.id} passes through enemy ${o.id} (overlap ${inches(-d)} in); no piece may move through an enemy`));
			}
		}
		if (kind === 'move' || kind === 'dash') {
			for (const [o, d] of others) {
				if (o.side !== m.side && d <= keepOutWithin) {
					add(
						finding(
							'enters-keep-out',
							[m.id, o.id],
							d,
							profile.keepOut,
							`${m.id} passes ${inches(d)} in from enemy ${o.id}; during a ${kind} it must stay more than ${limitText(profile.keepOut)} in away`
						)
					);
				}
			}
		}
		if (m.bulky) {
			for (const [o, d] of others) {
				if (o.bulky && d < -eps) {
					add(
						finding(
							'bulky-through-bulky',
							[m.id, o.id],
							d,
							0,
							`${m.id} passes through ${o.id} (overlap ${inches(-d)} in); bulky pieces may not pass through each other`
						)
					);
				}
			}
		}
		for (const t of walled.values()) {
			add(
				finding('wall-blocked', [m.id], 0, 0, `${m.id} crosses a wall of ${t.id}; only ${classList(profile.wallPassers)} pass through ruin walls`, {
					terrain: t.id
				})
			);
		}
		for (const t of blocked.values()) {
			add(
				finding('climb-blocked', [m.id], 0, 0, `${m.id} runs into block ${t.id}; only ${classList(profile.climbers)} may climb or cross blocks`, {
					terrain: t.id
				})
			);
		}
		for (const t of impassable.values()) {
			add(finding('impassable', [m.id], 0, 0, `${m.id}'s path enters impassable terrain ${t.id}`, { terrain: t.id }));
		}

		// ---- End of the path (and of an unmoved piece of the unit)
		// the exact box of the footprint, not the pruning box of its circumscribed circle
		worstOffBoard = Math.max(worstOffBoard, offBoardBy(boxOf(m.end.pts, m.end.r), widthIn, depthIn));
		if (worstOffBoard > eps) {
			add(finding('off-board', [m.id], worstOffBoard, 0, `${m.id} goes ${inches(worstOffBoard)} in off the table; its footprint must stay on the board`));
		}
		for (const o of scene.nearEnd(m.endBox, keepOutWithin)) {
			if (o === m) continue;
			const lb = pairGap(m, true, o, true);
			if (lb > (o.side !== m.side ? keepOutWithin : 0)) continue;
			const d = signedDistance(m.end, o.end);
			// a pair of the unit's own pieces is reported once, under the one that moved (or the first)
			const reportHere = !o.member || (m.moved && (!o.moved || m.idx < o.idx)) || (!m.moved && !o.moved && m.idx < o.idx);
			if (d < -eps && reportHere) {
				add(finding('ends-overlapping', [m.id, o.id], d, 0, `${m.id} ends overlapping ${o.id} by ${inches(-d)} in; pieces may not end on one another`));
			}
			if (o.side !== m.side && d <= keepOutWithin) {
				add(
					finding(
						'ends-in-keep-out',
						[m.id, o.id],
						d,
						profile.keepOut,
						`${m.id} ends ${inches(d)} in from enemy ${o.id}; it must end more than ${limitText(profile.keepOut)} in away`
					)
				);
			}
		}
		// the end's inner form lies in its bounding box: no terrain there, none to meet
		if (scene.anyTerrainNear(m.endBox)) {
			const endInner = scene.inner(m, m.endPose);
			const endInnerBox = boxOf(endInner.pts, endInner.r);
			for (const t of scene.terrainNear(endInnerBox)) {
				const floor = t.kind === 'block' || (t.kind === 'ruin' && profile.ruinFloorOverhang);
				if (floor && meetsRegion(endInner, t, endInnerBox)) {
					const by = overhangOf(endInner, m.end, t);
					if (by > 0) {
						const what = t.kind === 'block' ? `block ${t.id}` : `the floor of ruin ${t.id}`;
						add(
							finding('overhang', [m.id], by, 0, `${m.id} overhangs ${what} by ${inches(by)} in; a piece on it must stand wholly within its outline`, {
								terrain: t.id
							})
						);
					}
				}
				if (t.kind === 'impassable' && !impassable.has(t.id) && meetsRegion(endInner, t, endInnerBox)) {
					add(finding('impassable', [m.id], distanceToRegion(m.end, t), 0, `${m.id} ends on impassable terrain ${t.id}`, { terrain: t.id }));
				}
			}
		}
	}

	if (kind !== 'hold') {
		unitFindings.push(
			...spacingFindings(
				members.map((m) => m.id),
				members.map((m) => m.end),
				profile,
				members.map((m) => ({ x: m.endPose.x, y: m.endPose.y, outerIn: m.reachIn, innerIn: m.innerReachIn, reach: m.round ? undefined : m.reach, frame: m.endFrame }))
			)
		);
	}

	const findings: Finding[] = [];
	for (const f of unitFindings.filter((f) => f.code !== 'spacing')) findings.push(f);
	for (const m of members) {
		const list = perPiece.get(m.id)!;
		reports[m.id].findings = list;
		findings.push(...list);
	}
	for (const f of unitFindings.filter((f) => f.code === 'spacing')) findings.push(f);

	return {
		verdict: findings.some((f) => f.severity === 'error') ? 'illegal' : 'legal',
		pieces: reports,
		findings,
		summaries: { objectives: objectiveSummaries(scene), rings: ringSummaries(scene) }
	};
}

/** The closest member–enemy pair at the start, for the withdraw warning. */
function nearestEnemy(scene: Scene, members: ScenePiece[]): { d: number; a: ScenePiece; b: ScenePiece } | null {
	let best: { d: number; a: ScenePiece; b: ScenePiece } | null = null;
	for (const m of members) {
		for (const o of scene.pieces) {
			if (o.side === m.side) continue;
			const b = m.startBox;
			const ob = o.startBox;
			// boxes bound the distance from below: skip pairs that cannot beat the best
			const gap = Math.hypot(Math.max(0, ob.minX - b.maxX, b.minX - ob.maxX), Math.max(0, ob.minY - b.maxY, b.minY - ob.maxY));
			if (best && gap >= best.d) continue;
			const d = signedDistance(m.start, o.start);
			if (!best || d < best.d) best = { d, a: m, b: o };
		}
	}
	return best;
}
