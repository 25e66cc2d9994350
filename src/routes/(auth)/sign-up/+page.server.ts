// Creating an account, then signing straight in.
import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, type FieldErrors, signUpSchema } from '$lib/schemas/auth';
import { signUp, DUPLICATE_EMAIL } from '$lib/server/auth/account';
import { startSession } from '$lib/server/auth';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

// One shape for every refusal, so the page reads `form` without narrowing.
type Answer = { message: string | null; values: { email: string; displayName: string }; errors: FieldErrors };
const refuse = (status: number, answer: Answer) => fail(status, answer);

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, '/dashboard');
};

export const actions = {
	default: async (event) => {
		const fields = await formFields(event.request);
		if (!fields) return refuse(400, { message: 'The form could not be read', values: { email: '', displayName: '' }, errors: {} });
		const values = { email: fields.email ?? '', displayName: fields.displayName ?? '' };

		const parsed = signUpSchema.safeParse(fields);
		if (!parsed.success) return refuse(400, { message: null, values, errors: fieldErrors(parsed.error) });

		const result = await signUp(parsed.data);
		if (!result.ok) return refuse(400, { message: null, values, errors: { email: DUPLICATE_EMAIL } });

		await startSession(event, result.userId);
		redirect(303, '/dashboard');
	}
} satisfies Actions;
