// Each rule of the check with its finding code, on hand-built tables, with both sides of every
// boundary at the tolerance ε = 0.005 in ("within X" means ≤ X + ε). Pieces stand on 1 in round
// bases (25.4 mm) so an edge-to-edge figure is the centre distance minus 1.
// Trade facts used here (1 in keep-out, 2 in spacing, 7-piece threshold, move + D6 for a dash):
// common practice, no published source.
import { describe, expect, it } from 'vitest';
import { checkMove } from '../../../src/lib/referee';
import { codes, EPS, errors, NUDGE, piece, rect, request } from './helpers';

const HULL_3x2: [number, number][] = [
	[-1.5, -1],
	[1.5, -1],
	[1.5, 1],
	[-1.5, 1]
];

describe('allowance [over-allowance]', () => {
	const at = (len: number) =>
		checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 5 + len, y: 5 }] } }));
	it('a path costing the allowance + ε − 1e-4 fits; + ε + 1e-4 does not', () => {
		expect(codes(at(6 + EPS - NUDGE))).toEqual([]);
		const over = at(6 + EPS + NUDGE);
		expect(codes(over)).toEqual(['over-allowance']);
		expect(over.verdict).toBe('illegal');
		expect(over.findings[0].measured).toBeCloseTo(6 + EPS + NUDGE, 12);
		expect(over.findings[0].limit).toBe(6);
		expect(over.pieces.a1.findings.map((f) => f.code)).toEqual(['over-allowance']);
	});
	it('a dash allows the allowance plus the die (move + D6: common practice, no published source)', () => {
		const dash = (len: number, die: number) =>
			checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'dash', die, paths: { a1: [{ x: 5 + len, y: 5 }] } }));
		expect(dash(9 + EPS - NUDGE, 3).verdict).toBe('legal');
		expect(codes(dash(9 + EPS + NUDGE, 3))).toEqual(['over-allowance']);
		expect(dash(9, 3).pieces.a1.allowance).toBe(9);
	});
	it('a hold allows no movement at all', () => {
		const hold = (len: number) =>
			checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'hold', paths: { a1: [{ x: 5 + len, y: 5 }] } }));
		expect(hold(EPS - NUDGE).verdict).toBe('legal');
		expect(codes(hold(EPS + NUDGE))).toEqual(['over-allowance']);
		expect(checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'hold' })).verdict).toBe('legal');
	});
});

describe('start [locked] and [not-in-contact]', () => {
	const table = (gap: number, kind: 'move' | 'withdraw' | 'hold') =>
		checkMove(
			request([piece('a1', 'red', 'u1', 10, 10), piece('c1', 'blue', 'u2', 11 + gap, 10)], {
				unit: 'u1',
				kind,
				paths: kind === 'hold' ? {} : { a1: [{ x: 10, y: 15 }] }
			})
		);
	it('a unit within keep-out (1 in + ε) of an enemy at the start may not move', () => {
		const inZone = table(1 + EPS - NUDGE, 'move');
		expect(codes(inZone)).toContain('locked');
		const f = inZone.findings.find((x) => x.code === 'locked')!;
		expect(f.pieces).toEqual(['a1', 'c1']);
		expect(f.measured).toBeCloseTo(1 + EPS - NUDGE, 12);
		expect(codes(table(1 + EPS + NUDGE, 'move'))).not.toContain('locked');
	});
	it('a unit in contact may hold or withdraw', () => {
		expect(table(0.5, 'hold').verdict).toBe('legal');
		expect(table(0.5, 'withdraw').verdict).toBe('legal');
	});
	it('a withdraw by a unit not in contact is a warning and stays legal', () => {
		const out = table(1 + EPS + NUDGE, 'withdraw');
		expect(codes(out)).toEqual(['not-in-contact']);
		expect(out.findings[0].severity).toBe('warning');
		expect(out.verdict).toBe('legal');
		expect(codes(table(1 + EPS - NUDGE, 'withdraw'))).toEqual([]);
	});
});

