// The play screen's state, one instance per page: the game as the server last told it, the
// unit being moved and its dragged paths, the live check of the draft (run in a worker, newest
// draft first), the measuring tool, deployment drags, and the live event stream that keeps two
// tablets in step.
// straight from the modules, not the barrel: its check would otherwise come into the page's JavaScript
import { footprintDistance } from '../../referee/distance';
import { localFootprint } from '../../referee/footprints';
import type { CheckReport, Finding, MoveKind, Waypoint } from '../../schemas/check';
import { otherSide, type GamePiece, type GameView, type MoveLogEntry, type Pose, type Side } from '../../schemas/game';
import type { BoardPiece, Overlay, BoardPointer } from '../types';
import type { PointIn } from '../view';
import { liveCheckTable } from './check-request';
import { LiveClient, type LiveQuestion } from './live-client';
import type { CostBreakdown, LiveAnswer, LiveLink } from './live-check';
import type { TracePoint } from './simplify';
import { unitsOf, type UnitSummary } from './pieces';
import { gameApi, type ChangeAnswer } from './api';
import { offerFor, pathWith, pickKey, reachShading, routeRequestFor, routeShading, spacingBreaks, type Offer, type Pick } from './reach';
import { RouteClient } from '../route/route-client';
import type { ReachMap, RouteResult } from '../../referee/route';
import type { RulingRequestView } from '../../schemas/ruling';

/** Smallest pointer travel (in) that adds a point to a dragged path: finer than the 0.1 in simplification. */
const TRACE_STEP_IN = 0.02;
/** While a piece is dragged, the board shows the newest draft at the latest this long after a move (ms) when no answer came. */
const SHOW_LATE_MS = 150;
/** One press of a turn button turns the piece this much. */
export const TURN_STEP_DEG = 15;

export const sideLabel = (s: Side): string => (s === 'a' ? 'Side A' : 'Side B');
export const kindLabel: Record<MoveKind, string> = { hold: 'Hold', move: 'Move', dash: 'Dash', withdraw: 'Withdraw' };
export const inches = (v: number): string => `${v.toFixed(2)} in`;

/** Widest extent of a footprint (in), for laying a unit out at deployment. */
function extentIn(p: GamePiece): number {
	const f = p.footprint;
	if (f.shape === 'round') return f.diameterMm / 25.4;
	if (f.shape === 'oval') return f.lengthMm / 25.4;
	return 2 * Math.max(...f.points.map(([x, y]) => Math.hypot(x, y)));
}

export type MeasurePick = { piece: string } | { point: PointIn };

export type { CostBreakdown } from './live-check';

/** The live check's answer as shown: its question's context, and parts kept as the same objects while unchanged. */
interface LiveShown {
	context: string;
	report: CheckReport | null;
	breakdown: CostBreakdown[];
	links: LiveLink[];
}

export class PlayState {
	game = $state.raw<GameView>(null as unknown as GameView);
	log = $state.raw<MoveLogEntry[]>([]);
	rosters = $state.raw<{ id: number; name: string; units: number }[]>([]);
	userId: string;

	selectedUnit = $state<string | null>(null);
	kind = $state<MoveKind>('move');
	/** raw dragged traces, starting at the piece's position, per piece of the selected unit */
	drafts = $state.raw<Record<string, TracePoint[]>>({});
	/**
	 * The drafts as the board draws them. While a piece is dragged they follow `drafts` with the
	 * live check's answers (and the route finder's), not with every pointer move: the paths,
	 * links and labels on the board then change once per answer, together with what the answer
	 * says about them, and a pointer move only moves the piece under the finger (`held`).
	 * Otherwise they are `drafts`.
	 */
	private shownDrafts = $state.raw<Record<string, TracePoint[]>>({});
	/** the dragged piece where the finger is: the board moves it at once */
	held = $state.raw<{ id: string; at: Pose } | null>(null);
	activePiece = $state<string | null>(null);
	/** per piece: how many trace points after the start are the route finder's (kept verbatim) */
	fixed = $state.raw<Record<string, number>>({});
	private grab: { piece: string; dx: number; dy: number; facing: number; redeploy: boolean } | null = null;
	/** shows the newest drafts if no answer came to show them with (the check may not apply) */
	private showTimer: ReturnType<typeof setTimeout> | null = null;

	// The route finder (advice; the live check is the verdict). One worker answers the picked
	// piece's map, drag routes and nearest-legal offers; a second builds the unit's other maps.
	/** the picked-up piece whose reach map is shaded */
	picked = $state<string | null>(null);
	reach = $state.raw<{ piece: string; key: string; map: ReachMap } | null>(null);
	/** every deployed piece's map of the selected unit, when `showAllMaps` is on */
	unitMaps = $state.raw<Record<string, ReachMap>>({});
	showReach = $state(true);
	showAllMaps = $state(false);
	/** the shortest legal route to the finger while a piece is dragged (and after the drop) */
	dragRoute = $state.raw<{ piece: string; route: RouteResult } | null>(null);
	/** after a drop on a spot the finder cannot reach: the nearest legal end */
	offer = $state.raw<Offer | null>(null);
	reachProblem = $state<string | null>(null);
	private routes: RouteClient | null = null;
	/** the newest drag route answered, applied with the next drag frame (one board redraw per frame) */
	private latestRoute: { piece: string; route: RouteResult } | null = null;
	private routeTimer: ReturnType<typeof setTimeout> | null = null;
	private mapRoutes: RouteClient | null = null;
	private pickGen = 0;
	private mapsGen = 0;
	private mapsKey = '';

	measuring = $state(false);
	measurePicks = $state.raw<MeasurePick[]>([]);

	deployDrag = $state.raw<{ unit: string; at: PointIn | null } | null>(null);

