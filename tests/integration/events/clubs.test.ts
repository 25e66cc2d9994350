// Clubs over real HTTP: who sees what (stranger, member, organiser), who may manage, and
// invitations e-mailed through the fake SMTP server and accepted by the invited address only.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, freshEmail, testDb, waitForMail } from '../helpers';
import { clubWithOrganiser, createEvent, join, person, PASSWORD, type Person } from './setup';

afterAll(closeTestDb);

let clubId: number;
let organiser: Person;
let member: Person;
let stranger: Person;

beforeAll(async () => {
	({ clubId, organiser } = await clubWithOrganiser());
	member = await person('member');
	stranger = await person('stranger');
	await join(clubId, member);
});

describe('who sees a club', () => {
	it('sends the signed-out to sign in, refuses strangers, shows members names without addresses', async () => {
		const anon = await new Client().get(`/clubs/${clubId}`);
		expect(anon.status).toBe(303);
		expect(anon.headers.get('location')).toContain('/sign-in');
		expect((await stranger.client.get(`/clubs/${clubId}`)).status).toBe(403);

		const asMember = await (await member.client.get(`/clubs/${clubId}`)).text();
		expect(asMember).toContain(organiser.name);
		expect(asMember).toContain(member.name);
		expect(asMember).not.toContain(organiser.email);
		expect(asMember).not.toContain('data-testid="invite-form"');

		const asOrganiser = await (await organiser.client.get(`/clubs/${clubId}`)).text();
		expect(asOrganiser).toContain(member.email);
		expect(asOrganiser).toContain('data-testid="invite-form"');
	});

	it('keeps the archive, statistics and their CSV to members', async () => {
		expect((await stranger.client.get(`/clubs/${clubId}/archive`)).status).toBe(403);
		expect((await stranger.client.get(`/clubs/${clubId}/statistics`)).status).toBe(403);
		expect((await stranger.client.get(`/api/v1/clubs/${clubId}/statistics.csv`)).status).toBe(403);
		expect((await new Client().get(`/api/v1/clubs/${clubId}/statistics.csv`)).status).toBe(401);
		expect((await member.client.get(`/clubs/${clubId}/archive`)).status).toBe(200);
		const csv = await member.client.get(`/api/v1/clubs/${clubId}/statistics.csv`);
		expect(csv.status).toBe(200);
		expect(csv.headers.get('content-type')).toContain('text/csv');
		expect(await csv.text()).toBe('measure,subject,detail,count\r\n');
	});
});

describe('who manages a club', () => {
	it('refuses invitations, role changes and new events from members and strangers', async () => {
		for (const p of [member, stranger]) {
			const res = await p.client.post(`/clubs/${clubId}?/invite`, { email: freshEmail('x'), role: 'member' });
			expect(res.status).toBe(403);
			expect((await p.client.post(`/clubs/${clubId}?/setRole`, { userId: p.id, role: 'organiser' })).status).toBe(403);
			expect((await p.client.get(`/events/new?club=${clubId}`)).status).toBe(403);
		}
		expect((await testDb()('club_members').where({ club_id: clubId, user_id: member.id }).first()).role).toBe('member');
		expect(await testDb()('club_invitations').where({ club_id: clubId }).first()).toBeUndefined();
	});

	it('refuses founding a club without the organiser role', async () => {
		const res = await member.client.post('/clubs?/create', { name: `Nope ${Date.now()}`, town: '' });
		expect(res.status).toBe(403);
	});

	it('keeps at least one organiser', async () => {
		const res = await organiser.client.post(`/clubs/${clubId}?/setRole`, { userId: organiser.id, role: 'member' });
		expect(res.status).toBe(409);
	});

	it('refuses an event form with reasons', async () => {
		const res = await organiser.client.post(`/events/new?club=${clubId}`, { clubId: String(clubId), name: 'X', startsOn: 'soon', rounds: '0', capacity: '1', entryFee: '1.234' });
		expect(res.status).toBe(400);
		expect(await testDb()('events').where({ club_id: clubId }).first()).toBeUndefined();
	});

	it('lets the organiser manage events; members may not run them', async () => {
		const eventId = await createEvent(organiser, clubId);
		expect((await member.client.post(`/events/${eventId}?/pair`, {})).status).toBe(403);
		expect((await member.client.post(`/events/${eventId}?/closeRegistration`, {})).status).toBe(403);
		expect((await stranger.client.post(`/events/${eventId}?/finish`, {})).status).toBe(403);
		expect((await testDb()('events').where({ id: eventId }).first()).status).toBe('open');
	});
});

describe('invitations by e-mail', () => {
	it('e-mails a link that only the invited address can accept, once', async () => {
		const email = freshEmail('invitee');
		const res = await organiser.client.post(`/clubs/${clubId}?/invite`, { email, role: 'member' });
		expect(res.status).toBe(200);
		const [msg] = await waitForMail(email);
		expect(msg.subject).toContain('invites you to');
		const link = msg.text.match(/https?:\/\/\S+\/clubs\/join\/([a-z2-7]{52})/);
		expect(link).not.toBeNull();
		const path = `/clubs/join/${link![1]}`;

		// Someone else with the link is refused.
		expect((await stranger.client.post(`${path}?/accept`, {})).status).toBe(403);

		const invitee = new Client();
		expect((await invitee.signUp(email, PASSWORD, 'Invited Player')).status).toBe(303);
		if (!invitee.session()) await invitee.signIn(email, PASSWORD);
		expect(await (await invitee.get(path)).text()).toContain('Join the club');
		const accept = await invitee.post(`${path}?/accept`, {});
		expect(accept.status).toBe(303);
		expect(accept.headers.get('location')).toBe(`/clubs/${clubId}`);
		expect((await invitee.get(`/clubs/${clubId}`)).status).toBe(200);
		expect((await invitee.post(`${path}?/accept`, {})).status).toBe(409);
		const row = await testDb()('club_members as m').join('users as u', 'u.id', 'm.user_id').whereRaw('lower(u.email) = ?', [email]).andWhere('m.club_id', clubId).first('m.role');
		expect(row.role).toBe('member');
	});
});
