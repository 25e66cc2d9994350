// Standings from reported results, with the tie-breakers documented in docs/events.md:
// points, then opponents' points (strength of schedule), then objective value difference,
// then head-to-head among the players still level; players level on all four share a rank.

export type Outcome = 'a' | 'b' | 'draw';

/** One confirmed result; a bye has `b` null and counts as a win with no objective values. */
export interface ResultIn {
	round: number;
	a: string;
	b: string | null;
	outcome: Outcome;
	/** objective value each side held at the end of the game */
	valueA: number;
	valueB: number;
}

export interface Scoring {
	win: number;
	draw: number;
	loss: number;
	bye: number;
}

/** Common practice in Swiss events, no published source: 3 for a win or bye, 1 for a draw. */
export const DEFAULT_SCORING: Scoring = { win: 3, draw: 1, loss: 0, bye: 3 };

export interface StandingRow {
	rank: number;
	id: string;
	name: string;
	played: number;
	wins: number;
	draws: number;
	losses: number;
	byes: number;
	points: number;
	/** strength of schedule: the sum of the current points of everyone this player met */
	opponentsPoints: number;
	/** objective value held minus objective value conceded, over all games */
	valueDiff: number;
	/** points from games among the players level with this one on the first three */
	headToHead: number;
}

interface Tally {
	id: string;
	name: string;
	played: number;
	wins: number;
	draws: number;
	losses: number;
	byes: number;
	points: number;
	valueDiff: number;
	opponents: string[];
}

export function computeStandings(
	players: readonly { id: string; name: string }[],
	results: readonly ResultIn[],
	scoring: Scoring = DEFAULT_SCORING
): StandingRow[] {
	const t = new Map<string, Tally>(
		players.map((p) => [p.id, { id: p.id, name: p.name, played: 0, wins: 0, draws: 0, losses: 0, byes: 0, points: 0, valueDiff: 0, opponents: [] }])
	);
	const side = (id: string) => t.get(id);
	for (const r of results) {
		const a = side(r.a);
		if (!a) continue;
		if (r.b === null) {
			a.byes++;
			a.points += scoring.bye;
			continue;
		}
		const b = side(r.b);
		if (!b) continue;
		a.played++;
		b.played++;
		a.opponents.push(b.id);
		b.opponents.push(a.id);
		a.valueDiff += r.valueA - r.valueB;
		b.valueDiff += r.valueB - r.valueA;
		if (r.outcome === 'draw') {
			a.draws++;
			b.draws++;
			a.points += scoring.draw;
			b.points += scoring.draw;
		} else {
			const [w, l] = r.outcome === 'a' ? [a, b] : [b, a];
			w.wins++;
			l.losses++;
			w.points += scoring.win;
			l.points += scoring.loss;
		}
	}

	const rows = [...t.values()].map((x) => ({
		...x,
		opponentsPoints: x.opponents.reduce((s, o) => s + (t.get(o)?.points ?? 0), 0),
		headToHead: 0
	}));

	// Head-to-head only means something inside a group level on the first three keys.
	const key3 = (r: (typeof rows)[number]) => `${r.points}|${r.opponentsPoints}|${r.valueDiff}`;
	const groups = new Map<string, typeof rows>();
	for (const r of rows) groups.set(key3(r), [...(groups.get(key3(r)) ?? []), r]);
	for (const group of groups.values()) {
		if (group.length < 2) continue;
		const inGroup = new Set(group.map((r) => r.id));
		for (const res of results) {
			if (res.b === null || !inGroup.has(res.a) || !inGroup.has(res.b)) continue;
			const a = group.find((r) => r.id === res.a)!;
			const b = group.find((r) => r.id === res.b)!;
			if (res.outcome === 'draw') {
				a.headToHead += scoring.draw;
				b.headToHead += scoring.draw;
			} else (res.outcome === 'a' ? a : b).headToHead += scoring.win;
		}
	}

	const cmp = (x: (typeof rows)[number], y: (typeof rows)[number]) =>
		y.points - x.points || y.opponentsPoints - x.opponentsPoints || y.valueDiff - x.valueDiff || y.headToHead - x.headToHead;
	rows.sort((x, y) => cmp(x, y) || x.name.localeCompare(y.name) || x.id.localeCompare(y.id));

	const out: StandingRow[] = [];
	rows.forEach((r, i) => {
		const rank = i > 0 && cmp(rows[i - 1], r) === 0 ? out[i - 1].rank : i + 1;
		out.push({
			rank,
			id: r.id,
			name: r.name,
			played: r.played,
			wins: r.wins,
			draws: r.draws,
			losses: r.losses,
			byes: r.byes,
			points: r.points,
			opponentsPoints: r.opponentsPoints,
			valueDiff: r.valueDiff,
			headToHead: r.headToHead
		});
	});
	return out;
}

/** What the pairing of the next round needs to know about each player, from the same results. */
export function swissHistory(
	playerIds: readonly string[],
	results: readonly { a: string; b: string | null; outcome: Outcome | null }[],
	scoring: Scoring = DEFAULT_SCORING
): { id: string; points: number; opponents: string[]; hadBye: boolean }[] {
	const h = new Map(playerIds.map((id) => [id, { id, points: 0, opponents: [] as string[], hadBye: false }]));
	for (const r of results) {
		const a = h.get(r.a);
		if (r.b === null) {
			if (a) {
				a.hadBye = true;
				a.points += scoring.bye;
			}
			continue;
		}
		const b = h.get(r.b);
		// A pairing counts as met even before its result is in: no rematch either way.
		a?.opponents.push(r.b);
		b?.opponents.push(r.a);
		if (r.outcome === null) continue;
		if (r.outcome === 'draw') {
			if (a) a.points += scoring.draw;
			if (b) b.points += scoring.draw;
		} else {
			const w = r.outcome === 'a' ? a : b;
			const l = r.outcome === 'a' ? b : a;
			if (w) w.points += scoring.win;
			if (l) l.points += scoring.loss;
		}
	}
	return [...h.values()];
}