	/** the server's last refusal of a move (its findings are the ones that count) */
	refusal = $state.raw<{ message: string; report: CheckReport | null } | null>(null);
	notice = $state<string | null>(null);
	busy = $state(false);
	live = $state<'connecting' | 'live' | 'offline'>('connecting');
	/** ruling requests of this game (open, taken by a judge, or ruled) */
	requests = $state.raw<RulingRequestView[]>([]);

	private api: ReturnType<typeof gameApi>;
	private events: EventSource | null = null;

	constructor(game: GameView, userId: string, rosters: { id: number; name: string; units: number }[]) {
		this.game = game;
		this.userId = userId;
		this.rosters = rosters;
		this.api = gameApi(game.id);
	}

	// --- what the screen shows --------------------------------------------------------------------

	state = $derived(this.game.state);
	mySides = $derived(this.game.mySides);
	isMyTurn = $derived(this.mySides.includes(this.game.state.activeSide));
	units = $derived(unitsOf(this.game.state.pieces));
	pending = $derived(this.game.state.pending);
	canAccept = $derived(!!this.pending && this.mySides.includes(otherSide(this.pending.side)));
	canTakeBack = $derived(!!this.pending && this.mySides.includes(this.pending.side));
	dieForSelected = $derived(this.state.die && this.state.die.unit === this.selectedUnit ? this.state.die.value : null);

	selected = $derived<UnitSummary | null>(this.units.find((u) => u.unit === this.selectedUnit) ?? null);

	/** The simplified waypoints of every dragged piece: exactly what would be submitted. */
	paths = $derived(this.pathsOf(this.drafts));
	/** The same, of the drafts the board shows. */
	private shownPaths = $derived(this.pathsOf(this.shownDrafts));

	/** each trace's waypoints, kept while the trace array and its fixed part stay the same */
	private simplified = new WeakMap<TracePoint[], { fixed: number; path: Waypoint[] }>();
	private pathsOf(drafts: Record<string, TracePoint[]>): Record<string, Waypoint[]> {
		const out: Record<string, Waypoint[]> = {};
		for (const [id, trace] of Object.entries(drafts)) {
			if (trace.length < 2) continue;
			const fixed = this.fixed[id] ?? 0;
			let known = this.simplified.get(trace);
			if (!known || known.fixed !== fixed) this.simplified.set(trace, (known = { fixed, path: pathWith(trace, fixed) }));
			out[id] = known.path;
		}
		return out;
	}

	/** The live check's table (rules.ts: no support rings), built once per game update, not per drag frame. */
	private liveTable = $derived(liveCheckTable(this.game.layout, this.game.profile, this.state.pieces));

	/**
	 * What the live check is asked about the draft: the move (null when no check applies: a dash
	 * before its die) and where the unit's pieces stand (for the spacing links); null when no
	 * unit is being moved. `context` names everything but the paths, so an answer about an
	 * earlier draft of the same move is shown until the newer one comes, and no other.
	 */
	private liveQuestion = $derived.by<LiveQuestion | null>(() => {
		const unit = this.selected;
		if (!unit || this.state.phase !== 'move') return null;
		const checks = this.isMyTurn && !(this.kind === 'dash' && this.dieForSelected === null);
		const die = this.kind === 'dash' ? (this.dieForSelected ?? undefined) : undefined;
		const ends = [];
		for (const p of unit.pieces) {
			const pose = this.draftPose(p);
			if (pose) ends.push({ id: p.id, footprint: p.footprint, pose: { x: pose.x, y: pose.y, facing: pose.facing ?? 0 } });
		}
		return {
			context: `${this.game.seq}|${unit.unit}|${checks ? this.kind : '-'}|${die ?? ''}`,
			move: checks ? { unit: unit.unit, kind: this.kind, die, paths: this.kind === 'hold' ? undefined : this.paths } : null,
			ends
		};
	});

	/** The newest live answer that fits the current context (see `liveQuestion`). */
	private liveShown = $state.raw<LiveShown | null>(null);
	private liveClient: LiveClient | null = null;
	/** an answer that came in between frames, applied with the next drag frame (one update per frame) */
	private liveWaiting: LiveShown | null = null;
	private liveFrame = 0;
	private liveEffect: (() => void) | null = null;

	private liveNow = $derived(this.liveQuestion && this.liveShown?.context === this.liveQuestion.context ? this.liveShown : null);

	/** The browser's check of the draft move, from the worker (advice only: the server checks again). */
	liveReport = $derived<CheckReport | null>(this.liveNow?.report ?? null);

	/** Cost of each dragged piece split into across / turning / climbing. */
	breakdown = $derived<CostBreakdown[]>(this.liveNow?.breakdown ?? []);

	/** The unit's spacing links at the draft ends the live check was last asked about. */
	private links = $derived<LiveLink[]>(this.liveNow?.links ?? []);

	/** Findings to show: the server's, when it refused the draft, else the browser's live ones. */
	findings = $derived<Finding[]>(this.refusal?.report?.findings ?? this.liveReport?.findings ?? []);

	/** Pieces whose spacing breaks, by the engine's spacing result in the findings shown. */
	spacing = $derived(spacingBreaks(this.findings));

	/** Ruling requests still waiting for a judge's word. */
	openRequests = $derived(this.requests.filter((r) => r.status !== 'ruled'));

	/** Where each piece of the selected unit stands at the end of its draft path (of `drafts`, or of the ones given). */
	private draftPose(p: GamePiece, drafts = this.drafts): Pose | null {
		if (!p.at) return null;
		const trace = drafts[p.id];
		if (!trace || trace.length < 2) return p.at;
		let facing = p.at.facing ?? 0;
		for (const t of trace) if (t.facing !== undefined) facing = t.facing;
		const end = trace[trace.length - 1];
		return { x: end.x, y: end.y, facing };
	}

