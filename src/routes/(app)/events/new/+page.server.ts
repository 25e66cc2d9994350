// A new event for a club: organisers of that club only (in load and in the action).
import { error, fail, redirect } from '@sveltejs/kit';
import { createEventSchema } from '$lib/schemas/event';
import { profileSchema } from '$lib/schemas/check';
import { requireUser } from '$lib/server/auth/roles';
import { clubs } from '$lib/server/db/clubs';
import { events } from '$lib/server/db/events';
import { layouts } from '$lib/server/db/layouts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	const clubId = Number(url.searchParams.get('club'));
	const club = Number.isInteger(clubId) && clubId > 0 ? await clubs.find(clubId) : null;
	if (!club) error(404, 'Choose the club the event belongs to');
	if ((await clubs.roleOf(club.id, user.id)) !== 'organiser') error(403, 'Only the club’s organisers create its events');
	const [members, saved] = await Promise.all([clubs.members(club.id), layouts.list(user.id)]);
	return {
		club,
		members: members.map((m) => ({ id: m.userId, name: m.displayName })),
		layouts: saved.map((l) => ({ id: l.id, name: l.name, ownerName: l.ownerName }))
	};
};

export const actions = {
	default: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = await request.formData().catch(() => null);
		if (!form) return fail(400, { message: 'The form could not be read' });
		const fields: Record<string, unknown> = {};
		for (const [k, v] of form) {
			if (typeof v !== 'string') continue;
			// Judges and layouts arrive as repeated checkboxes.
			if (k === 'judgeIds' || k === 'layoutIds') fields[k] = [...((fields[k] as string[] | undefined) ?? []), v];
			else fields[k] = v;
		}
		const parsed = createEventSchema.safeParse(fields);
		if (!parsed.success) {
			return fail(400, { message: parsed.error.issues[0].message, issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })), values: fields });
		}
		const e = parsed.data;
		if ((await clubs.roleOf(e.clubId, user.id)) !== 'organiser') return fail(403, { message: 'Only the club’s organisers create its events' });
		// Judges come from the club; layouts must exist.
		const memberIds = new Set((await clubs.members(e.clubId)).map((m) => m.userId));
		if (e.judgeIds.some((j) => !memberIds.has(j))) return fail(400, { message: 'Judges are chosen from the club’s members' });
		for (const l of e.layoutIds) if (!(await layouts.find(l))) return fail(400, { message: `There is no saved layout #${l}` });
		const id = await events.add({ ...e, profile: profileSchema.parse({}), createdBy: user.id });
		redirect(303, `/events/${id}`);
	}
} satisfies Actions;
