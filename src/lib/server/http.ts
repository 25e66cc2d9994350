// Small helpers for JSON API routes: one error shape ({ error: { message, issues? } }), body
// parsing that turns bad input into a 400 instead of an exception, and role guards that
// return the refusal as a value so handlers read as a ladder of early returns.
import { json } from '@sveltejs/kit';
import type { User } from 'lucia';
import type { z } from 'zod';
import type { Role } from '$lib/schemas/auth';
import { hasRole } from '$lib/server/auth/roles';

export function jsonError(
	status: number,
	message: string,
	extra?: { issues?: unknown[]; headers?: Record<string, string> }
): Response {
	const body: { error: { message: string; issues?: unknown[] } } = { error: { message } };
	if (extra?.issues) body.error.issues = extra.issues;
	return json(body, { status, headers: extra?.headers });
}

export const unauthorized = (): Response => jsonError(401, 'Sign in first');
export const forbidden = (): Response => jsonError(403, 'You do not have the role this needs');

/** The user, or the 401/403 Response to return. */
export function guard(locals: App.Locals, role?: Role): User | Response {
	if (!locals.user) return unauthorized();
	if (role && !hasRole(locals.user, role)) return forbidden();
	return locals.user;
}

/** The parsed body, or the 400 Response to return (malformed JSON and schema misses alike). */
export async function parseJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ ok: true; data: z.infer<S> } | { ok: false; response: Response }> {
	let raw: unknown;
	try {
		raw = await request.json();
	} catch (err) {
		// The server's body limit surfaces here as an error carrying status 413.
		if ((err as { status?: number } | null)?.status === 413) {
			return { ok: false, response: jsonError(413, 'The request body is too large') };
		}
		return { ok: false, response: jsonError(400, 'The request body is not valid JSON') };
	}
	if (hasUnstorableText(raw)) {
		// PostgreSQL text and jsonb cannot hold U+0000 or a lone surrogate: refuse them here
		// rather than fail in the database.
		return {
			ok: false,
			response: jsonError(400, 'The request body contains a NUL character (\\u0000) or a lone surrogate, which no field accepts')
		};
	}
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		return {
			ok: false,
			response: jsonError(400, 'The request body does not match the schema', {
				issues: parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }))
			})
		};
	}
	return { ok: true, data: parsed.data };
}

/** Form fields as plain strings (files and repeats dropped) for zod to parse. */
export async function formFields(request: Request): Promise<Record<string, string> | null> {
	try {
		const data = await request.formData();
		const out: Record<string, string> = {};
		for (const [k, v] of data) if (typeof v === 'string' && !(k in out)) out[k] = v;
		return out;
	} catch {
		return null;
	}
}

/** Whether a string cannot be stored as PostgreSQL text: it holds U+0000 or is not well-formed UTF-16. */
function unstorable(s: string): boolean {
	return s.includes('\u0000') || !s.isWellFormed();
}

/** Whether any string (or key) in a parsed JSON value cannot be stored. Iterative: deep nesting cannot overflow the stack. */
export function hasUnstorableText(value: unknown): boolean {
	const stack: unknown[] = [value];
	while (stack.length > 0) {
		const v = stack.pop();
		if (typeof v === 'string') {
			if (unstorable(v)) return true;
		} else if (Array.isArray(v)) {
			for (const x of v) stack.push(x);
		} else if (v !== null && typeof v === 'object') {
			for (const [k, x] of Object.entries(v)) {
				if (unstorable(k)) return true;
				stack.push(x);
			}
		}
	}
	return false;
}
