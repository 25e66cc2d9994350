// Sign-in sessions. The id is the hex SHA-256 of the cookie token, so a leaked table cannot be
// replayed as cookies. Read together with the account and its roles in one query per request.
import { use, type Db } from './index';

export interface SessionRow {
	id: string;
	userId: string;
	expiresAt: Date;
}

export interface SessionWithUser {
	session: SessionRow;
	user: { id: string; email: string; displayName: string; roles: string[] };
}

export async function findWithUser(id: string, trx?: Db): Promise<SessionWithUser | null> {
	const k = use(trx);
	const row:
		| {
				id: string;
				user_id: string;
				expires_at: Date;
				email: string;
				display_name: string;
				roles: string[] | null;
		  }
		| undefined = await k('sessions')
		.select(
			'sessions.id',
			'sessions.user_id',
			'sessions.expires_at',
			'users.email',
			'users.display_name',
			k.raw('array_remove(array_agg(user_roles.role), null) as roles')
		)
		.join('users', 'users.id', 'sessions.user_id')
		.leftJoin('user_roles', 'user_roles.user_id', 'users.id')
		.where('sessions.id', id)
		.groupBy('sessions.id', 'users.id')
		.first();
	if (!row) return null;
	return {
		session: { id: row.id, userId: row.user_id, expiresAt: row.expires_at },
		user: { id: row.user_id, email: row.email, displayName: row.display_name, roles: row.roles ?? [] }
	};
}

export async function listForUser(userId: string, trx?: Db): Promise<SessionRow[]> {
	const rows: { id: string; user_id: string; expires_at: Date }[] = await use(trx)('sessions')
		.select('id', 'user_id', 'expires_at')
		.where({ user_id: userId });
	return rows.map((r) => ({ id: r.id, userId: r.user_id, expiresAt: r.expires_at }));
}

export async function add(session: SessionRow, trx?: Db): Promise<void> {
	await use(trx)('sessions').insert({
		id: session.id,
		user_id: session.userId,
		expires_at: session.expiresAt
	});
}

export async function updateExpiry(id: string, expiresAt: Date, trx?: Db): Promise<void> {
	await use(trx)('sessions').where({ id }).update({ expires_at: expiresAt });
}

export async function remove(id: string, trx?: Db): Promise<void> {
	await use(trx)('sessions').where({ id }).delete();
}

export async function removeForUser(userId: string, trx?: Db): Promise<void> {
	await use(trx)('sessions').where({ user_id: userId }).delete();
}

export async function removeExpired(trx?: Db): Promise<void> {
	await use(trx)('sessions').where('expires_at', '<=', new Date()).delete();
}

export const sessions = { findWithUser, listForUser, add, updateExpiry, remove, removeForUser, removeExpired };
