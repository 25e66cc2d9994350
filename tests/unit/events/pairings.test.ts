// Swiss pairings on worked examples. The package shuffles before matching, so every example is
// played many times over: a rule that held by luck would fail one of the runs.
import { describe, expect, it } from 'vitest';
import { assignTables, orderPairs, pairingProblems, pairRound, swapPlayers, swissHistory, PairingError, type Pair } from '$lib/pairings';

const RUNS = 40;

/** Players p1…pn; in every game the lower-numbered player wins (a fixed, checkable rule). */
const ids = (n: number) => Array.from({ length: n }, (_, i) => `p${i + 1}`);
const seed = (id: string) => Number(id.slice(1));
type Played = { round: number; a: string; b: string | null; outcome: 'a' | 'b' | null };

function playRounds(n: number, rounds: number) {
	const players = ids(n);
	const log: Played[] = [];
	const perRound: { pairs: Pair[]; before: ReturnType<typeof swissHistory> }[] = [];
	for (let round = 1; round <= rounds; round++) {
		const before = swissHistory(players, log);
		const pairs = pairRound(before, round);
		perRound.push({ pairs, before });
		for (const p of pairs) {
			log.push({ round, a: p.a, b: p.b, outcome: p.b === null ? null : seed(p.a) < seed(p.b) ? 'a' : 'b' });
		}
	}
	return { log, perRound };
}

describe('Swiss pairings, 8 players over 3 rounds', () => {
	it('never pairs two players who have met, and keeps every pair inside its score group', () => {
		for (let run = 0; run < RUNS; run++) {
			const { log, perRound } = playRounds(8, 3);
			const met = new Set<string>();
			for (const g of log) {
				expect(g.b).not.toBeNull(); // an even count has no bye
				const key = [g.a, g.b].sort().join('-');
				expect(met.has(key), `rematch ${key}`).toBe(false);
				met.add(key);
			}
			// With "lower number wins", rounds 2 and 3 can be paired wholly within score groups
			// (worked by hand: 4+4 after round 1; 2+4+2 after round 2), so the package must do so.
			for (const { pairs, before } of perRound) {
				const pts = new Map(before.map((p) => [p.id, p.points]));
				for (const p of pairs) expect(pts.get(p.a)).toBe(pts.get(p.b!));
				expect(pairs).toHaveLength(4);
			}
			// Round 3 has exactly the worked groups: two on 6, four on 3, two on 0 (3 points a win).
			const r3 = perRound[2].before.map((p) => p.points).sort((x, y) => y - x);
			expect(r3).toEqual([6, 6, 3, 3, 3, 3, 0, 0]);
		}
	});

	it('lists the top pair first and the higher-scored player first within a pair', () => {
		const { perRound } = playRounds(8, 2);
		const { pairs, before } = perRound[1];
		const pts = new Map(before.map((p) => [p.id, p.points]));
		expect(pts.get(pairs[0].a)).toBe(3);
		expect(pts.get(pairs.at(-1)!.a)).toBe(0);
	});
});

describe('Swiss pairings, 7 players', () => {
	it('gives one bye a round, to a lowest-scored player without one, never twice to the same player', () => {
		for (let run = 0; run < RUNS; run++) {
			const { perRound } = playRounds(7, 3);
			const byes: string[] = [];
			for (const { pairs, before } of perRound) {
				const round = pairs.filter((p) => p.b === null);
				expect(round).toHaveLength(1);
				const bye = round[0].a;
				expect(byes).not.toContain(bye);
				const eligible = before.filter((p) => !p.hadBye);
				const lowest = Math.min(...eligible.map((p) => p.points));
				expect(before.find((p) => p.id === bye)!.points).toBe(lowest);
				byes.push(bye);
			}
		}
	});

	it('over four rounds the byes go to four different players and nobody meets anyone twice', () => {
		// Four rounds is as far as 7 players always pair cleanly; later rounds can run out of
		// fresh opponents (Swiss is not a round robin), which pairRound reports as a PairingError.
		for (let run = 0; run < RUNS; run++) {
			const { log } = playRounds(7, 4);
			const byes = log.filter((g) => g.b === null).map((g) => g.a);
			expect(new Set(byes).size).toBe(4);
			const games = log.filter((g) => g.b !== null).map((g) => [g.a, g.b].sort().join('-'));
			expect(new Set(games).size).toBe(games.length);
			expect(games).toHaveLength(12);
		}
	});
});

