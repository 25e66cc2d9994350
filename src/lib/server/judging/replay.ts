// Everything a replay, a ruling desk or a turn report needs of one game, read once: the game's
// snapshot, its players (names only), the whole move log, its requests and rulings, and the
// server's own fold of the log compared with the state the game row holds.
import type { LogEntry, RulingRequestView } from '$lib/schemas/ruling';
import type { GameState, Side } from '$lib/schemas/game';
import type { Layout } from '$lib/schemas/layout';
import type { Profile } from '$lib/schemas/check';
import { disagreements, foldLog } from '$lib/board/replay/fold';
import { gamePlayers } from '$lib/server/db/game-players';
import { games } from '$lib/server/db/games';
import { moves } from '$lib/server/db/moves';
import { rulingRequests } from '$lib/server/db/ruling-requests';

export interface ReplayData {
	game: { id: number; title: string; seq: number; layout: Layout; profile: Profile; state: GameState };
	players: { side: Side; name: string | null }[];
	log: LogEntry[];
	requests: RulingRequestView[];
	/** where folding the log disagrees with the stored state (empty: they agree) */
	disagreements: string[];
	foldProblems: { seq: number; message: string }[];
}

export async function loadReplay(gameId: number): Promise<ReplayData | null> {
	const game = await games.find(gameId);
	if (!game) return null;
	const [players, log, requests] = await Promise.all([gamePlayers.forGame(gameId), moves.list(gameId), rulingRequests.forGame(gameId)]);
	const entries = log as LogEntry[];
	const fold = foldLog(entries, { layout: game.layout, profile: game.profile, firstSide: game.state.firstSide, catalogue: game.state.pieces });
	return {
		game: { id: game.id, title: game.title, seq: game.seq, layout: game.layout, profile: game.profile, state: game.state },
		players: players.map((p) => ({ side: p.side, name: p.displayName })),
		log: entries,
		requests,
		disagreements: disagreements(fold.final, game.state),
		foldProblems: fold.problems
	};
}
