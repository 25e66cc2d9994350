// Choosing a new password from an e-mailed link; the link is spent, and every session of
// the account ends.
import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, type FieldErrors, resetPasswordSchema } from '$lib/schemas/auth';
import { isUsable, resetPassword } from '$lib/server/auth/password-reset';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

// One shape for every refusal, so the page reads `form` without narrowing.
type Answer = { message: string | null; errors: FieldErrors };
const refuse = (status: number, answer: Answer) => fail(status, answer);

const LINK_SPENT = 'This reset link has expired or was already used. Ask for a new one.';

export const load: PageServerLoad = async ({ params }) => ({ usable: await isUsable(params.token) });

export const actions = {
	default: async ({ request, params }) => {
		const fields = await formFields(request);
		const parsed = resetPasswordSchema.safeParse(fields ?? {});
		if (!parsed.success) return refuse(400, { message: null, errors: fieldErrors(parsed.error) });
		if (!(await resetPassword(params.token, parsed.data.password))) {
			return refuse(400, { message: LINK_SPENT, errors: {} });
		}
		redirect(303, '/sign-in?reset');
	}
} satisfies Actions;
