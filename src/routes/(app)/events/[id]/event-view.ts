// Everything the event page shows, assembled for one viewer: e-mail addresses and payment
// states only for the club's organisers; standings for everyone.
import { error } from '@sveltejs/kit';
import type { User } from 'lucia';
import { events, type EventRow, type EventAccess } from '$lib/server/db/events';
import { pairings, rounding, type Pairing } from '$lib/server/db/pairings';
import { results } from '$lib/server/db/results';

export async function eventFor(param: string, user: User): Promise<{ event: EventRow; access: EventAccess }> {
	const id = Number(param);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such event');
	const event = await events.find(id);
	if (!event) error(404, 'No such event');
	return { event, access: await events.accessFor(event, user.id) };
}

export const standingsOf = (eventId: number) => results.standings(eventId);

export async function roundsOf(eventId: number, organiser: boolean) {
	const [rs, all] = await Promise.all([pairings.rounds(eventId), pairings.forEvent(eventId)]);
	const byRound = new Map<number, Pairing[]>();
	for (const p of all) byRound.set(p.roundId, [...(byRound.get(p.roundId) ?? []), p]);
	return Promise.all(
		rs
			// A draft is the organiser's work in progress: players see pairings once published.
			.filter((r) => organiser || r.status === 'published')
			.map(async (r) => ({
				id: r.id,
				number: r.number,
				status: r.status,
				pairings: byRound.get(r.id) ?? [],
				problems: r.status === 'draft' ? await rounding.draftProblems(r.id) : []
			}))
	);
}