describe('path of a non-flier', () => {
	// a1 runs along y = 10 from x = 2 to x = 7; enemy c1 stands at x = 4.5, off the line by `off`
	const pass = (off: number, kind: 'move' | 'withdraw', extra = {}) =>
		checkMove(
			request([piece('a1', 'red', 'u1', 2, 10, extra), piece('c1', 'blue', 'u2', 4.5, 10 + off)], {
				unit: 'u1',
				kind,
				paths: { a1: [{ x: 7, y: 10 }] }
			})
		);
	it('[enters-keep-out] a move may not pass within 1 in + ε of an enemy', () => {
		expect(codes(pass(2 + EPS - NUDGE, 'move'))).toEqual(['enters-keep-out']);
		expect(codes(pass(2 + EPS + NUDGE, 'move'))).toEqual([]);
		const f = pass(1.5, 'move').findings[0];
		expect(f.measured).toBeCloseTo(0.5, 12);
		expect(f.message).toBe('a1 passes 0.50 in from enemy c1; during a move it must stay more than 1 in away');
	});
	it('a withdraw may cross keep-out zones on the way out', () => {
		expect(errors(pass(1.5, 'withdraw'))).toEqual([]);
	});
	it('[through-enemy] nobody moves through an enemy footprint (overlap beyond ε)', () => {
		expect(errors(pass(1 - EPS - NUDGE, 'withdraw'))).toEqual(['through-enemy']);
		expect(errors(pass(1 - EPS + NUDGE, 'withdraw'))).toEqual([]);
		expect(pass(0, 'withdraw').findings.find((f) => f.code === 'through-enemy')!.measured).toBeCloseTo(-1, 12);
	});
	it('a flier passes over an enemy but may not end in its zone', () => {
		expect(codes(pass(0, 'move', { flies: true }))).toEqual([]);
		const endsNear = checkMove(
			request([piece('a1', 'red', 'u1', 2, 10, { flies: true }), piece('c1', 'blue', 'u2', 4.5, 10)], {
				unit: 'u1',
				kind: 'move',
				paths: { a1: [{ x: 6, y: 10 }] }
			})
		);
		expect(codes(endsNear)).toEqual(['ends-in-keep-out']);
	});

	// v1 (3 × 2 in hull) drives along y = 10 past t2; `off` is t2's centre offset
	const drive = (off: number, other: Partial<Parameters<typeof piece>[5]>, side = 'red') =>
		checkMove(
			request(
				[
					piece('v1', 'red', 'u1', 3, 10, { class: 'vehicle', allowance: 20, footprint: { shape: 'hull', points: HULL_3x2 } }),
					piece('t2', side, 'u2', 10, 10 + off, other)
				],
				{ unit: 'u1', kind: 'move', paths: { v1: [{ x: 17, y: 10 }] } }
			)
		);
	it('[bulky-through-bulky] a bulky piece never passes through another bulky piece, even a friend', () => {
		const tank = { class: 'vehicle' as const, footprint: { shape: 'hull' as const, points: HULL_3x2 } };
		expect(codes(drive(2 - EPS - NUDGE, tank))).toEqual(['bulky-through-bulky']);
		expect(codes(drive(2 - EPS + NUDGE, tank))).toEqual([]);
		expect(codes(drive(0, { class: 'monster' }))).toEqual(['bulky-through-bulky']);
	});
	it('a bulky piece passes through friendly non-bulky pieces; others pass through any friend', () => {
		expect(codes(drive(0, { class: 'foot' }))).toEqual([]);
		expect(codes(checkMove(request([piece('a1', 'red', 'u1', 2, 10), piece('a9', 'red', 'u2', 4.5, 10, { class: 'vehicle' })], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 7, y: 10 }] } })))).toEqual([]);
	});
	it('a bulky unit-mate that stays put is in the way; one that moves is not', () => {
		const v = (id: string, x: number) => piece(id, 'red', 'u1', x, 10, { class: 'vehicle', allowance: 12, footprint: { shape: 'hull', points: HULL_3x2 } });
		const still = checkMove(request([v('v1', 3), v('v2', 10)], { unit: 'u1', kind: 'move', paths: { v1: [{ x: 17, y: 10 }] } }));
		expect(codes(still)).toContain('bulky-through-bulky');
		const both = checkMove(request([v('v1', 3), v('v2', 10)], { unit: 'u1', kind: 'move', paths: { v1: [{ x: 14, y: 10 }], v2: [{ x: 17.5, y: 10 }] } }));
		expect(codes(both)).not.toContain('bulky-through-bulky');
	});

	const ruin = { id: 'ruin-1', kind: 'ruin' as const, outline: rect(20, 5, 30, 15), walls: [[[20, 5], [20, 15]]] as [number, number][][] };
	// the piece runs parallel to the wall x = 20, past its whole length, and ends clear of the ruin
	const wallRun = (cls: 'foot' | 'beast' | 'swarm' | 'mounted' | 'vehicle', gap: number) =>
		checkMove(
			request([piece('m1', 'red', 'u1', 19.5 - gap, 2, { class: cls, allowance: 20 })], { unit: 'u1', kind: 'withdraw', paths: { m1: [{ x: 19.5 - gap, y: 18 }] } }, { terrain: [ruin] })
		);
	it('[wall-blocked] only foot and beast pass through ruin walls; a touch within ε is not a crossing', () => {
		// the base (radius 0.5) runs parallel to the wall x = 20 with its edge `gap` short of it
		expect(errors(wallRun('mounted', -EPS - NUDGE))).toEqual(['wall-blocked']);
		expect(errors(wallRun('mounted', -EPS + NUDGE))).toEqual([]);
		expect(errors(wallRun('foot', -0.5))).toEqual([]);
		expect(errors(wallRun('beast', -0.5))).toEqual([]);
		expect(errors(wallRun('swarm', -0.5))).toEqual(['wall-blocked']);
	});

	const block = { id: 'crate-1', kind: 'block' as const, outline: rect(10, 10, 12, 15), height: 2 };
	const alongBlock = (cls: 'foot' | 'mounted' | 'vehicle', gap: number) =>
		checkMove(
			request([piece('m1', 'red', 'u1', 9.5 - gap, 5, { class: cls, allowance: 20 })], { unit: 'u1', kind: 'withdraw', paths: { m1: [{ x: 9.5 - gap, y: 20 }] } }, { terrain: [block] })
		);
	it('[climb-blocked] classes that do not climb may not touch a block beyond ε', () => {
		expect(errors(alongBlock('mounted', -EPS - NUDGE))).toEqual(['climb-blocked']);
		expect(errors(alongBlock('mounted', -EPS + NUDGE))).toEqual([]);
		expect(errors(alongBlock('foot', -0.3))).toEqual([]);
		expect(alongBlock('foot', -0.3).pieces.m1.cost).toBeCloseTo(15 + 4, 12);
	});

	const pond = { id: 'pond', kind: 'impassable' as const, outline: rect(10, 10, 14, 14) };
	const alongPond = (gap: number, flies = false) =>
		checkMove(
			request([piece('m1', 'red', 'u1', 9.5 - gap, 5, { allowance: 20, flies })], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 9.5 - gap, y: 20 }] } }, { terrain: [pond] })
		);
	it('[impassable] nobody enters impassable terrain; a flier passes over but may not end on it', () => {
		expect(codes(alongPond(-EPS - NUDGE))).toEqual(['impassable']);
		expect(codes(alongPond(-EPS + NUDGE))).toEqual([]);
		expect(codes(alongPond(-2, true))).toEqual([]);
		const landing = checkMove(
			request([piece('m1', 'red', 'u1', 12, 5, { flies: true })], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 12, y: 11 }] } }, { terrain: [pond] })
		);
		expect(codes(landing)).toEqual(['impassable']);
	});
	it('area terrain has no effect on movement', () => {
		const wood = { id: 'wood', kind: 'area' as const, outline: rect(0, 0, 40, 40) };
		expect(checkMove(request([piece('m1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 10, y: 5 }] } }, { terrain: [wood] })).pieces.m1.cost).toBe(5);
	});
	it('[off-board] the footprint stays on the board, ε allowed', () => {
		const edge = (over: number) =>
			checkMove(request([piece('m1', 'red', 'u1', 5, 5, { allowance: 20 })], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 5, y: 0.5 - over }, { x: 5, y: 5 }] } }));
		expect(errors(edge(EPS + NUDGE))).toEqual(['off-board']);
		expect(edge(EPS + NUDGE).findings[0].measured).toBeCloseTo(EPS + NUDGE, 12);
		expect(errors(edge(EPS - NUDGE))).toEqual([]);
	});
	it('[off-board] an oval ends by the edge: only its own extent counts, not its circumscribed circle', () => {
		// 60 × 35 mm oval, facing 0: half-width across the y axis is 17.5 / 25.4 in
		const halfWidthIn = 17.5 / 25.4;
		const oval = { shape: 'oval' as const, lengthMm: 60, widthMm: 35 };
		const endY = (gap: number) =>
			checkMove(
				request([piece('m', 'red', 'u1', 7, 15, { allowance: 10, footprint: oval })], { unit: 'u1', kind: 'move', paths: { m: [{ x: 7, y: 20 - halfWidthIn - gap, facing: 0 }] } }, { width: 20, depth: 20 })
			);
		expect(errors(endY(0.01))).toEqual([]);
		expect(errors(endY(-EPS - 0.01))).toEqual(['off-board']);
	});
});

