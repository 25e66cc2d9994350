// Accepting a club invitation from its e-mailed link. The signed-in account must carry the
// address the invitation went to: a forwarded link does not make a stranger a member.
import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/roles';
import { hashToken, isResetTokenShape } from '$lib/server/auth/token';
import { clubs } from '$lib/server/db/clubs';
import type { Actions, PageServerLoad } from './$types';

async function invitation(token: string) {
	if (!isResetTokenShape(token)) error(404, 'This invitation link is not valid');
	const inv = await clubs.findInvitation(hashToken(token));
	if (!inv) error(404, 'This invitation link is not valid');
	return inv;
}

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const inv = await invitation(params.token);
	return {
		clubName: inv.clubName,
		invitedBy: inv.invitedBy,
		role: inv.role,
		usable: !inv.usedAt && inv.expiresAt > new Date(),
		forMe: inv.email.toLowerCase() === user.email.toLowerCase()
	};
};

export const actions = {
	accept: async ({ locals, params }) => {
		const user = requireUser(locals);
		const inv = await invitation(params.token);
		if (inv.email.toLowerCase() !== user.email.toLowerCase()) return fail(403, { message: 'This invitation was sent to another e-mail address' });
		const done = await clubs.acceptInvitation(hashToken(params.token), user.id);
		if (!done) return fail(409, { message: 'This invitation has been used or has expired; ask for a new one' });
		redirect(303, `/clubs/${done.clubId}`);
	}
} satisfies Actions;
