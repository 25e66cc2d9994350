// Granting and revoking the judge, organiser and admin roles. Admins only, in load and in
// every action (a layout's check would not cover the actions).
import { fail } from '@sveltejs/kit';
import { roleChangeSchema } from '$lib/schemas/auth';
import { requireRole } from '$lib/server/auth/roles';
import { users } from '$lib/server/db/users';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const me = requireRole(locals, 'admin', url);
	const accounts = await users.list();
	return {
		meId: me.id,
		accounts: accounts.map((a) => ({
			id: a.id,
			email: a.email,
			displayName: a.displayName,
			roles: a.roles,
			createdAt: a.createdAt.toISOString()
		}))
	};
};

async function change(event: RequestEvent, kind: 'grant' | 'revoke') {
	const me = requireRole(event.locals, 'admin');
	const fields = await formFields(event.request);
	const parsed = roleChangeSchema.safeParse(fields ?? {});
	if (!parsed.success) return fail(400, { message: 'Choose an account and one of the roles' });
	const { userId, role } = parsed.data;

	const target = await users.find(userId);
	if (!target) return fail(400, { message: 'That account no longer exists' });
	// An admin removing their own admin role could leave nobody able to grant it back.
	if (kind === 'revoke' && role === 'admin' && userId === me.id) {
		return fail(400, { message: 'You cannot remove your own admin role; ask another admin' });
	}

	if (kind === 'grant') await users.grantRole(userId, role);
	else await users.revokeRole(userId, role);
	return {
		message: `${kind === 'grant' ? 'Granted' : 'Revoked'} ${role} ${kind === 'grant' ? 'to' : 'from'} ${target.displayName}`
	};
}

export const actions = {
	grant: (event) => change(event, 'grant'),
	revoke: (event) => change(event, 'revoke')
} satisfies Actions;