	/**
	 * The board pieces of the last update by id, frozen: a piece that looks and stands the same is
	 * handed to the canvas as the same object, which it then skips (300 pieces, one of them dragged).
	 */
	private lastPieces = new Map<string, BoardPiece>();

	private stablePiece(next: BoardPiece, seen: Map<string, BoardPiece>): BoardPiece {
		const prev = this.lastPieces.get(next.id);
		const same =
			prev &&
			prev.side === next.side &&
			prev.footprint === next.footprint &&
			prev.label === next.label &&
			prev.faded === next.faded &&
			prev.flagged === next.flagged &&
			prev.at.x === next.at.x &&
			prev.at.y === next.at.y &&
			prev.at.facing === next.at.facing;
		const out = same ? prev : Object.freeze({ ...next, at: Object.freeze({ ...next.at }) });
		seen.set(out.id, out);
		return out;
	}

	/**
	 * Every deployed piece where it stands, unflagged, and the ghost of where it stood before the
	 * move awaiting acceptance: frozen, made once per game update, handed to the board as they
	 * are for every piece that is neither dragged nor flagged.
	 */
	private standing = $derived.by(() => {
		const out = new Map<string, { piece: BoardPiece; before: BoardPiece | null }>();
		const pendingBefore = this.pending?.before ?? {};
		for (const p of this.state.pieces) {
			if (!p.at) continue;
			const label = `${p.unit.split('-u')[1] ?? ''}${p.leader ? 'L' : ''}`;
			const piece = Object.freeze({ id: p.id, side: p.side, footprint: p.footprint, at: Object.freeze({ ...p.at }), label, flagged: false });
			const b = pendingBefore[p.id];
			const before = b && (b.x !== p.at.x || b.y !== p.at.y) ? Object.freeze({ id: `${p.id}~before`, side: p.side, footprint: p.footprint, at: Object.freeze({ ...b }), faded: true }) : null;
			out.set(p.id, { piece, before });
		}
		return out;
	});

	/** Pieces drawn on the board: draft positions, ghosts of where dragged pieces started, deploy previews. */
	boardPieces = $derived.by<BoardPiece[]>(() => {
		const flagged = new Set(this.findings.filter((f) => f.severity !== 'warning').map((f) => f.pieces[0]));
		const drafts = this.shownDrafts;
		const standing = this.standing;
		const out: BoardPiece[] = [];
		const seen = new Map<string, BoardPiece>();
		for (const p of this.state.pieces) {
			const base = standing.get(p.id);
			if (!base) continue;
			const moved = (drafts[p.id]?.length ?? 0) > 1;
			if (moved) out.push(this.stablePiece({ id: `${p.id}~start`, side: p.side, footprint: p.footprint, at: p.at!, faded: true }, seen));
			if (base.before) out.push(base.before);
			if (!moved && !flagged.has(p.id)) out.push(base.piece);
			else out.push(this.stablePiece({ ...base.piece, at: this.draftPose(p, drafts)!, flagged: flagged.has(p.id) }, seen));
		}
		for (const g of this.deployGhosts) out.push(g);
		this.lastPieces = seen;
		return out;
	});

	/** Where a unit dragged out of the roster panel would be put down. */
	deployGhosts = $derived.by<BoardPiece[]>(() => {
		const d = this.deployDrag;
		if (!d?.at) return [];
		return this.formation(d.unit, d.at).map((pl) => {
			const p = this.state.pieces.find((q) => q.id === pl.piece)!;
			return { id: `${p.id}~ghost`, side: p.side, footprint: p.footprint, at: pl.at, faded: true };
		});
	});

	/** Each reach map's overlays, made once per map and frozen (the canvas then keys them once). */
	private shadings = { shaded: new WeakMap<ReachMap, Overlay[]>(), outlined: new WeakMap<ReachMap, Overlay[]>() };
	private shadingOf(map: ReachMap, shaded: boolean): Overlay[] {
		const cache = shaded ? this.shadings.shaded : this.shadings.outlined;
		let list = cache.get(map);
		if (!list) {
			list = reachShading(map, shaded ? { shaded: true } : { shaded: false, tone: 'felt' }).map(freezeOverlay);
			cache.set(map, list);
		}
		return list;
	}

	/** The keep-out bands of every enemy piece: the same frozen objects while the side and the pieces stay. */
	private keepOuts = $derived.by<Overlay[]>(() => {
		const side = this.selected?.side;
		const keepOut = this.game.profile.keepOut;
		if (!side || this.state.phase !== 'move') return [];
		const out: Overlay[] = [];
		for (const p of this.state.pieces) if (p.at && p.side !== side) out.push(Object.freeze({ kind: 'keep-out', pieceId: p.id, distanceIn: keepOut, tone: 'signal' }));
		return out;
	});

	/**
	 * What seldom changes, drawn under the other overlays on a layer of its own: reach shading
	 * (first, so everything else is drawn over it) and the enemy's keep-out bands. A drag does not
	 * change them, so the canvas does not repaint them while a piece is dragged.
	 */
	belowOverlays = $derived.by<Overlay[]>(() => {
		const unit = this.selected;
		if (!unit || this.state.phase !== 'move') return [];
		const out: Overlay[] = [];
		if (this.showReach) {
			if (this.showAllMaps) for (const [id, map] of Object.entries(this.unitMaps)) if (id !== this.reach?.piece) out.push(...this.shadingOf(map, false));
			if (this.reach && unit.pieces.some((p) => p.id === this.reach!.piece)) out.push(...this.shadingOf(this.reach.map, true));
		}
		out.push(...this.keepOuts);
		return out;
	});

