// Clubs, their members (with the role inside the club) and e-mail invitations to join.
// Member e-mail addresses leave this module only in `members(…, { withEmail: true })`, which
// the routes call for organisers alone.
import type { ClubRole } from '$lib/schemas/club';
import { db, use, type Db } from './index';

export interface ClubSummary {
	id: number;
	name: string;
	town: string;
	role: 'member' | 'organiser';
	members: number;
}

export interface Club {
	id: number;
	name: string;
	town: string;
	createdAt: Date;
}

export interface Member {
	userId: string;
	displayName: string;
	role: ClubRole;
	joinedAt: Date;
	/** only when asked for with `withEmail` (organisers) */
	email?: string;
}

export class DuplicateClubError extends Error {
	constructor() {
		super('a club with this name already exists');
	}
}

/** The clubs a user belongs to, with the user's role in each and the member count. */
export async function listForUser(userId: string, trx?: Db): Promise<ClubSummary[]> {
	const rows = await use(trx)('clubs as c')
		.join('club_members as m', 'm.club_id', 'c.id')
		.where('m.user_id', userId)
		.select(
			'c.id',
			'c.name',
			'c.town',
			'm.role',
			use(trx).raw('(select count(*) from club_members cm where cm.club_id = c.id)::int as members')
		)
		.orderBy('c.name');
	return rows as ClubSummary[];
}

export async function find(id: number, trx?: Db): Promise<Club | null> {
	const row = await use(trx)('clubs').select('id', 'name', 'town', 'created_at as createdAt').where({ id }).first();
	return (row as Club | undefined) ?? null;
}

/** A new club with its creator as its first organiser, in one transaction. */
export async function add(input: { name: string; town: string; createdBy: string }, trx?: Db): Promise<Club> {
	const run = async (t: Db) => {
		const [row] = await t('clubs')
			.insert({ name: input.name, town: input.town, created_by: input.createdBy })
			.returning(['id', 'name', 'town', 'created_at as createdAt']);
		await t('club_members').insert({ club_id: row.id, user_id: input.createdBy, role: 'organiser' });
		return row as Club;
	};
	try {
		return trx ? await run(trx) : await db.transaction(run);
	} catch (e) {
		if ((e as { code?: string }).code === '23505') throw new DuplicateClubError();
		throw e;
	}
}

/** The user's role in the club, or null for someone outside it. */
export async function roleOf(clubId: number, userId: string, trx?: Db): Promise<ClubRole | null> {
	const row = await use(trx)('club_members').select('role').where({ club_id: clubId, user_id: userId }).first();
	return (row?.role as ClubRole | undefined) ?? null;
}

export async function members(clubId: number, opts: { withEmail?: boolean } = {}, trx?: Db): Promise<Member[]> {
	const rows: { user_id: string; display_name: string; role: ClubRole; joined_at: Date; email: string }[] = await use(trx)('club_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.club_id', clubId)
		.select('m.user_id', 'u.display_name', 'm.role', 'm.joined_at', 'u.email')
		.orderBy([{ column: 'm.role', order: 'desc' }, { column: 'u.display_name' }]);
	return rows.map((r) => ({
		userId: r.user_id,
		displayName: r.display_name,
		role: r.role,
		joinedAt: r.joined_at,
		...(opts.withEmail ? { email: r.email } : {})
	}));
}

/** Adds the member, or raises a member to organiser when the invitation says so; never lowers. */
export async function addMember(clubId: number, userId: string, role: ClubRole, trx?: Db): Promise<void> {
	await use(trx)
		.raw(
			`insert into club_members (club_id, user_id, role) values (?, ?, ?)
			 on conflict (club_id, user_id) do update set role = case when excluded.role = 'organiser' then 'organiser' else club_members.role end`,
			[clubId, userId, role]
		);
}

export class LastOrganiserError extends Error {
	constructor() {
		super('a club needs at least one organiser');
	}
}

/** Changes a member's role; refuses to leave the club without an organiser. */
export async function setRole(clubId: number, userId: string, role: ClubRole): Promise<boolean> {
	return db.transaction(async (trx) => {
		// Lock the club's organiser rows so two demotions cannot both pass the count.
		const organisers = await trx('club_members').where({ club_id: clubId, role: 'organiser' }).forUpdate().select('user_id');
		if (role === 'member' && organisers.length === 1 && organisers[0].user_id === userId) throw new LastOrganiserError();
		const n = await trx('club_members').where({ club_id: clubId, user_id: userId }).update({ role });
		return n > 0;
	});
}

export async function removeMember(clubId: number, userId: string): Promise<boolean> {
	return db.transaction(async (trx) => {
		const organisers = await trx('club_members').where({ club_id: clubId, role: 'organiser' }).forUpdate().select('user_id');
		if (organisers.length === 1 && organisers[0].user_id === userId) throw new LastOrganiserError();
		const n = await trx('club_members').where({ club_id: clubId, user_id: userId }).delete();
		return n > 0;
	});
}

export interface Invitation {
	clubId: number;
	clubName: string;
	email: string;
	role: ClubRole;
	invitedBy: string;
	expiresAt: Date;
	usedAt: Date | null;
}

export async function addInvitation(
	input: { tokenHash: string; clubId: number; email: string; role: ClubRole; invitedBy: string; expiresAt: Date },
	trx?: Db
): Promise<void> {
	await use(trx)('club_invitations').insert({
		token_hash: input.tokenHash,
		club_id: input.clubId,
		email: input.email,
		role: input.role,
		invited_by: input.invitedBy,
		expires_at: input.expiresAt
	});
}

export async function findInvitation(tokenHash: string, trx?: Db): Promise<Invitation | null> {
	const row = await use(trx)('club_invitations as i')
		.join('clubs as c', 'c.id', 'i.club_id')
		.join('users as u', 'u.id', 'i.invited_by')
		.where('i.token_hash', tokenHash)
		.select('i.club_id as clubId', 'c.name as clubName', 'i.email', 'i.role', 'u.display_name as invitedBy', 'i.expires_at as expiresAt', 'i.used_at as usedAt')
		.first();
	return (row as Invitation | undefined) ?? null;
}

/** Spends the invitation and adds the member in one go; null when it was already used or expired. */
export async function acceptInvitation(tokenHash: string, userId: string, now: Date = new Date()): Promise<{ clubId: number } | null> {
	return db.transaction(async (trx) => {
		const [row] = await trx('club_invitations')
			.where({ token_hash: tokenHash })
			.whereNull('used_at')
			.andWhere('expires_at', '>', now)
			.update({ used_at: now, used_by: userId })
			.returning(['club_id', 'role']);
		if (!row) return null;
		await addMember(row.club_id, userId, row.role, trx);
		return { clubId: row.club_id as number };
	});
}

/** Invitations not yet used nor expired, for the organisers' view. */
export async function openInvitations(clubId: number, trx?: Db): Promise<{ email: string; role: ClubRole; expiresAt: Date }[]> {
	return use(trx)('club_invitations')
		.where({ club_id: clubId })
		.whereNull('used_at')
		.andWhere('expires_at', '>', new Date())
		.select('email', 'role', 'expires_at as expiresAt')
		.orderBy('created_at', 'desc');
}

export const clubs = {
	listForUser,
	find,
	add,
	roleOf,
	members,
	addMember,
	setRole,
	removeMember,
	addInvitation,
	findInvitation,
	acceptInvitation,
	openInvitations
};
