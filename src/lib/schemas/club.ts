// Club forms and roles (create a club, invite by e-mail, change a member's role), shared by the
// club pages and the server, where the parse result is the only one trusted.
import { z } from 'zod';
import { PG_INT_MAX } from './limits';

export const CLUB_ROLES = ['member', 'organiser'] as const;
export const clubRoleSchema = z.enum(CLUB_ROLES);
export type ClubRole = z.output<typeof clubRoleSchema>;

export const createClubSchema = z.object({
	name: z.string({ error: 'Give the club a name' }).trim().min(2, 'Give the club a name of 2 characters or more').max(100, 'At most 100 characters'),
	town: z.string().trim().max(100, 'At most 100 characters').default('')
});

export const inviteSchema = z.object({
	email: z
		.string({ error: 'Enter an e-mail address' })
		.trim()
		.toLowerCase()
		.min(1, 'Enter an e-mail address')
		.max(254, 'That e-mail address is too long')
		.pipe(z.email({ error: 'Enter a valid e-mail address' })),
	role: clubRoleSchema.default('member')
});

export const memberRoleSchema = z.object({
	userId: z.string().min(1).max(100),
	role: clubRoleSchema
});

export const removeMemberSchema = z.object({ userId: z.string().min(1).max(100) });

/** Archive filters, from the query string; every one optional. */
export const archiveFilterSchema = z.object({
	player: z.string().max(100).optional().catch(undefined),
	event: z.coerce.number().int().positive().lte(PG_INT_MAX).optional().catch(undefined),
	from: z.iso.date().optional().catch(undefined),
	to: z.iso.date().optional().catch(undefined),
	profile: z.string().max(100).optional().catch(undefined),
	rulings: z.enum(['yes', 'no']).optional().catch(undefined)
});
export type ArchiveFilter = z.output<typeof archiveFilterSchema>;