	/** Everything drawn over `belowOverlays`: paths, spacing links, rings, labels, routes, findings, the tape. */
	overlays = $derived.by<Overlay[]>(() => {
		const out: Overlay[] = [];
		const s = this.state;
		const prof = this.game.profile;
		const unit = this.selected;
		if (unit && s.phase === 'move') {
			const tone = unit.side === 'a' ? 'sidea' : 'sideb';
			const shown = this.shownDrafts;
			// Dragged paths, as they will be submitted (simplified).
			for (const [id, wps] of Object.entries(this.shownPaths)) {
				const p = s.pieces.find((q) => q.id === id);
				if (p?.at) out.push({ kind: 'path', points: [{ x: p.at.x, y: p.at.y }, ...wps.map((w) => ({ x: w.x, y: w.y }))], tone, arrow: true });
			}
			// Spacing links: each piece to its nearest unit-mate, with the edge-to-edge gap, as the
			// live check's worker measured them (a frame or two behind the finger).
			const mine = unit.pieces.filter((p) => p.at).map((p) => ({ p, pose: this.draftPose(p, shown)! }));
			const broken = new Set(this.spacing.map((b) => b.piece));
			for (const l of this.links) {
				// whether spacing breaks is the engine's word (live check)
				const ok = !broken.has(l.a) && !broken.has(l.b);
				out.push({ kind: 'link', from: l.from, to: l.to, tone: ok ? 'ok' : 'signal', dashed: !ok, label: `${l.gapIn.toFixed(2)} in` });
			}
			// Support rings of the unit's sources (radius from the footprint's edge, drawn from the centre).
			for (const { p, pose } of mine) {
				if (!p.ring) continue;
				const r = localFootprint(p.footprint, prof.tolerance).rMaxIn;
				out.push({ kind: 'ring', x: pose.x, y: pose.y, radiusIn: p.ring.radius + r, tone: 'brass', dashed: true, label: p.ring.label ?? 'support ring' });
			}
			// Allowance used on each dragged piece: "5.84 in of 6".
			for (const b of this.breakdown) {
				const p = s.pieces.find((q) => q.id === b.piece)!;
				const pose = this.draftPose(p, shown)!;
				const over = b.cost > b.allowance + prof.tolerance;
				out.push({ kind: 'label', x: pose.x, y: pose.y - 1.2, text: `${b.cost.toFixed(2)} in of ${fmtLimit(b.allowance)}${over ? ' — too far' : ''}`, tone: over ? 'signal' : 'ink' });
			}
			// The finder's shortest legal route to the finger, and the nearest legal spot on offer.
			const dr = this.dragRoute;
			const from = dr ? s.pieces.find((q) => q.id === dr.piece)?.at : null;
			if (dr && from) {
				// the route's cost on the board only where it says more than the dragged path's own label
				const dragged = this.breakdown.find((b) => b.piece === dr.piece)?.cost;
				const same = !dr.route.reachable || (dragged !== undefined && Math.abs(dragged - dr.route.costIn) < 0.01);
				out.push(...routeShading(from, dr.route, { label: !same }));
			}
			const o = this.offer;
			if (o?.kind === 'spot') out.push({ kind: 'ring', x: o.at.x, y: o.at.y, radiusIn: 0.35, tone: 'ok', label: 'nearest legal spot' });
		}
		// A marker with words at the piece each finding is about.
		for (const f of this.findings) {
			if (f.severity === 'warning') continue;
			const p = s.pieces.find((q) => q.id === f.pieces[0]);
			const pose = p ? this.draftPose(p, this.shownDrafts) : null;
			if (pose && f.code !== 'spacing') out.push({ kind: 'warning', x: pose.x + 0.9, y: pose.y - 0.9, label: f.code.replace(/-/g, ' ') });
		}
		// Where spacing would break, by the live check: a marker with the gap at each piece it names.
		for (const b of this.spacing) {
			const p = s.pieces.find((q) => q.id === b.piece);
			const pose = p ? this.draftPose(p, this.shownDrafts) : null;
			if (pose) out.push({ kind: 'warning', x: pose.x + 0.9, y: pose.y - 0.9, label: 'spacing' });
		}
		// The move awaiting acceptance, drawn for both players.
		const pend = this.pending;
		if (pend) {
			const entry = this.log.find((e) => e.seq === pend.seq);
			const paths = (entry?.payload.paths ?? {}) as Record<string, Waypoint[]>;
			for (const [id, wps] of Object.entries(paths)) {
				const start = pend.before[id];
				if (start) out.push({ kind: 'path', points: [{ x: start.x, y: start.y }, ...wps.map((w) => ({ x: w.x, y: w.y }))], tone: 'brass', dashed: true, arrow: true });
			}
		}
		// The measuring tape.
		const m = this.measurement;
		if (m) out.push({ kind: 'link', from: m.from, to: m.to, tone: 'brass', label: `${m.distance.toFixed(2)} in edge to edge` });
		for (const pick of this.measurePicks) {
			const at = this.pickPoint(pick);
			if (at) out.push({ kind: 'handle', id: `measure-${at.x}-${at.y}`, x: at.x, y: at.y, shape: 'round' });
		}
		return out;
	});

	// --- measuring ------------------------------------------------------------------------------------

	private pickPoint(pick: MeasurePick): PointIn | null {
		if ('point' in pick) return pick.point;
		const p = this.state.pieces.find((q) => q.id === pick.piece);
		return p ? this.draftPose(p) : null;
	}

