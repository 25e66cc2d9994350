// Editing a saved layout: its owner only (others may use a copy from the list).
import { error } from '@sveltejs/kit';
import { layoutIdSchema, layoutSchema } from '$lib/schemas/layout';
import { requireUser } from '$lib/server/auth/roles';
import { layouts } from '$lib/server/db/layouts';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const user = requireUser(locals, url);
	const id = layoutIdSchema.safeParse(params.id);
	if (!id.success) error(404, 'No such layout');
	const saved = await layouts.find(id.data);
	if (!saved) error(404, 'No such layout');
	if (saved.ownerId !== user.id) error(403, 'Only the layout’s owner may edit it; use a copy from the layouts list');
	// parse on the way out too: a stored document is filled with today's defaults
	const doc = layoutSchema.parse(saved.doc);
	return { layout: { id: saved.id, version: saved.version, doc } };
};
