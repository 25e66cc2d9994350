// One roster in the editor, owner only: load it, save a whole new version (the shared schema
// decides, the browser's own check is only a hint), or delete it.
import { error, fail, redirect } from '@sveltejs/kit';
import { issueList, rosterSchema } from '$lib/schemas/roster';
import { rosters } from '$lib/server/db/rosters';
import { requireUser } from '$lib/server/auth/roles';
import { ownRoster, rosterView } from '$lib/server/storage/rosters';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireUser(locals, url);
	const own = await ownRoster(user.id, params.id);
	if (!own.ok) error(own.status, own.message);
	const imported = Number(url.searchParams.get('imported'));
	const skipped = Number(url.searchParams.get('skipped'));
	return {
		roster: rosterView(own.roster),
		notice: Number.isInteger(imported) && url.searchParams.has('imported')
			? { imported, skipped: Number.isInteger(skipped) ? skipped : 0 }
			: null
	};
};

export const actions: Actions = {
	save: async ({ locals, params, request }) => {
		const user = requireUser(locals);
		const own = await ownRoster(user.id, params.id);
		if (!own.ok) return fail(own.status, { message: own.message, issues: [] });
		const form = await request.formData().catch(() => null);
		const raw = form?.get('roster');
		let body: unknown;
		try {
			body = typeof raw === 'string' ? JSON.parse(raw) : undefined;
		} catch {
			body = undefined;
		}
		if (body === undefined) return fail(400, { message: 'The roster could not be read', issues: [] });
		const parsed = rosterSchema.safeParse(body);
		if (!parsed.success) return fail(400, { message: 'The roster was not saved: fix the problems marked', issues: issueList(parsed.error) });
		const saved = await rosters.update(own.roster.id, parsed.data);
		if (!saved) return fail(404, { message: 'No such roster', issues: [] });
		return { saved: true, updatedAt: saved.updatedAt };
	},

	delete: async ({ locals, params }) => {
		const user = requireUser(locals);
		const own = await ownRoster(user.id, params.id);
		if (!own.ok) return fail(own.status, { message: own.message, issues: [] });
		await rosters.remove(own.roster.id);
		redirect(303, '/rosters');
	}
};