	/** The edge-to-edge distance between the two picks (a point counts as a footprint of no size). */
	measurement = $derived.by<{ from: PointIn; to: PointIn; distance: number } | null>(() => {
		if (this.measurePicks.length < 2) return null;
		const [a, b] = this.measurePicks;
		const fa = this.pickFootprint(a);
		const fb = this.pickFootprint(b);
		if (!fa || !fb) return null;
		return { from: fa.at, to: fb.at, distance: Math.max(0, footprintDistance(fa.fp, fa.at, fb.fp, fb.at)) };
	});

	private pickFootprint(pick: MeasurePick) {
		if ('point' in pick) return { fp: { shape: 'round' as const, diameterMm: 1e-6 }, at: { ...pick.point, facing: 0 } };
		const p = this.state.pieces.find((q) => q.id === pick.piece);
		const at = p ? this.draftPose(p) : null;
		return p && at ? { fp: p.footprint, at } : null;
	}

	toggleMeasure(): void {
		this.measuring = !this.measuring;
		this.measurePicks = [];
	}

	// --- choosing ---------------------------------------------------------------------------------------

	selectUnit(unit: string | null): void {
		if (unit === this.selectedUnit) return;
		this.selectedUnit = unit;
		this.clearDrafts();
		this.activePiece = null;
		this.refusal = null;
		// A unit with a die waiting can only dash (or hold).
		this.kind = unit && this.state.die?.unit === unit ? 'dash' : 'move';
		this.picked = null;
		this.reach = null;
		this.unitMaps = {};
		this.mapsKey = '';
		this.refreshUnitMaps();
	}

	chooseKind(kind: MoveKind): void {
		this.kind = kind;
		this.refusal = null;
		if (kind === 'hold') this.clearDrafts();
		this.repick();
	}

	resetPaths(): void {
		this.clearDrafts();
		this.activePiece = null;
		this.refusal = null;
		this.repick();
	}

	private clearDrafts(): void {
		this.setDrafts({});
		this.fixed = {};
		this.dragRoute = null;
		this.offer = null;
	}

	// --- reach maps, routes, the nearest legal spot -------------------------------------------------

	/** The finder's question for a piece of the selected unit, for the chosen kind (null when none applies). */
	private pickFor(pieceId: string): Pick | null {
		if (this.kind === 'hold' || this.state.phase !== 'move') return null;
		const die = this.kind === 'dash' ? this.dieForSelected : undefined;
		if (this.kind === 'dash' && (die === null || die === undefined)) return null;
		const piece = this.state.pieces.find((p) => p.id === pieceId);
		if (!piece?.at) return null;
		// unit-mates stand at the ends of their drafts for the end rules
		const placed: Pick['placed'] = {};
		for (const p of this.state.pieces) {
			if (p.unit !== piece.unit || p.id === pieceId || !p.at || !this.drafts[p.id] || this.drafts[p.id].length < 2) continue;
			const pose = this.draftPose(p)!;
			placed[p.id] = { x: pose.x, y: pose.y, facing: pose.facing };
		}
		return { pieceId, kind: this.kind, die: die ?? undefined, placed };
	}

	/** Picks a piece up: its reach map for the chosen kind is built off the main thread and shaded. */
	async pickUp(pieceId: string): Promise<void> {
		this.picked = pieceId;
		const routes = this.routes;
		const pick = this.pickFor(pieceId);
		if (!pick || !routes) {
			this.reach = null;
			return;
		}
		const key = pickKey(this.state.pieces, pick);
		if (this.reach?.key === key) return;
		const gen = ++this.pickGen;
		this.reach = null;
		try {
			const map = await routes.pickUp(routeRequestFor(this.game.layout, this.game.profile, this.state.pieces, pick));
			if (gen !== this.pickGen) return;
			this.reach = { piece: pieceId, key, map };
			this.reachProblem = map.status === 'ok' ? null : (map.reason ?? `${pieceId} cannot move (${map.status})`);
		} catch (e) {
			if (gen === this.pickGen) this.reachProblem = `The route finder could not map ${pieceId}: ${e instanceof Error ? e.message : String(e)}`;
		}
		if (this.showAllMaps) this.refreshUnitMaps();
	}

	/** Maps the picked piece again after the kind, the die, the table or a unit-mate changed. */
	private repick(): void {
		if (this.picked && this.selected?.pieces.some((p) => p.id === this.picked)) void this.pickUp(this.picked);
		else this.reach = null;
		this.refreshUnitMaps();
	}

	toggleReach(): void {
		this.showReach = !this.showReach;
	}

	toggleAllMaps(): void {
		this.showAllMaps = !this.showAllMaps;
		this.refreshUnitMaps();
	}

	/** Every deployed piece's map of the selected unit, one after another on the second worker. */
	refreshUnitMaps(): void {
		const unit = this.selected;
		if (!this.showAllMaps || !unit || !this.mapRoutesClient()) {
			if (!this.showAllMaps) this.mapsKey = '';
			return;
		}
		const picks = unit.pieces.map((p) => this.pickFor(p.id)).filter((q): q is Pick => q !== null);
		const key = picks.map((q) => pickKey(this.state.pieces, q)).join('#');
		if (key === this.mapsKey) return;
		this.mapsKey = key;
		const gen = ++this.mapsGen;
		const client = this.mapRoutes!;
		void (async () => {
			const maps: Record<string, ReachMap> = {};
			for (const q of picks) {
				try {
					maps[q.pieceId] = await client.pickUp(routeRequestFor(this.game.layout, this.game.profile, this.state.pieces, q));
				} catch {
					continue;
				}
				if (gen !== this.mapsGen) return;
				this.unitMaps = { ...maps };
			}
		})();
	}

	private mapRoutesClient(): RouteClient | null {
		if (!this.mapRoutes && this.routes) this.mapRoutes = new RouteClient();
		return this.mapRoutes;
	}

