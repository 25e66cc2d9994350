// Rate limits shared by every app process: one counter per (limit, key, time slot), so that
// sign-in, invitation and open-check limits hold across several app servers.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('rate_counts', (t) => {
		t.text('name').notNullable();
		t.text('key').notNullable();
		// The slot's number: floor(epoch seconds / the limit's window), so a slot is one window.
		t.bigInteger('slot').notNullable();
		t.integer('count').notNullable();
		// Two windows after the slot began it can no longer matter; the sweep deletes it then.
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.primary(['name', 'key', 'slot']);
		t.index(['expires_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('rate_counts');
}
