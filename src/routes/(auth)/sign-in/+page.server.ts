// Signing in: the same generic answer for an unknown e-mail and a wrong password, 429 past
// the per-account or per-address limit, and a fresh session id on every success.
import { fail, redirect } from '@sveltejs/kit';
import { fieldErrors, type FieldErrors, signInSchema } from '$lib/schemas/auth';
import { checkCredentials, TOO_MANY, WRONG_CREDENTIALS } from '$lib/server/auth/sign-in';
import { clientAddress, startSession } from '$lib/server/auth';
import { safeNext } from '$lib/server/auth/roles';
import { formFields } from '$lib/server/http';
import type { Actions, PageServerLoad } from './$types';

// One shape for every refusal, so the page reads `form` without narrowing.
type Answer = { message: string | null; email: string; errors: FieldErrors };
const refuse = (status: number, answer: Answer) => fail(status, answer);

export const load: PageServerLoad = ({ locals, url }) => {
	const next = safeNext(url.searchParams.get('next'));
	if (locals.user) redirect(303, next);
	return {
		next,
		reset: url.searchParams.has('reset'),
		signedOut: url.searchParams.has('signed-out')
	};
};

export const actions = {
	default: async (event) => {
		const fields = await formFields(event.request);
		if (!fields) return refuse(400, { message: 'The form could not be read', email: '', errors: {} });
		const email = fields.email ?? '';

		const parsed = signInSchema.safeParse(fields);
		if (!parsed.success) return refuse(400, { message: null, email, errors: fieldErrors(parsed.error) });

		const result = await checkCredentials({ ...parsed.data, address: clientAddress(event) });
		if (result.kind === 'limited') {
			event.setHeaders({ 'retry-after': String(result.retryAfterSeconds) });
			return refuse(429, { message: TOO_MANY, email, errors: {} });
		}
		if (result.kind === 'wrong') return refuse(400, { message: WRONG_CREDENTIALS, email, errors: {} });

		await startSession(event, result.userId);
		redirect(303, safeNext(fields.next ?? event.url.searchParams.get('next')));
	}
} satisfies Actions;
