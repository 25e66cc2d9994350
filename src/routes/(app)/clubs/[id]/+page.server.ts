// A club's page: members (names for everyone in the club, e-mail addresses for organisers
// only), its events and recent games; organisers invite by e-mail and change roles.
import { fail } from '@sveltejs/kit';
import { inviteSchema, memberRoleSchema, removeMemberSchema } from '$lib/schemas/club';
import { requireUser } from '$lib/server/auth/roles';
import { generateResetToken, hashToken } from '$lib/server/auth/token';
import { clubs, LastOrganiserError } from '$lib/server/db/clubs';
import { events } from '$lib/server/db/events';
import { results } from '$lib/server/db/results';
import { formFields } from '$lib/server/http';
import { mail } from '$lib/server/mail';
import { clubFor } from './club-access';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/** A club invitation stays usable for two weeks: long enough for a monthly club night. */
const INVITATION_DAYS = 14;

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const { club, role } = await clubFor(params.id, user);
	const organiser = role === 'organiser';
	const [members, clubEvents, recent, invitations] = await Promise.all([
		clubs.members(club.id, { withEmail: organiser }),
		events.listForClub(club.id),
		results.recentGames(club.id),
		organiser ? clubs.openInvitations(club.id) : Promise.resolve([])
	]);
	return {
		club,
		role,
		meId: user.id,
		members: members.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() })),
		events: clubEvents,
		recent: recent.map((g) => ({ id: g.id, title: g.title, players: g.players, eventName: g.eventName, createdAt: g.createdAt.toISOString(), rulings: g.rulings })),
		invitations: invitations.map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString() }))
	};
};

async function organiserOnly(event: RequestEvent) {
	const user = requireUser(event.locals);
	const { club, role } = await clubFor(event.params.id, user);
	if (role !== 'organiser') return { user, club, refused: fail(403, { message: 'Only the club’s organisers may do this' }) };
	return { user, club, refused: null };
}

function origin(): string {
	return (process.env.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

export const actions = {
	invite: async (event) => {
		const { user, club, refused } = await organiserOnly(event);
		if (refused) return refused;
		const parsed = inviteSchema.safeParse((await formFields(event.request)) ?? {});
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		const token = generateResetToken();
		await clubs.addInvitation({
			tokenHash: hashToken(token),
			clubId: club.id,
			email: parsed.data.email,
			role: parsed.data.role,
			invitedBy: user.id,
			expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000)
		});
		const link = `${origin()}/clubs/join/${token}`;
		await mail.send({
			to: parsed.data.email,
			subject: `${user.displayName} invites you to ${club.name} on Inchwarden`,
			text:
				`Hello,\n\n${user.displayName} invites you to join ${club.name} as ${parsed.data.role === 'organiser' ? 'an organiser' : 'a member'}.\n\n` +
				`To join, open:\n\n${link}\n\nSign in, or create an account with this e-mail address, when asked. The link works once and expires in ${INVITATION_DAYS} days.\n`
		});
		return { message: `Invitation sent to ${parsed.data.email}` };
	},
	setRole: async (event) => {
		const { club, refused } = await organiserOnly(event);
		if (refused) return refused;
		const parsed = memberRoleSchema.safeParse((await formFields(event.request)) ?? {});
		if (!parsed.success) return fail(400, { message: 'Choose a member and a role' });
		try {
			if (!(await clubs.setRole(club.id, parsed.data.userId, parsed.data.role))) return fail(400, { message: 'That person is not a member' });
		} catch (e) {
			if (e instanceof LastOrganiserError) return fail(409, { message: 'The club needs at least one organiser: make someone else organiser first' });
			throw e;
		}
		return { message: 'Role changed' };
	},
	remove: async (event) => {
		const { club, refused } = await organiserOnly(event);
		if (refused) return refused;
		const parsed = removeMemberSchema.safeParse((await formFields(event.request)) ?? {});
		if (!parsed.success) return fail(400, { message: 'Choose a member' });
		try {
			if (!(await clubs.removeMember(club.id, parsed.data.userId))) return fail(400, { message: 'That person is not a member' });
		} catch (e) {
			if (e instanceof LastOrganiserError) return fail(409, { message: 'The club needs at least one organiser' });
			throw e;
		}
		return { message: 'Member removed' };
	}
} satisfies Actions;
