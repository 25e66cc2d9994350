// The session as JSON for scripts and the board's fetch helpers: who am I (GET), sign in
// (POST {email, password}, sets the cookie), sign out (DELETE).
import { json } from '@sveltejs/kit';
import { signInSchema } from '$lib/schemas/auth';
import { auth, clientAddress, startSession } from '$lib/server/auth';
import { checkCredentials, TOO_MANY, WRONG_CREDENTIALS } from '$lib/server/auth/sign-in';
import { guard, jsonError, parseJson } from '$lib/server/http';
import { users } from '$lib/server/db/users';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	return json({ user: { id: user.id, displayName: user.displayName, email: user.email, roles: user.roles } });
};

export const POST: RequestHandler = async (event) => {
	const body = await parseJson(event.request, signInSchema);
	if (!body.ok) return body.response;

	const result = await checkCredentials({ ...body.data, address: clientAddress(event) });
	if (result.kind === 'limited') {
		return jsonError(429, TOO_MANY, { headers: { 'retry-after': String(result.retryAfterSeconds) } });
	}
	if (result.kind === 'wrong') return jsonError(401, WRONG_CREDENTIALS);

	await startSession(event, result.userId);
	const user = await users.find(result.userId);
	const roles = await users.roles(result.userId);
	return json({ user: { id: result.userId, displayName: user?.displayName, email: user?.email, roles } });
};

export const DELETE: RequestHandler = async ({ locals, cookies }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	if (locals.session) await auth.invalidate(locals.session.id);
	auth.clearCookie(cookies);
	return new Response(null, { status: 204 });
};
