// Asking for a reset link. The answer never says whether the account exists.
import { fail } from '@sveltejs/kit';
import { fieldErrors, type FieldErrors, forgotPasswordSchema } from '$lib/schemas/auth';
import { requestReset, RESET_TOKEN_MINUTES } from '$lib/server/auth/password-reset';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

// One shape for every answer, so the page reads `form` without narrowing.
type Answer = { sent: boolean; email: string; errors: FieldErrors };
const refuse = (status: number, answer: Answer) => fail(status, answer);

export const load: PageServerLoad = () => ({ minutes: RESET_TOKEN_MINUTES });

export const actions = {
	default: async ({ request }) => {
		const fields = await formFields(request);
		const parsed = forgotPasswordSchema.safeParse(fields ?? {});
		if (!parsed.success) return refuse(400, { sent: false, email: fields?.email ?? '', errors: fieldErrors(parsed.error) });
		requestReset(parsed.data.email);
		const sent: Answer = { sent: true, email: parsed.data.email, errors: {} };
		return sent;
	}
} satisfies Actions;