	/** A drag frame: ask for the shortest legal route to where the piece is now (only the newest is answered). */
	private askRoute(piece: string, x: number, y: number): void {
		if (!this.routes || (this.reach?.piece !== piece && this.picked !== piece)) return;
		void this.routes.findRoute(x, y).then((route) => {
			if (!route || this.grab?.piece !== piece) return;
			// Held until the next drag frame, which redraws the board anyway; if the finger rests,
			// shown shortly after.
			this.latestRoute = { piece, route };
			this.routeTimer ??= setTimeout(() => this.applyRoute(), 50);
		});
	}

	private applyRoute(): void {
		if (this.routeTimer) clearTimeout(this.routeTimer);
		this.routeTimer = null;
		const r = this.latestRoute;
		this.latestRoute = null;
		if (r && this.grab?.piece === r.piece) this.dragRoute = r;
		this.showDrafts();
	}

	/** After a drop: if the finder cannot reach the spot, offer the nearest legal one. */
	private async offerAfterDrop(piece: string, end: { x: number; y: number }): Promise<void> {
		if (!this.routes || this.picked !== piece) return;
		const gen = this.pickGen;
		try {
			const [route, nearest] = await Promise.all([this.routes.findRoute(end.x, end.y), this.routes.nearestLegal(end.x, end.y)]);
			if (gen !== this.pickGen || this.grab) return;
			if (route) this.dragRoute = { piece, route };
			this.offer = offerFor(piece, nearest);
		} catch (e) {
			this.reachProblem = `The route finder could not answer: ${e instanceof Error ? e.message : String(e)}`;
		}
	}

	/** Takes the offer: the piece's path becomes the finder's route to the nearest legal spot. */
	takeOffer(): void {
		const o = this.offer;
		if (!o || o.kind !== 'spot') return;
		const p = this.state.pieces.find((q) => q.id === o.piece);
		if (!p?.at) return;
		const trace: TracePoint[] = [{ x: p.at.x, y: p.at.y }, ...o.waypoints.map((w) => ({ x: w.x, y: w.y }))];
		this.setDrafts({ ...this.drafts, [o.piece]: trace });
		this.fixed = { ...this.fixed, [o.piece]: o.waypoints.length };
		this.activePiece = o.piece;
		this.offer = null;
		this.dragRoute = null;
		this.refusal = null;
		this.refreshUnitMaps();
	}

	/** A facing change at the current end of the active piece's path. */
	addTurn(deltaDeg: number): void {
		const id = this.activePiece ?? this.selected?.pieces.find((p) => p.at)?.id;
		if (!id) return;
		const p = this.state.pieces.find((q) => q.id === id);
		if (!p?.at) return;
		const trace = this.drafts[id] ?? [{ x: p.at.x, y: p.at.y }];
		const pose = this.draftPose(p)!;
		const facing = (((pose.facing ?? 0) + deltaDeg) % 360 + 360) % 360;
		this.setDrafts({ ...this.drafts, [id]: [...trace, { x: pose.x, y: pose.y, facing }] });
		this.activePiece = id;
		this.refusal = null;
	}

	// --- the live check ----------------------------------------------------------------------------

	/** Asks the worker about every new draft (newest wins, see LiveClient) until `stopLiveCheck`. */
	private startLiveCheck(): void {
		if (this.liveClient) return;
		const client = new LiveClient((a, q) => this.liveAnswered(a, q));
		this.liveClient = client;
		this.liveEffect = $effect.root(() => {
			$effect(() => {
				const q = this.liveQuestion;
				client.setTable(this.liveTable);
				if (q) client.ask(q);
				else client.clear();
			});
		});
	}

	private stopLiveCheck(): void {
		this.liveEffect?.();
		this.liveEffect = null;
		this.liveClient?.dispose();
		this.liveClient = null;
		if (this.liveFrame) cancelAnimationFrame(this.liveFrame);
		this.liveFrame = 0;
	}

	/**
	 * An answer from the worker. It is held for the next drag frame, which updates the board
	 * anyway, or shown in a frame of its own when the finger rests. What came back the same as
	 * the answer shown keeps its objects, so the findings, readout and links it would not change
	 * are not touched.
	 */
	private liveAnswered(a: LiveAnswer, q: LiveQuestion): void {
		const prev = this.liveWaiting ?? this.liveShown;
		const same = prev && prev.context === q.context;
		let report = a.report;
		if (report && same && prev.report && sameJson(prev.report.findings, report.findings)) report = { ...report, findings: prev.report.findings };
		const breakdown = same && sameJson(prev.breakdown, a.breakdown) ? prev.breakdown : a.breakdown;
		const links = same && sameJson(prev.links, a.links) ? prev.links : a.links;
		this.liveWaiting = { context: q.context, report, breakdown, links };
		if (!this.liveFrame && typeof requestAnimationFrame !== 'undefined') this.liveFrame = requestAnimationFrame(() => this.applyLive());
		else if (typeof requestAnimationFrame === 'undefined') this.applyLive();
	}

	private applyLive(): void {
		if (this.liveFrame) cancelAnimationFrame(this.liveFrame);
		this.liveFrame = 0;
		const w = this.liveWaiting;
		this.liveWaiting = null;
		if (w && w !== this.liveShown) this.liveShown = w;
		this.showDrafts();
	}

	// --- board gestures ------------------------------------------------------------------------------

	/** New drafts, shown on the board at once (a drag's own moves go through `held` and `showDrafts`). */
	private setDrafts(next: Record<string, TracePoint[]>): void {
		this.drafts = next;
		this.showDrafts();
	}

