// The engine's request for a move on the game's table, and the live check's table: apart from
// rules.ts (which re-exports both) so that the play page can build them without the check itself
// in its own JavaScript; the check runs in the worker (live-check.ts).
import type { CheckRequest, Profile } from '../../schemas/check';
import { layoutToBoard, type Layout } from '../../schemas/layout';
import type { GamePiece, ProposeMove } from '../../schemas/game';
import { enginePieces } from './pieces';

/** The engine's request for a proposed move on the current table. */
export function checkRequestFor(layout: Layout, profile: Profile, pieces: readonly GamePiece[], move: { unit: string; kind: ProposeMove['kind']; die?: number; paths?: ProposeMove['paths'] }): CheckRequest {
	return {
		profile,
		board: layoutToBoard(layout),
		pieces: enginePieces(pieces),
		move: { unit: move.unit, kind: move.kind, die: move.die, paths: move.paths }
	};
}

/**
 * The table of the browser's live check (advice only; the server checks the whole request):
 * the check's table without support rings. In the check, rings only feed the summary of which
 * units each ring covers, no finding, cost or verdict depends on them, and the play screen shows
 * that summary from the server's report; on a table with many ring sources it was most of the
 * check's time on every drag frame.
 */
export function liveCheckTable(layout: Layout, profile: Profile, pieces: readonly GamePiece[]): Omit<CheckRequest, 'move'> {
	const { profile: prof, board, pieces: enginePieces } = checkRequestFor(layout, profile, pieces, { unit: '', kind: 'hold' });
	return { profile: prof, board, pieces: enginePieces.map((p) => (p.ring ? { ...p, ring: undefined } : p)) };
}
