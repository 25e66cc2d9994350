// The clubs I belong to, and founding a new one (organisers and admins of the site).
import { fail, redirect } from '@sveltejs/kit';
import { createClubSchema } from '$lib/schemas/club';
import { hasRole, requireUser } from '$lib/server/auth/roles';
import { clubs, DuplicateClubError } from '$lib/server/db/clubs';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

const mayFound = (user: App.Locals['user']) => hasRole(user, 'organiser') || hasRole(user, 'admin');

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	return { clubs: await clubs.listForUser(user.id), mayFound: mayFound(user) };
};

export const actions = {
	create: async ({ locals, request }) => {
		const user = requireUser(locals);
		if (!mayFound(user)) return fail(403, { message: 'Only organisers found clubs; ask an admin for the organiser role' });
		const parsed = createClubSchema.safeParse((await formFields(request)) ?? {});
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message, issues: parsed.error.issues.map((i) => i.message) });
		let id: number;
		try {
			id = (await clubs.add({ ...parsed.data, createdBy: user.id })).id;
		} catch (e) {
			if (e instanceof DuplicateClubError) return fail(409, { message: 'A club with this name exists already' });
			throw e;
		}
		redirect(303, `/clubs/${id}`);
	}
} satisfies Actions;
