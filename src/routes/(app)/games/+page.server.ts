// My games, and the form that sets a new one up (layout, opponent by e-mail or one tablet, my roster).
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/roles';
import { formFields } from '$lib/server/http';
import { games } from '$lib/server/db/games';
import { layouts } from '$lib/server/db/layouts';
import { rosters } from '$lib/server/db/rosters';
import { gameActions } from '$lib/server/db/game-actions';
import { createGameSchema } from '$lib/schemas/game';
import { demoLayout } from '$lib/board/demo-layout';
import { savedLayout } from '../../api/v1/games/saved-layout';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	const [mine, saved, myRosters] = await Promise.all([games.listForUser(user.id), layouts.list(user.id), rosters.listForOwner(user.id)]);
	return {
		games: mine.map((g) => ({ ...g, updatedAt: g.updatedAt.toISOString() })),
		layouts: saved.map((l) => ({ id: l.id, name: l.name, ownerName: l.ownerName })),
		rosters: myRosters.map((r) => ({ id: r.id, name: r.name, units: r.units }))
	};
};

const optionalId = z.preprocess((v) => (v === '' || v === undefined ? undefined : Number(v)), z.int().positive().optional());

export const actions = {
	create: async ({ locals, request }) => {
		const user = requireUser(locals);
		const f = await formFields(request);
		if (!f) return fail(400, { message: 'The form could not be read', values: {} as Record<string, string> });
		const layoutId = optionalId.safeParse(f.layout === 'demo' ? undefined : f.layout);
		const body = {
			title: f.title ?? '',
			...(f.layout === 'demo' || !layoutId.success || layoutId.data === undefined ? { layout: demoLayout() } : { layoutId: layoutId.data }),
			opponent: f.opponent === 'shared' ? { mode: 'shared' } : { mode: 'invite', email: f.email ?? '' },
			rosterA: optionalId.safeParse(f.rosterA).data,
			...(f.opponent === 'shared' ? { rosterB: optionalId.safeParse(f.rosterB).data } : {})
		};
		const parsed = createGameSchema.safeParse(body);
		if (!parsed.success) {
			return fail(400, { message: parsed.error.issues.map((i) => `${i.path.join('.') || 'form'}: ${i.message}`).join('; '), values: f });
		}
		const a = await gameActions.createGame(parsed.data, user, savedLayout);
		if (a.status !== 201) return fail(a.status, { message: (a.body as { error: { message: string } }).error.message, values: f });
		redirect(303, `/games/${(a.body as { id: number }).id}`);
	}
} satisfies Actions;
