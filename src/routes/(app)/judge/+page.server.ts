// The judge queue: requests of the events the user judges (site judges: all of them), newest
// first; taking one here sends the judge to its desk, and everyone else then sees it taken.
import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { hasRole, requireUser } from '$lib/server/auth/roles';
import { formFields } from '$lib/server/http';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { takeRequest } from '$lib/server/judging/rule';
import { notify } from '$lib/server/judging/notify';
import type { Actions, PageServerLoad } from './$types';
import type { User } from 'lucia';

async function judgeOrRefuse(user: User): Promise<{ site: boolean }> {
	const site = hasRole(user, 'judge');
	if (!site && !(await rulingRequests.judgesAnyEvent(user.id))) error(403, 'The judge desk is for judges');
	return { site };
}

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	const { site } = await judgeOrRefuse(user);
	// Opening mails a failed send left behind go out now.
	void notify.sendOpened().catch((e) => console.error('ruling request mail', e));
	return { requests: await rulingRequests.queue(site ? null : user.id), site };
};

const takeSchema = z.object({ id: z.coerce.number().int().positive().max(2 ** 31 - 1) });

export const actions: Actions = {
	take: async ({ locals, request }) => {
		const user = requireUser(locals);
		await judgeOrRefuse(user);
		const parsed = takeSchema.safeParse((await formFields(request)) ?? {});
		if (!parsed.success) return fail(400, { message: 'Choose a request to take', id: null });
		const a = await takeRequest(parsed.data.id, user);
		if (a.status !== 200) return fail(a.status, { message: (a.body as { error: { message: string } }).error.message, id: parsed.data.id });
		redirect(303, `/judge/${parsed.data.id}`);
	}
};
