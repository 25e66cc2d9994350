// The move log page's data, shared by the page and its JSON download: who may read it (the game's
// players, its event's judges, site judges, its event's organisers — the replay's rule) and every
// entry as a row in words.
import { z } from 'zod';
import type { User } from 'lucia';
import { logRows, type LogRow } from '$lib/board/play/log-words';
import { accessTo, maySee } from '$lib/server/judging/access';
import { games } from '$lib/server/db/games';
import { moves } from '$lib/server/db/moves';

const idSchema = z.coerce.number().int().positive().max(2 ** 31 - 1);

export interface GameLog {
	game: { id: number; title: string; seq: number; round: number };
	rows: LogRow[];
}

export type LogAnswer = { ok: true; log: GameLog; player: boolean } | { ok: false; status: 403 | 404; message: string };

export async function loadLog(rawId: string, user: User): Promise<LogAnswer> {
	const id = idSchema.safeParse(rawId);
	if (!id.success) return { ok: false, status: 404, message: 'No such game' };
	const access = await accessTo(id.data, user);
	if (!access) return { ok: false, status: 404, message: 'No such game' };
	if (!maySee(access)) return { ok: false, status: 403, message: 'Only the players, judges and organisers of this game may read its move log' };
	const [game, entries] = await Promise.all([games.find(id.data), moves.list(id.data)]);
	if (!game) return { ok: false, status: 404, message: 'No such game' };
	return {
		ok: true,
		player: access.sides.length > 0,
		log: { game: { id: game.id, title: game.title, seq: game.seq, round: game.state.round }, rows: logRows(entries, game.state.pieces) }
	};
}