	/** The board catches up with the newest drafts. */
	private showDrafts(): void {
		if (this.showTimer) clearTimeout(this.showTimer);
		this.showTimer = null;
		if (this.shownDrafts !== this.drafts) this.shownDrafts = this.drafts;
	}

	onPointer = (e: BoardPointer): boolean | void => {
		const s = this.state;
		if (e.phase === 'tap') return this.onTap(e);
		if (e.phase === 'down') {
			if (this.measuring || e.target?.layer !== 'piece') return false;
			const piece = s.pieces.find((p) => p.id === e.target!.id);
			if (!piece?.at || !this.isMyTurn || piece.side !== s.activeSide) return false;
			if (s.phase === 'deploy') {
				this.grab = { piece: piece.id, dx: e.at.x - piece.at.x, dy: e.at.y - piece.at.y, facing: piece.at.facing ?? 0, redeploy: true };
				this.setDrafts({ [piece.id]: [{ x: piece.at.x, y: piece.at.y }] });
				return true;
			}
			if (s.phase !== 'move' || this.pending) return false;
			if (s.movedUnits.includes(piece.unit)) {
				this.notice = `${piece.unitName} has moved already in this turn`;
				return false;
			}
			if (this.selectedUnit !== piece.unit) this.selectUnit(piece.unit);
			if (this.kind === 'hold') this.chooseKind('move');
			if (this.kind === 'dash' && this.dieForSelected === null) {
				this.notice = 'Roll the die for the dash first';
				return false;
			}
			const pose = this.draftPose(piece)!;
			this.grab = { piece: piece.id, dx: e.at.x - pose.x, dy: e.at.y - pose.y, facing: pose.facing ?? 0, redeploy: false };
			if (!this.drafts[piece.id]) this.setDrafts({ ...this.drafts, [piece.id]: [{ x: piece.at.x, y: piece.at.y }] });
			this.activePiece = piece.id;
			this.refusal = null;
			this.notice = null;
			this.offer = null;
			if (this.dragRoute?.piece !== piece.id) this.dragRoute = null;
			void this.pickUp(piece.id);
			return true;
		}
		const g = this.grab;
		if (!g) return;
		if (e.phase === 'move') {
			const trace = this.drafts[g.piece];
			if (!trace) return;
			const x = e.at.x - g.dx;
			const y = e.at.y - g.dy;
			const last = trace[trace.length - 1];
			if (Math.hypot(x - last.x, y - last.y) < TRACE_STEP_IN) return;
			if (this.latestRoute) this.applyRoute();
			if (this.liveWaiting) this.applyLive();
			// the newest draft goes to the live check (liveQuestion); the board moves the piece
			// under the finger and shows the rest with the answer (shownDrafts)
			this.drafts = { ...this.drafts, [g.piece]: [...trace, { x, y }] };
			this.held = { id: g.piece, at: { x, y, facing: g.facing } };
			this.showTimer ??= setTimeout(() => this.showDrafts(), SHOW_LATE_MS);
			if (!g.redeploy) this.askRoute(g.piece, x, y);
			return;
		}
		if (e.phase === 'up' || e.phase === 'cancel') {
			this.grab = null;
			this.showDrafts();
			this.held = null;
			if (g.redeploy) {
				const trace = this.drafts[g.piece];
				this.setDrafts({});
				const end = trace?.[trace.length - 1];
				const p = s.pieces.find((q) => q.id === g.piece);
				if (e.phase === 'up' && end && p?.at && trace.length > 1) void this.deploy([{ piece: g.piece, at: { x: end.x, y: end.y, facing: p.at.facing ?? 0 } }]);
			} else {
				const trace = this.drafts[g.piece];
				if (trace && trace.length > 1) {
					const end = trace[trace.length - 1];
					void this.offerAfterDrop(g.piece, end);
				}
				this.refreshUnitMaps();
			}
		}
	};

	private onTap(e: BoardPointer): void {
		if (this.measuring) {
			const pick: MeasurePick = e.target?.layer === 'piece' && !e.target.id.includes('~') ? { piece: e.target.id } : { point: e.at };
			this.measurePicks = this.measurePicks.length >= 2 ? [pick] : [...this.measurePicks, pick];
			return;
		}
		if (e.target?.layer === 'piece') {
			const p = this.state.pieces.find((q) => q.id === e.target!.id);
			if (p && this.state.phase === 'move' && this.isMyTurn && p.side === this.state.activeSide) this.selectUnit(p.unit);
		}
	}

	// --- deployment -----------------------------------------------------------------------------------

	/** The unit's pieces laid out in rows of up to five around a point, facing the far edge. */
	formation(unit: string, at: PointIn): { piece: string; at: Pose }[] {
		const all = this.state.pieces.filter((p) => p.unit === unit);
		const waiting = all.filter((p) => !p.at);
		const pieces = waiting.length ? waiting : all;
		if (!pieces.length) return [];
		const step = Math.max(...pieces.map(extentIn)) + 0.3;
		const perRow = Math.min(5, pieces.length);
		const rows = Math.ceil(pieces.length / perRow);
		const facing = pieces[0].side === 'a' ? 90 : 270;
		return pieces.map((p, i) => {
			const r = Math.floor(i / perRow);
			const c = i % perRow;
			const inRow = r === rows - 1 ? pieces.length - r * perRow : perRow;
			return { piece: p.id, at: { x: at.x + (c - (inRow - 1) / 2) * step, y: at.y + (r - (rows - 1) / 2) * step, facing } };
		});
	}

	startDeployDrag(unit: string): void {
		this.deployDrag = { unit, at: null };
		this.notice = null;
	}

	moveDeployDrag(at: PointIn | null): void {
		if (this.deployDrag) this.deployDrag = { ...this.deployDrag, at };
	}

