// Seeds the demo scenario only when the database has no users yet (idempotent start/test).
import knexFactory from 'knex';
import config from '../knexfile';

const knex = knexFactory(config);
try {
	const [{ count }] = await knex('users').count<{ count: string }[]>({ count: '*' });
	if (Number(count) === 0) {
		await knex.seed.run();
		console.log('[inchwarden] demo scenario seeded');
	} else {
		console.log('[inchwarden] database has users: demo seed skipped');
	}
} finally {
	await knex.destroy();
}
