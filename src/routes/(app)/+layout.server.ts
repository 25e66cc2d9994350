// The signed-in part of the app: signed-out visitors go to sign-in and come back afterwards.
// This guards page loads only; actions and API routes below check the user themselves.
import { requireUser } from '$lib/server/auth/roles';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals, url }) => {
	const user = requireUser(locals, url);
	return { user: { id: user.id, displayName: user.displayName, email: user.email, roles: user.roles } };
};
