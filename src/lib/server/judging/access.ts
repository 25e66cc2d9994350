// Who may do what at the judge desk, for one game: its players see and ask; judges of its event
// and site judges (the global judge role) see, take and rule; organisers of its event's club
// see. Everyone else is refused. Every desk route and page asks here, on the server.
import type { User } from 'lucia';
import type { Side } from '$lib/schemas/game';
import { hasRole } from '$lib/server/auth/roles';
import { events } from '$lib/server/db/events';
import { gamePlayers } from '$lib/server/db/game-players';
import { games } from '$lib/server/db/games';
import { pairings } from '$lib/server/db/pairings';

export interface GameAccess {
	gameId: number;
	/** the sides the user plays (both on a shared tablet), empty for everyone else */
	sides: Side[];
	siteJudge: boolean;
	eventJudge: boolean;
	organiser: boolean;
	event: { eventId: number; round: number; table: number | null } | null;
}

export const isPlayer = (a: GameAccess) => a.sides.length > 0;
export const isJudge = (a: GameAccess) => a.siteJudge || a.eventJudge;
export const maySee = (a: GameAccess) => isPlayer(a) || isJudge(a) || a.organiser;

/** The user's standing in the game, or null when there is no such game. */
export async function accessTo(gameId: number, user: User): Promise<GameAccess | null> {
	const game = await games.find(gameId);
	if (!game) return null;
	const [sides, at] = await Promise.all([gamePlayers.sidesOf(gameId, user.id), pairings.forGame(gameId)]);
	let eventJudge = false;
	let organiser = false;
	if (at) {
		const event = await events.find(at.eventId);
		if (event) {
			const acc = await events.accessFor({ id: event.id, clubId: event.clubId }, user.id);
			eventJudge = acc.judge;
			organiser = acc.organiser;
		}
	}
	return { gameId, sides, siteJudge: hasRole(user, 'judge'), eventJudge, organiser, event: at };
}
