// Lucia's storage adapter, written over our own sessions entity module so the app keeps one
// Knex pool. The store is passed in, which lets unit tests run Lucia over an in-memory map.
import type { Adapter, DatabaseSession, DatabaseUser } from 'lucia';
import type { SessionRow, SessionWithUser } from '$lib/server/db/sessions';

export interface SessionStore {
	findWithUser(id: string): Promise<SessionWithUser | null>;
	listForUser(userId: string): Promise<SessionRow[]>;
	add(session: SessionRow): Promise<void>;
	updateExpiry(id: string, expiresAt: Date): Promise<void>;
	remove(id: string): Promise<void>;
	removeForUser(userId: string): Promise<void>;
	removeExpired(): Promise<void>;
}

const toDatabaseSession = (s: SessionRow): DatabaseSession => ({
	id: s.id,
	userId: s.userId,
	expiresAt: s.expiresAt,
	attributes: {}
});

export function createAdapter(store: SessionStore): Adapter {
	return {
		async getSessionAndUser(sessionId): Promise<[DatabaseSession | null, DatabaseUser | null]> {
			const found = await store.findWithUser(sessionId);
			if (!found) return [null, null];
			const user: DatabaseUser = {
				id: found.user.id,
				attributes: {
					email: found.user.email,
					display_name: found.user.displayName,
					roles: found.user.roles
				}
			};
			return [toDatabaseSession(found.session), user];
		},
		async getUserSessions(userId) {
			return (await store.listForUser(userId)).map(toDatabaseSession);
		},
		async setSession(session) {
			await store.add({ id: session.id, userId: session.userId, expiresAt: session.expiresAt });
		},
		updateSessionExpiration: (sessionId, expiresAt) => store.updateExpiry(sessionId, expiresAt),
		deleteSession: (sessionId) => store.remove(sessionId),
		deleteUserSessions: (userId) => store.removeForUser(userId),
		deleteExpiredSessions: () => store.removeExpired()
	};
}
