// Saved layouts: everyone's, to edit one's own or reuse anyone's as a copy; delete one's own.
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { layoutIdSchema } from '$lib/schemas/layout';
import { requireUser } from '$lib/server/auth/roles';
import { formFields } from '$lib/server/http';
import { layouts } from '$lib/server/db/layouts';
import { copyName } from '$lib/board/editor/names';
import type { Actions, PageServerLoad } from './$types';

const idForm = z.object({ id: layoutIdSchema });

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	return { layouts: await layouts.list(user.id), me: user.id };
};

export const actions: Actions = {
	copy: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = idForm.safeParse(await formFields(request));
		if (!form.success) return fail(400, { message: 'Pick a layout to copy' });
		const source = await layouts.find(form.data.id);
		if (!source) return fail(404, { message: 'That layout no longer exists' });
		const copy = await layouts.add(user.id, { ...source.doc, name: copyName(source.doc.name) });
		redirect(303, `/layouts/${copy.id}/edit`);
	},
	remove: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = idForm.safeParse(await formFields(request));
		if (!form.success) return fail(400, { message: 'Pick a layout to delete' });
		const existing = await layouts.find(form.data.id);
		if (!existing) return fail(404, { message: 'That layout no longer exists' });
		if (existing.ownerId !== user.id) return fail(403, { message: 'Only the owner may delete a layout' });
		await layouts.remove(existing.id);
		return { message: `Deleted “${existing.name}”` };
	}
};
