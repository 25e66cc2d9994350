// Knex seed: the demo scenario (people, roles, the club, two layouts and the forces) into an empty
// database. The game in progress and the club's event follow in 02_demo_play.ts.
import type { Knex } from 'knex';
import { hash } from '@node-rs/argon2';
import { randomUUID } from 'node:crypto';
import { DEMO_CLUB, DEMO_FORCES, DEMO_PASSWORD, DEMO_PEOPLE } from './data/demo';
import { demoLayout } from '../src/lib/board/demo-layout';
import { secondLayout } from './data/layouts';

export async function seed(knex: Knex): Promise<void> {
	const existing = await knex('users').count<{ count: number }[]>({ count: '*' });
	if (Number(existing[0].count) > 0) return; // never seed over real data

	// argon2id with the OWASP minimum parameters, as the app's own password module uses.
	const passwordHash = await hash(DEMO_PASSWORD, { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1 });
	await knex.transaction(async (trx) => {
		const ids = new Map<string, string>();
		for (const p of DEMO_PEOPLE) {
			const id = randomUUID();
			ids.set(p.key, id);
			await trx('users').insert({ id, email: p.email, display_name: p.displayName, password_hash: passwordHash });
			for (const role of p.roles.filter((r) => r !== 'player')) {
				await trx('user_roles').insert({ user_id: id, role });
			}
		}
		const [club] = await trx('clubs')
			.insert({ name: DEMO_CLUB.name, town: DEMO_CLUB.town, created_by: ids.get('priya') })
			.returning(['id']);
		for (const p of DEMO_PEOPLE) {
			await trx('club_members').insert({
				club_id: club.id,
				user_id: ids.get(p.key),
				role: p.roles.includes('organiser') ? 'organiser' : 'member'
			});
		}
		for (const layout of [demoLayout(), secondLayout()]) {
			await trx('layouts').insert({
				owner_id: ids.get('priya'),
				name: layout.name,
				doc: JSON.stringify(layout),
				schema_version: layout.schemaVersion
			});
		}
		for (const f of DEMO_FORCES) {
			await trx('rosters').insert({
				owner_id: ids.get(f.owner),
				name: f.name,
				force: f.force,
				units: JSON.stringify(f.units)
			});
		}
	});
}