	async dropDeployDrag(): Promise<void> {
		const d = this.deployDrag;
		this.deployDrag = null;
		if (!d?.at) return;
		await this.deploy(this.formation(d.unit, d.at));
	}

	// --- server changes -------------------------------------------------------------------------------

	private side(): Side {
		return this.mySides.includes(this.state.activeSide) ? this.state.activeSide : this.mySides[0];
	}

	private async run(call: () => Promise<ChangeAnswer>, done?: (a: ChangeAnswer) => void): Promise<ChangeAnswer> {
		this.busy = true;
		this.notice = null;
		try {
			const a = await call();
			if (a.game) this.game = a.game;
			if (a.ok) done?.(a);
			else if (a.status === 409) this.notice = `${a.error?.message ?? 'The game has moved on'}`;
			else if (a.status !== 422 || !a.report) this.notice = a.error?.message ?? `The server answered ${a.status}`;
			await this.refreshLog();
			return a;
		} finally {
			this.busy = false;
		}
	}

	chooseRoster(rosterId: number, side: Side): Promise<ChangeAnswer> {
		return this.run(() => this.api.roster(this.game.seq, side, rosterId));
	}

	deploy(placements: { piece: string; at: Pose }[]): Promise<ChangeAnswer> {
		return this.run(() => this.api.deploy(this.game.seq, this.side(), placements));
	}

	async roll(): Promise<void> {
		if (!this.selectedUnit) return;
		await this.run(() => this.api.roll(this.game.seq, this.selectedUnit!), () => (this.kind = 'dash'));
		this.repick();
	}

	async submit(): Promise<void> {
		const unit = this.selectedUnit;
		if (!unit) return;
		const paths = this.kind === 'hold' ? undefined : this.paths;
		const a = await this.run(() => this.api.move(this.game.seq, unit, this.kind, paths));
		if (a.ok) {
			this.clearDrafts();
			this.picked = null;
			this.reach = null;
			this.unitMaps = {};
			this.activePiece = null;
			this.refusal = null;
			this.selectedUnit = null;
			this.notice = `Move #${a.seq} recorded: ${a.report?.verdict === 'legal' ? 'legal' : ''}${this.pending ? ', waiting for the opponent to accept' : ''}`;
		} else if (a.status === 422) {
			this.refusal = { message: a.error?.message ?? 'Refused', report: a.report ?? null };
		}
	}

	accept(): Promise<ChangeAnswer> {
		return this.run(() => this.api.accept(this.game.seq));
	}

	takeBack(): Promise<ChangeAnswer> {
		return this.run(() => this.api.takeBack(this.game.seq));
	}

	requestRuling(note: string): Promise<ChangeAnswer> {
		return this.run(() => this.api.rulingRequest(this.game.seq, note));
	}

	endTurn(): Promise<ChangeAnswer> {
		return this.run(() => this.api.endTurn(this.game.seq), () => this.selectUnit(null));
	}

	// --- live sync --------------------------------------------------------------------------------------

	async reload(): Promise<void> {
		const a = await this.api.get();
		if (a.ok && a.game) {
			const before = this.game.seq;
			const moved = a.game.seq !== before;
			this.game = a.game;
			await this.refreshLog();
			// Someone else's change may make the draft stale: a draft only survives our own turn,
			// and not a ruling, which may put pieces elsewhere.
			const ruled = this.log.some((e) => e.seq > before && e.kind === 'ruling');
			if (moved && (!this.isMyTurn || ruled)) this.resetPaths();
			else if (moved) this.repick();
			if (ruled) this.notice = 'A judge has ruled: the table shows the positions after the ruling';
			void this.refreshRequests();
			return;
		}
		await this.refreshLog();
	}

	async refreshRequests(): Promise<void> {
		const r = await this.api.requests();
		if (r) this.requests = r;
	}

	async refreshLog(): Promise<void> {
		const l = await this.api.log(0);
		if (l) this.log = l.entries;
	}

	/** Listens for new log entries; EventSource reconnects by itself and sends the last id it saw. */
	connect(): void {
		if (this.events) return;
		this.routes ??= new RouteClient();
		this.startLiveCheck();
		void this.refreshRequests();
		const es = new EventSource(this.api.eventsUrl);
		this.events = es;
		es.onopen = () => (this.live = 'live');
		es.onerror = () => (this.live = es.readyState === EventSource.CLOSED ? 'offline' : 'connecting');
		es.addEventListener('seq', (ev) => {
			const seq = Number(JSON.parse((ev as MessageEvent).data).seq);
			if (seq > this.game.seq || this.log.length === 0 || seq > this.log[this.log.length - 1].seq) void this.reload();
		});
	}

	disconnect(): void {
		this.events?.close();
		this.events = null;
		this.stopLiveCheck();
		if (this.showTimer) clearTimeout(this.showTimer);
		this.showTimer = null;
		if (this.routeTimer) clearTimeout(this.routeTimer);
		this.routeTimer = null;
		this.routes?.dispose();
		this.mapRoutes?.dispose();
		this.routes = null;
		this.mapRoutes = null;
	}
}

/** An overlay and its point lists frozen: the canvas may then key it once. */
function freezeOverlay(o: Overlay): Overlay {
	if (o.kind === 'path') {
		for (const q of o.points) Object.freeze(q);
		Object.freeze(o.points);
	}
	return Object.freeze(o);
}

/** Two answers' parts compared by content (small: a unit's findings, costs, links). */
function sameJson(a: unknown, b: unknown): boolean {
	return a === b || JSON.stringify(a) === JSON.stringify(b);
}

function fmtLimit(v: number): string {
	return Number.isInteger(v) ? String(v) : v.toFixed(2);
}

export { describeEntry } from './log-words';
