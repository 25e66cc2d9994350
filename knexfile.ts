// Knex CLI configuration only; the app uses the single instance in src/lib/server/db.
import type { Knex } from 'knex';

const url = process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/inchwarden';

const config: Knex.Config = {
	client: 'pg',
	connection: url,
	migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
	seeds: { directory: './seeds', extension: 'ts', loadExtensions: ['.ts'] }
};

export default config;