describe('end of the move', () => {
	const endAt = (x: number, kind: 'move' | 'withdraw' = 'move', enemy = true) =>
		checkMove(
			request([piece('b3', 'red', 'u1', 2, 20, { allowance: 10 }), piece('c1', enemy ? 'blue' : 'red', 'u2', 10, 20)], { unit: 'u1', kind, paths: { b3: [{ x, y: 20.0 }] } })
		);
	it('[ends-in-keep-out] no piece ends within 1 in + ε of an enemy, for every kind', () => {
		const near = endAt(10 - 1 - 1 - EPS + NUDGE);
		expect(codes(near)).toContain('ends-in-keep-out');
		expect(codes(endAt(10 - 2 - EPS - NUDGE))).toEqual([]);
		expect(codes(checkMove(request([piece('b3', 'red', 'u1', 9.5, 20), piece('c1', 'blue', 'u2', 10, 21.8)], { unit: 'u1', kind: 'withdraw', paths: { b3: [{ x: 8.18 - 0, y: 21.8 }] } })))).toContain('ends-in-keep-out');
	});
	it('says the figures in a sentence a player understands', () => {
		const f = endAt(10 - 1.82).findings.find((x) => x.code === 'ends-in-keep-out')!;
		expect(f.message).toBe('b3 ends 0.82 in from enemy c1; it must end more than 1 in away');
		expect(f.pieces).toEqual(['b3', 'c1']);
		expect(f.limit).toBe(1);
	});
	it('[ends-overlapping] no piece ends on another, friend or foe; a touch within ε is contact', () => {
		expect(codes(endAt(10 - 1 + EPS + NUDGE, 'move', false))).toEqual(['ends-overlapping']);
		expect(codes(endAt(10 - 1 + EPS - NUDGE, 'move', false))).toEqual([]);
	});
	const block = { id: 'crate-1', kind: 'block' as const, outline: rect(10, 10, 14, 14), height: 1 };
	const onBlock = (overhang: number) =>
		checkMove(
			request([piece('m1', 'red', 'u1', 12, 5, { allowance: 10 })], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 12, y: 14 - 0.5 + overhang }] } }, { terrain: [block] })
		);
	it('[overhang] a piece on a block stands wholly on its top (ε allowed)', () => {
		const over = onBlock(EPS + NUDGE);
		expect(codes(over)).toEqual(['overhang']);
		expect(over.findings[0].measured).toBeCloseTo(EPS + NUDGE, 9);
		expect(codes(onBlock(EPS - NUDGE))).toEqual([]);
		// wholly on top: the climb is paid one way only
		expect(onBlock(0).pieces.m1.cost).toBeCloseTo(8.5 + 1, 12);
	});
	it('[overhang] a piece ending across a ruin floor outline overhangs it', () => {
		const ruin = { id: 'ruin-1', kind: 'ruin' as const, outline: rect(20, 20, 30, 28), walls: [] };
		const across = checkMove(request([piece('m1', 'red', 'u1', 20, 15)], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 20, y: 20 }] } }, { terrain: [ruin] }));
		expect(codes(across)).toEqual(['overhang']);
		const off = checkMove(request([piece('m1', 'red', 'u1', 20, 15)], { unit: 'u1', kind: 'move', paths: { m1: [{ x: 20, y: 20 }] } }, { terrain: [ruin] }, { ruinFloorOverhang: false }));
		expect(codes(off)).toEqual([]);
	});
});

