// /admin itself has nothing of its own: admins land on the roles page.
import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	requireRole(locals, 'admin', url);
	redirect(303, '/admin/roles');
};
