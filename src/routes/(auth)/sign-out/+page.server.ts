// Signing out this browser, or every browser the account is signed in on.
import { redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/sign-in');
	return { displayName: locals.user.displayName };
};

// One default action with a `scope` field rather than two named actions, so a plain
// <form method="POST" action="/sign-out"> anywhere in the app (the nav) works.
export const actions = {
	default: async ({ request, locals, cookies }) => {
		const fields = await formFields(request);
		if (locals.session && locals.user) {
			if (fields?.scope === 'everywhere') await auth.invalidateAll(locals.user.id);
			else await auth.invalidate(locals.session.id);
		}
		auth.clearCookie(cookies);
		redirect(303, '/sign-in?signed-out');
	}
} satisfies Actions;