describe('group spacing [spacing]', () => {
	const pair = (gap: number) =>
		checkMove(request([piece('a1', 'red', 'u1', 5, 5), piece('a2', 'red', 'u1', 7, 5)], { unit: 'u1', kind: 'move', paths: { a2: [{ x: 6 + gap, y: 5 }] } }));
	it('each piece keeps a unit-mate within 2 in + ε edge to edge (common practice, no published source)', () => {
		expect(codes(pair(2 + EPS - NUDGE))).toEqual([]);
		const apart = pair(2.41);
		expect(codes(apart)).toEqual(['spacing', 'spacing']);
		expect(apart.findings[0].message).toBe('a1 is 2.41 in from its nearest unit-mate; it must be within 2 in of one');
		expect(codes(pair(2 + EPS + NUDGE))).toEqual(['spacing', 'spacing']);
	});
	it('units of one piece are exempt', () => {
		expect(checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 9, y: 5 }] } })).verdict).toBe('legal');
	});
	// a line of pieces 1.5 in apart edge to edge: the ends have only one neighbour in range
	const line = (n: number) =>
		checkMove(
			request(
				Array.from({ length: n }, (_, i) => piece(`a${i + 1}`, 'red', 'u1', 5 + 2.5 * i, 5)),
				{ unit: 'u1', kind: 'move', paths: { a1: [{ x: 5, y: 5.5 }] } }
			)
		);
	it('a unit of 7 or more needs two unit-mates in range (7-piece threshold: common practice, no published source)', () => {
		expect(codes(line(6))).toEqual([]);
		const seven = line(7);
		expect(seven.findings.map((f) => f.pieces[0])).toEqual(['a1', 'a7']);
		expect(seven.findings[1].message).toBe('a7 is 4.00 in from its second-nearest unit-mate; it must be within 2 in of two');
	});
	it('a joined leader counts as part of the unit', () => {
		const withLeader = checkMove(
			request(
				[piece('a1', 'red', 'u1', 5, 5), piece('L', 'red', 'u7', 7.5, 5, { leaderOf: 'u1' }), piece('a2', 'red', 'u1', 10, 5)],
				{ unit: 'u1', kind: 'move', paths: { L: [{ x: 7.5, y: 6 }] } }
			)
		);
		expect(Object.keys(withLeader.pieces)).toEqual(['a1', 'L', 'a2']);
		expect(withLeader.verdict).toBe('legal');
		const without = checkMove(request([piece('a1', 'red', 'u1', 5, 5), piece('a2', 'red', 'u1', 10, 5)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 5, y: 6 }] } }));
		expect(codes(without)).toEqual(['spacing', 'spacing']);
	});
	it('measures a hull whose reference point lies outside it edge to edge, not by its reference point', () => {
		// both reference points 1 in apart, the hulls facing away from each other: 3 in apart edge to edge
		const offset = { shape: 'hull' as const, points: rect(2, 0, 3, 1) };
		const hulls = (gap: number) =>
			checkMove(
				request(
					[piece('h1', 'red', 'u1', 20, 10, { footprint: offset }), piece('h2', 'red', 'u1', 20 + gap, 10, { footprint: offset, facing: 180 })],
					{ unit: 'u1', kind: 'move', paths: { h2: [{ x: 20 + gap, y: 10.5 }] } }
				)
			);
		const apart = hulls(1);
		expect(codes(apart)).toEqual(['spacing', 'spacing']);
		expect(apart.findings[0].measured).toBeCloseTo(3, 12);
		// 6.1 in apart at the reference points: the hulls are 0.1 in apart, well in range
		expect(codes(hulls(6.1))).toEqual([]);
	});
	it('profile option: the unit must also form one connected group', () => {
		const pieces = [0, 1, 2, 3].map((i) => piece(`a${i + 1}`, 'red', 'u1', 5 + 2 * i + (i >= 2 ? 4 : 0), 5));
		const mv = { unit: 'u1', kind: 'move' as const, paths: { a1: [{ x: 5, y: 5.1 }] } };
		expect(checkMove(request(pieces, mv)).verdict).toBe('legal');
		const connected = checkMove(request(pieces, mv, {}, { spacingConnected: true }));
		expect(codes(connected)).toEqual(['spacing']);
		expect(connected.findings[0].pieces).toEqual(['a3', 'a4']);
		expect(connected.findings[0].measured).toBeCloseTo(5, 12);
	});
});

describe('verdict and report', () => {
	it('is illegal exactly when an error finding exists', () => {
		const ok = checkMove(request([piece('a1', 'red', 'u1', 5, 5)], { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8, y: 9 }] } }));
		expect(ok).toEqual({
			verdict: 'legal',
			pieces: { a1: { cost: 5, allowance: 6, findings: [] } },
			findings: [],
			summaries: { objectives: [], rings: [] }
		});
	});
	it('the same request always gives the same report', () => {
		const req = request(
			[piece('a1', 'red', 'u1', 5, 5), piece('a2', 'red', 'u1', 6.5, 5), piece('c1', 'blue', 'u2', 9, 5)],
			{ unit: 'u1', kind: 'move', paths: { a1: [{ x: 7, y: 7 }] } }
		);
		expect(JSON.stringify(checkMove(req))).toBe(JSON.stringify(checkMove(structuredClone(req))));
	});
});
