// Account forms and role names, shared by the browser (hints, the roles page) and the server
// (the only place the parse result is trusted).
import { z } from 'zod';

/** Roles an admin can grant. Every account is also implicitly a player. */
export const GRANTABLE_ROLES = ['judge', 'organiser', 'admin'] as const;
export type GrantableRole = (typeof GRANTABLE_ROLES)[number];
export type Role = 'player' | GrantableRole;

const ROLE_ORDER: readonly Role[] = ['player', 'judge', 'organiser', 'admin'];
/** Granted roles plus the implicit 'player', in a fixed order; unknown names are dropped. */
export function withPlayer(granted: readonly string[]): Role[] {
	const set = new Set<string>(['player', ...granted]);
	return ROLE_ORDER.filter((r) => set.has(r));
}

export const PASSWORD_MIN_LENGTH = 10;
// argon2 accepts any length, but an unbounded input lets one request burn CPU and memory.
export const PASSWORD_MAX_LENGTH = 256;

const email = z
	.string({ error: 'Enter your e-mail address' })
	.trim()
	.min(1, 'Enter your e-mail address')
	.max(254, 'That e-mail address is too long')
	.pipe(z.email({ error: 'Enter a valid e-mail address' }));

const newPassword = z
	.string({ error: 'Choose a password' })
	.min(PASSWORD_MIN_LENGTH, `The password needs at least ${PASSWORD_MIN_LENGTH} characters`)
	.max(PASSWORD_MAX_LENGTH, `The password may have at most ${PASSWORD_MAX_LENGTH} characters`);

export const signUpSchema = z.object({
	email,
	displayName: z
		.string({ error: 'Choose a display name' })
		.trim()
		.min(1, 'Choose a display name')
		.max(60, 'The display name may have at most 60 characters'),
	password: newPassword
});
export type SignUpInput = z.infer<typeof signUpSchema>;

// Sign-in checks only the shape: the length rule belongs to choosing a password, and telling
// someone "too short" on sign-in would leak nothing useful but confuse older accounts.
export const signInSchema = z.object({
	email,
	password: z
		.string({ error: 'Enter your password' })
		.min(1, 'Enter your password')
		.max(PASSWORD_MAX_LENGTH, 'E-mail or password is wrong')
});
export type SignInInput = z.infer<typeof signInSchema>;

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z
	.object({ password: newPassword, confirm: z.string({ error: 'Repeat the password' }) })
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ'
	});

export const roleChangeSchema = z.object({
	userId: z.string().min(1).max(64),
	role: z.enum(GRANTABLE_ROLES, { error: 'Unknown role' })
});

/** First message per field, the shape the auth forms display. */
export type FieldErrors = { [field: string]: string | undefined };
export function fieldErrors(error: z.ZodError): FieldErrors {
	const out: FieldErrors = {};
	for (const issue of error.issues) {
		const key = String(issue.path[0] ?? 'form');
		out[key] ??= issue.message;
	}
	return out;
}
