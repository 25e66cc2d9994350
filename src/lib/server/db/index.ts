// The one runtime Knex instance. Fails loudly at import when the database URL is missing.
import knexFactory, { type Knex } from 'knex';
import pg from 'pg';

// Return int8/bigint counts as numbers and keep timestamps as Date objects.
pg.types.setTypeParser(20, (v: string) => Number(v));

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: the app needs PostgreSQL (see .env.example)');

export const db: Knex = knexFactory({
	client: 'pg',
	connection: url,
	pool: { min: 0, max: Number(process.env.DB_POOL_MAX ?? 10) }
});

/** Entity functions take an optional transaction; this picks it or the shared instance. */
export type Db = Knex | Knex.Transaction;
export const use = (trx?: Db): Db => trx ?? db;

export async function closeDb(): Promise<void> {
	await db.destroy();
}
