// Accounts and their granted roles. E-mail lookups ignore case, matching the unique index on
// lower(email); the address is stored as the person typed it.
import { generateIdFromEntropySize } from 'lucia';
import { use, type Db } from './index';
import { withPlayer, type GrantableRole, type Role } from '$lib/schemas/auth';

export interface UserRow {
	id: string;
	email: string;
	displayName: string;
	passwordHash: string;
	createdAt: Date;
}

/** An account as the rest of the app sees it: never carries the password hash. */
export interface Account {
	id: string;
	email: string;
	displayName: string;
	roles: Role[];
	createdAt: Date;
}

const columns = {
	id: 'users.id',
	email: 'users.email',
	displayName: 'users.display_name',
	passwordHash: 'users.password_hash',
	createdAt: 'users.created_at'
} as const;

/** Postgres' unique_violation: the e-mail is already taken (lower(email) index). */
export class DuplicateEmailError extends Error {
	constructor() {
		super('an account with this e-mail already exists');
	}
}

export async function find(id: string, trx?: Db): Promise<UserRow | null> {
	const row = await use(trx)('users').select(columns).where('users.id', id).first();
	return (row as UserRow | undefined) ?? null;
}

export async function findByEmail(email: string, trx?: Db): Promise<UserRow | null> {
	const row = await use(trx)('users')
		.select(columns)
		.whereRaw('lower(users.email) = lower(?)', [email.trim()])
		.first();
	return (row as UserRow | undefined) ?? null;
}

export async function add(
	input: { email: string; displayName: string; passwordHash: string },
	trx?: Db
): Promise<UserRow> {
	const id = generateIdFromEntropySize(10);
	try {
		const [row] = await use(trx)('users')
			.insert({
				id,
				email: input.email.trim(),
				display_name: input.displayName,
				password_hash: input.passwordHash
			})
			.returning(Object.values(columns).map((c) => c.replace('users.', '')));
		return {
			id: row.id,
			email: row.email,
			displayName: row.display_name,
			passwordHash: row.password_hash,
			createdAt: row.created_at
		};
	} catch (e) {
		if ((e as { code?: string }).code === '23505') throw new DuplicateEmailError();
		throw e;
	}
}

export async function updatePassword(id: string, passwordHash: string, trx?: Db): Promise<void> {
	await use(trx)('users').where({ id }).update({ password_hash: passwordHash });
}

/** Granted roles plus the implicit 'player', in a fixed order so pages render stably. */
export async function roles(id: string, trx?: Db): Promise<Role[]> {
	const rows: { role: GrantableRole }[] = await use(trx)('user_roles')
		.select('role')
		.where({ user_id: id });
	return withPlayer(rows.map((r) => r.role));
}


/** Every account with its roles, for the admin roles page (sorted by display name). */
export async function list(trx?: Db): Promise<Account[]> {
	const rows: {
		id: string;
		email: string;
		display_name: string;
		created_at: Date;
		roles: string[] | null;
	}[] = await use(trx)('users')
		.select(
			'users.id',
			'users.email',
			'users.display_name',
			'users.created_at',
			use(trx).raw('array_remove(array_agg(user_roles.role), null) as roles')
		)
		.leftJoin('user_roles', 'user_roles.user_id', 'users.id')
		.groupBy('users.id')
		.orderByRaw('lower(users.display_name), users.id');
	return rows.map((r) => ({
		id: r.id,
		email: r.email,
		displayName: r.display_name,
		createdAt: r.created_at,
		roles: withPlayer(r.roles ?? [])
	}));
}

export async function grantRole(userId: string, role: GrantableRole, trx?: Db): Promise<void> {
	await use(trx)('user_roles').insert({ user_id: userId, role }).onConflict(['user_id', 'role']).ignore();
}

export async function revokeRole(userId: string, role: GrantableRole, trx?: Db): Promise<void> {
	await use(trx)('user_roles').where({ user_id: userId, role }).delete();
}

export async function countWithRole(role: GrantableRole, trx?: Db): Promise<number> {
	const row = await use(trx)('user_roles').where({ role }).count<{ count: number }[]>('* as count').first();
	return Number(row?.count ?? 0);
}

export const users = { find, findByEmail, add, updatePassword, roles, list, grantRole, revokeRole, countWithRole };
