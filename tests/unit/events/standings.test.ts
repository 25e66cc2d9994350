// Standings and their tie-breakers on hand-worked examples (values worked out by hand below;
// the scoring 3/1/0 with a bye worth a win is common practice, no published source).
import { describe, expect, it } from 'vitest';
import { computeStandings, swissHistory, type ResultIn } from '$lib/pairings';

const people = ['Ash', 'Bea', 'Cal', 'Dee'].map((name) => ({ id: name.toLowerCase(), name }));

describe('standings', () => {
	it('orders by points, then opponents’ points, then objective value difference', () => {
		// Round 1: ash beats bea 5–2, cal beats dee 4–3. Round 2: ash beats cal 3–1, dee beats bea 6–0.
		const results: ResultIn[] = [
			{ round: 1, a: 'ash', b: 'bea', outcome: 'a', valueA: 5, valueB: 2 },
			{ round: 1, a: 'cal', b: 'dee', outcome: 'a', valueA: 4, valueB: 3 },
			{ round: 2, a: 'ash', b: 'cal', outcome: 'a', valueA: 3, valueB: 1 },
			{ round: 2, a: 'dee', b: 'bea', outcome: 'a', valueA: 6, valueB: 0 }
		];
		const s = computeStandings(people, results);
		// Points: ash 6, cal 3, dee 3, bea 0. Cal and Dee are level on points;
		// opponents' points: cal met dee (3) + ash (6) = 9; dee met cal (3) + bea (0) = 3 → Cal ahead.
		expect(s.map((r) => [r.rank, r.id, r.points, r.opponentsPoints])).toEqual([
			[1, 'ash', 6, 3],
			[2, 'cal', 3, 9],
			[3, 'dee', 3, 3],
			[4, 'bea', 0, 9]
		]);
		// Value difference: ash +3 +2 = 5; cal +1 −2 = −1; dee −1 +6 = 5; bea −3 −6 = −9.
		expect(s.map((r) => r.valueDiff)).toEqual([5, -1, 5, -9]);
		expect(s[0]).toMatchObject({ played: 2, wins: 2, draws: 0, losses: 0, byes: 0 });
	});

	it('falls to objective value difference when points and opponents’ points are level', () => {
		// Two separate games, both winners on 3 with opponents on 0: only the value margin splits them.
		const results: ResultIn[] = [
			{ round: 1, a: 'ash', b: 'bea', outcome: 'a', valueA: 4, valueB: 3 },
			{ round: 1, a: 'cal', b: 'dee', outcome: 'a', valueA: 6, valueB: 1 }
		];
		const s = computeStandings(people, results);
		expect(s.map((r) => r.id)).toEqual(['cal', 'ash', 'bea', 'dee']);
		expect(s.map((r) => r.rank)).toEqual([1, 2, 3, 4]);
		// bea −1 is ahead of dee −5 on the same rule.
		expect(s.map((r) => r.valueDiff)).toEqual([5, 1, -1, -5]);
	});

	it('uses head-to-head when the first three keys are level, and shares a rank when all four are', () => {
		// Three players: ash–bea draw 2–2 and cal has the bye (round 1); bea–cal draw 1–1 and
		// ash has the bye (round 2).
		const three = people.slice(0, 3);
		const level: ResultIn[] = [
			{ round: 1, a: 'ash', b: 'bea', outcome: 'draw', valueA: 2, valueB: 2 },
			{ round: 1, a: 'cal', b: null, outcome: 'a', valueA: 0, valueB: 0 },
			{ round: 2, a: 'bea', b: 'cal', outcome: 'draw', valueA: 1, valueB: 1 },
			{ round: 2, a: 'ash', b: null, outcome: 'a', valueA: 0, valueB: 0 }
		];
		const s = computeStandings(three, level);
		// ash: draw 1 + bye 3 = 4, opponents bea (2) = 2, diff 0. cal: bye 3 + draw 1 = 4,
		// opponents bea (2) = 2, diff 0. bea: two draws = 2. Ash and Cal never met: h2h 0 each,
		// so they share rank 1, listed by name.
		expect(s.map((r) => [r.rank, r.id, r.points, r.opponentsPoints, r.valueDiff, r.headToHead])).toEqual([
			[1, 'ash', 4, 2, 0, 0],
			[1, 'cal', 4, 2, 0, 0],
			[3, 'bea', 2, 8, 0, 0]
		]);
		expect(s[0].byes).toBe(1);


		// Opponents' points part two players level on points before head-to-head is reached:
		// ash beats bea 2–1, cal–dee draw 0–0; cal beats ash 2–1, bea beats dee 2–1.
		const h2h: ResultIn[] = [
			{ round: 1, a: 'bea', b: 'ash', outcome: 'b', valueA: 1, valueB: 2 },
			{ round: 1, a: 'cal', b: 'dee', outcome: 'draw', valueA: 0, valueB: 0 },
			{ round: 2, a: 'ash', b: 'cal', outcome: 'b', valueA: 1, valueB: 2 },
			{ round: 2, a: 'bea', b: 'dee', outcome: 'a', valueA: 2, valueB: 1 }
		];
		const t = computeStandings(people, h2h);
		// Points: ash 3, bea 3, cal 4, dee 1. Opponents' points: ash = bea 3 + cal 4 = 7;
		// bea = ash 3 + dee 1 = 4; cal = dee 1 + ash 3 = 4; dee = cal 4 + bea 3 = 7.
		expect(t.map((r) => [r.id, r.points, r.opponentsPoints])).toEqual([
			['cal', 4, 4],
			['ash', 3, 7],
			['bea', 3, 4],
			['dee', 1, 7]
		]);
	});

	it('head-to-head parts two players level on points, opponents’ points and margin', () => {
		// Four players, two rounds. Round 1: ash beats bea 3–2, cal beats dee 3–2.
		// Round 2: bea beats cal 3–2, dee beats ash 3–2.
		// Everyone: one win, one loss, 3 points, margin 0, opponents' points 6.
		// All four level on three keys; inside that group of four each has one win (3) — still
		// level, so all four share rank 1.
		const ring: ResultIn[] = [
			{ round: 1, a: 'ash', b: 'bea', outcome: 'a', valueA: 3, valueB: 2 },
			{ round: 1, a: 'cal', b: 'dee', outcome: 'a', valueA: 3, valueB: 2 },
			{ round: 2, a: 'bea', b: 'cal', outcome: 'a', valueA: 3, valueB: 2 },
			{ round: 2, a: 'dee', b: 'ash', outcome: 'a', valueA: 3, valueB: 2 }
		];
		expect(computeStandings(people, ring).map((r) => [r.rank, r.headToHead])).toEqual([
			[1, 3],
			[1, 3],
			[1, 3],
			[1, 3]
		]);

		// Three rounds where ash and bea end level on the first three keys, and ash beat bea.
		const pair = people;
		const split: ResultIn[] = [
			// round 1: ash beats bea 2–1; cal beats dee 2–1
			{ round: 1, a: 'ash', b: 'bea', outcome: 'a', valueA: 2, valueB: 1 },
			{ round: 1, a: 'cal', b: 'dee', outcome: 'a', valueA: 2, valueB: 1 },
			// round 2: bea beats cal 2–1; ash and dee draw 1–1
			{ round: 2, a: 'bea', b: 'cal', outcome: 'a', valueA: 2, valueB: 1 },
			{ round: 2, a: 'ash', b: 'dee', outcome: 'draw', valueA: 1, valueB: 1 },
			// round 3: bea and dee draw 1–1; ash loses to cal 1–2
			{ round: 3, a: 'bea', b: 'dee', outcome: 'draw', valueA: 1, valueB: 1 },
			{ round: 3, a: 'cal', b: 'ash', outcome: 'a', valueA: 2, valueB: 1 }
		];
		const s = computeStandings(pair, split);
		// ash: W D L = 4 pts, margin +1 0 −1 = 0; bea: L W D = 4, margin −1 +1 0 = 0;
		// cal: W L W = 6; dee: L D D = 2. Opponents' points: ash bea 4 + dee 2 + cal 6 = 12;
		// bea ash 4 + cal 6 + dee 2 = 12. Level on three keys; ash beat bea → ash ahead.
		expect(s.map((r) => [r.rank, r.id, r.points, r.opponentsPoints, r.valueDiff, r.headToHead])).toEqual([
			[1, 'cal', 6, 10, 1, 0],
			[2, 'ash', 4, 12, 0, 3],
			[3, 'bea', 4, 12, 0, 0],
			[4, 'dee', 2, 14, -1, 0]
		]);
	});

	it('counts a bye as a win with no opponent and no margin', () => {
		const s = computeStandings(people.slice(0, 1), [{ round: 1, a: 'ash', b: null, outcome: 'a', valueA: 0, valueB: 0 }]);
		expect(s[0]).toMatchObject({ points: 3, byes: 1, played: 0, opponentsPoints: 0, valueDiff: 0 });
	});
});

describe('the history the next round is paired from', () => {
	it('counts a pairing without a result as met (no rematch) but scores nothing for it', () => {
		const h = swissHistory(['a', 'b', 'c'], [
			{ a: 'a', b: 'b', outcome: null },
			{ a: 'c', b: null, outcome: null }
		]);
		expect(h).toEqual([
			{ id: 'a', points: 0, opponents: ['b'], hadBye: false },
			{ id: 'b', points: 0, opponents: ['a'], hadBye: false },
			{ id: 'c', points: 3, opponents: [], hadBye: true }
		]);
	});
});

describe('CSV export cells', () => {
	it('quotes commas and quotes, and defuses formula-looking text (RFC 4180; OWASP CSV injection advice)', async () => {
		const { toCsv } = await import('$lib/pairings');
		expect(toCsv(['a', 'b'], [['x, y', 'say "hi"'], ['=SUM(A1)', -3], [null, 2.5]])).toBe(
			'a,b\r\n"x, y","say ""hi"""\r\n\'=SUM(A1),-3\r\n,2.5\r\n'
		);
	});
});