describe('pairing rules and adjustments', () => {
	const history = [
		{ id: 'p1', points: 3, opponents: ['p2'], hadBye: false },
		{ id: 'p2', points: 0, opponents: ['p1'], hadBye: false },
		{ id: 'p3', points: 3, opponents: ['p4'], hadBye: false },
		{ id: 'p4', points: 0, opponents: ['p3'], hadBye: false }
	];

	it('names a rematch and an unpaired player as problems', () => {
		expect(pairingProblems(history, [{ a: 'p1', b: 'p2' }, { a: 'p3', b: 'p4' }])).toEqual([
			'p1 and p2 have met before',
			'p3 and p4 have met before'
		]);
		expect(pairingProblems(history, [{ a: 'p1', b: 'p3' }])).toEqual(['p2 is not paired', 'p4 is not paired']);
		expect(pairingProblems(history, [{ a: 'p1', b: 'p3' }, { a: 'p2', b: 'p4' }])).toEqual([]);
	});

	it('refuses when every possible pairing is a rematch', () => {
		const two = [
			{ id: 'x', points: 3, opponents: ['y'], hadBye: false },
			{ id: 'y', points: 0, opponents: ['x'], hadBye: false }
		];
		expect(() => pairRound(two, 2)).toThrow(PairingError);
	});

	it('swaps two players by hand across pairings', () => {
		const swapped = swapPlayers([{ a: 'p1', b: 'p3' }, { a: 'p2', b: 'p4' }], 'p3', 'p4');
		expect(swapped).toEqual([{ a: 'p1', b: 'p4' }, { a: 'p2', b: 'p3' }]);
		expect(pairingProblems(history, swapped)).toEqual([]);
		// A swap that brings back round 1 is shown to the organiser as a problem.
		const back = swapPlayers([{ a: 'p1', b: 'p3' }, { a: 'p2', b: 'p4' }], 'p3', 'p2');
		expect(pairingProblems(history, back)).toEqual(['p1 and p2 have met before', 'p3 and p4 have met before']);
	});

	it('orders pairs by points with the bye last', () => {
		const pts = [
			{ id: 'a', points: 0, opponents: [], hadBye: false },
			{ id: 'b', points: 6, opponents: [], hadBye: false },
			{ id: 'c', points: 3, opponents: [], hadBye: false }
		];
		expect(orderPairs(pts, [{ a: 'c', b: null }, { a: 'a', b: 'b' }])).toEqual([{ a: 'b', b: 'a' }, { a: 'c', b: null }]);
	});

	it('numbers tables from 1, skips the bye and deals the layouts in turn', () => {
		const t = assignTables([{ a: 'a', b: 'b' }, { a: 'c', b: 'd' }, { a: 'e', b: 'f' }, { a: 'g', b: null }], [11, 12]);
		expect(t.map((p) => [p.table, p.layoutId])).toEqual([[1, 11], [2, 12], [3, 11], [null, null]]);
		expect(assignTables([{ a: 'a', b: 'b' }])[0].layoutId).toBeNull();
	});
});

describe('a round that cannot be paired cleanly', () => {
	it('is still drafted, with its rematch named, so the organiser can mend it', async () => {
		const { tryPairRound } = await import('$lib/pairings');
		const two = [
			{ id: 'x', points: 3, opponents: ['y'], hadBye: false },
			{ id: 'y', points: 0, opponents: ['x'], hadBye: false }
		];
		const r = tryPairRound(two, 2);
		expect(r.pairs).toEqual([{ a: 'x', b: 'y' }]);
		expect(r.problems).toEqual(['x and y have met before']);
	});
});
