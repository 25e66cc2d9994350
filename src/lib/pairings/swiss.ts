// Swiss pairings for one round, by the `tournament-pairings` package (weighted blossom matching:
// equal scores preferred, prior opponents excluded, a bye for an odd count to a low-scored player
// without one). This wrapper feeds it our players, then checks the two hard rules it only weighs
// (no rematch, no second bye) and retries its random tie-breaking before giving up.
import { Swiss } from 'tournament-pairings';

export interface SwissPlayer {
	id: string;
	points: number;
	/** everyone this player has met in earlier rounds (byes excluded) */
	opponents: readonly string[];
	hadBye: boolean;
}

/** One pairing; `b` is null for the bye. */
export interface Pair {
	a: string;
	b: string | null;
}

export class PairingError extends Error {}

/** The package shuffles before matching; a few reruns find a valid matching where one exists. */
const ATTEMPTS = 25;

/** Broken hard rules of a proposed round, in words; empty when the round is fine. */
export function pairingProblems(players: readonly SwissPlayer[], pairs: readonly Pair[], name: (id: string) => string = (id) => id): string[] {
	const byId = new Map(players.map((p) => [p.id, p]));
	const problems: string[] = [];
	const seen = new Set<string>();
	for (const { a, b } of pairs) {
		for (const id of b === null ? [a] : [a, b]) {
			if (!byId.has(id)) problems.push(`${name(id)} is not in the event`);
			if (seen.has(id)) problems.push(`${name(id)} is paired twice`);
			seen.add(id);
		}
		if (b !== null && a === b) problems.push(`${name(a)} is paired with themselves`);
		if (b !== null && (byId.get(a)?.opponents.includes(b) || byId.get(b)?.opponents.includes(a))) {
			problems.push(`${name(a)} and ${name(b)} have met before`);
		}
	}
	for (const p of players) if (!seen.has(p.id)) problems.push(`${name(p.id)} is not paired`);
	const byes = pairs.filter((p) => p.b === null);
	if (byes.length > (players.length % 2)) problems.push('more byes than an odd count needs');
	for (const bye of byes) {
		// A second bye is only acceptable when everyone has had one already.
		if (byId.get(bye.a)?.hadBye && players.some((p) => !p.hadBye)) problems.push(`${name(bye.a)} would have a second bye`);
	}
	return problems;
}

/** Pairs for the next round, higher-scored pairs first; throws PairingError when none is valid. */
export function pairRound(players: readonly SwissPlayer[], round: number): Pair[] {
	const r = tryPairRound(players, round);
	if (r.problems.length) throw new PairingError(`no valid pairing found: ${r.problems.join('; ')}`);
	return r.pairs;
}

/**
 * The package's best pairing and its problems. When no valid pairing turns up, the last attempt
 * (or, if the package found none, the players in score order) is returned with its problems,
 * so the organiser can mend it by hand instead of being stuck.
 */
export function tryPairRound(players: readonly SwissPlayer[], round: number): { pairs: Pair[]; problems: string[] } {
	if (players.length < 2) throw new PairingError('at least two players are needed to pair a round');
	const ids = new Set(players.map((p) => p.id));
	// The package only consults the avoid list of the first player of each candidate pair, so
	// the list must be symmetric; opponents who left the event need not be listed.
	const avoid = new Map(players.map((p) => [p.id, new Set<string>()]));
	for (const p of players) {
		for (const o of p.opponents) {
			if (!ids.has(o)) continue;
			avoid.get(p.id)!.add(o);
			avoid.get(o)!.add(p.id);
		}
	}
	let best: { pairs: Pair[]; problems: string[] } | null = null;
	for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
		let matches: ReturnType<typeof Swiss>;
		try {
			matches = Swiss(
				players.map((p) => ({ id: p.id, score: p.points, receivedBye: p.hadBye, avoid: [...avoid.get(p.id)!] })),
				round
			);
		} catch {
			// The package throws when no two players may meet at all (its matching is empty).
			continue;
		}
		const pairs: Pair[] = matches.map((m) => ({
			a: String(m.player1),
			b: m.player2 === null || m.player2 === undefined ? null : String(m.player2)
		}));
		const problems = pairingProblems(players, pairs);
		if (problems.length === 0) return { pairs: orderPairs(players, pairs), problems };
		if (!best || problems.length < best.problems.length) best = { pairs, problems };
	}
	if (!best) {
		const byScore = [...players].sort((x, y) => y.points - x.points || x.id.localeCompare(y.id));
		const pairs: Pair[] = [];
		for (let i = 0; i < byScore.length; i += 2) pairs.push({ a: byScore[i].id, b: byScore[i + 1]?.id ?? null });
		best = { pairs, problems: pairingProblems(players, pairs) };
	}
	return { pairs: orderPairs(players, best.pairs), problems: best.problems };
}

/** Top pairs (most points together) first, the bye last; within a pair the higher score first. */
export function orderPairs(players: readonly SwissPlayer[], pairs: readonly Pair[]): Pair[] {
	const pts = new Map(players.map((p) => [p.id, p.points]));
	const score = (id: string | null) => (id === null ? 0 : (pts.get(id) ?? 0));
	return pairs
		.map((p) => (p.b !== null && score(p.b) > score(p.a) ? { a: p.b, b: p.a } : { ...p }))
		.sort((x, y) => {
			if ((x.b === null) !== (y.b === null)) return x.b === null ? 1 : -1;
			return score(y.a) + score(y.b) - (score(x.a) + score(x.b)) || x.a.localeCompare(y.a);
		});
}

/** Swap two players between pairings (the organiser's hand adjustment before publishing). */
export function swapPlayers(pairs: readonly Pair[], first: string, second: string): Pair[] {
	if (first === second) return pairs.map((p) => ({ ...p }));
	const put = (id: string | null) => (id === first ? second : id === second ? first : id);
	return pairs.map((p) => ({ a: put(p.a)!, b: put(p.b) }));
}
