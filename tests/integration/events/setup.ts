// Shared arrangements for the events integration tests: fresh players (signed up over HTTP),
// a club with an organiser, rosters, events created through the organiser's form.
import { expect } from 'vitest';
import { BASE, Client, freshEmail, testDb } from '../helpers';

export const PASSWORD = 'long enough password';
export const FAKE_PAY = (process.env.STRIPE_API_BASE ?? 'http://127.0.0.1:12111').replace(/\/+$/, '');

export interface Person {
	client: Client;
	id: string;
	email: string;
	name: string;
}

export async function person(tag: string): Promise<Person> {
	const email = freshEmail(tag);
	const name = `${tag[0].toUpperCase()}${tag.slice(1)} ${Math.random().toString(36).slice(2, 6)}`;
	const client = new Client();
	const res = await client.signUp(email, PASSWORD, name);
	expect(res.status).toBe(303);
	if (!client.session()) await client.signIn(email, PASSWORD);
	expect(client.session()).toBeTruthy();
	const row = await testDb()('users').whereRaw('lower(email) = ?', [email.toLowerCase()]).first('id');
	return { client, id: row.id, email, name };
}

/** A roster for a player (the roster editor is another feature; its table is enough here). */
export async function rosterFor(p: Person): Promise<number> {
	const [r] = await testDb()('rosters').insert({ owner_id: p.id, name: `${p.name}'s list`, force: 'Test force', units: '[]' }).returning('id');
	return r.id;
}

/** A club whose organiser founded it through the clubs page (needs the site's organiser role). */
export async function clubWithOrganiser(): Promise<{ clubId: number; organiser: Person }> {
	const organiser = await person('organiser');
	await testDb()('user_roles').insert({ user_id: organiser.id, role: 'organiser' });
	const name = `Test Club ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
	const res = await organiser.client.post('/clubs?/create', { name, town: 'Testby' });
	expect(res.status).toBe(303);
	const clubId = Number(res.headers.get('location')!.split('/').pop());
	expect(clubId).toBeGreaterThan(0);
	return { clubId, organiser };
}

export async function join(clubId: number, p: Person, role: 'member' | 'organiser' = 'member'): Promise<void> {
	await testDb()('club_members').insert({ club_id: clubId, user_id: p.id, role });
}

export async function createEvent(organiser: Person, clubId: number, fields: Record<string, string> = {}): Promise<number> {
	const res = await organiser.client.post(`/events/new?club=${clubId}`, {
		clubId: String(clubId),
		name: `Test Event ${Math.random().toString(36).slice(2, 8)}`,
		kind: 'one-day',
		startsOn: '2026-12-12',
		venue: 'The Old Hall',
		profileName: 'Table Standard',
		rounds: '3',
		capacity: '8',
		entryFee: '0',
		currency: 'eur',
		...fields
	});
	expect(res.status, await res.clone().text().then((t) => t.slice(0, 300))).toBe(303);
	return Number(res.headers.get('location')!.split('/').pop());
}

/** Enters a player in a free event through the event page's form. */
export async function enterFree(eventId: number, p: Person): Promise<void> {
	const rosterId = await rosterFor(p);
	const res = await p.client.post(`/events/${eventId}?/register`, { rosterId: String(rosterId) });
	expect(res.status).toBe(200);
}

export { BASE };
