// Saved table layouts: the board editor's document (schemas/layout.ts) as validated JSON, with
// its schema version in a column (so old documents can be found and upgraded) and a version
// counter for optimistic concurrency (a stale save is refused, never silently overwritten).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('layouts', (t) => {
		t.increments('id').primary();
		t.text('owner_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.jsonb('doc').notNullable();
		t.integer('schema_version').notNullable();
		t.integer('version').notNullable().defaultTo(1);
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['owner_id']);
	});
	await knex.raw("alter table layouts add constraint layouts_name_check check (length(btrim(name)) between 1 and 100)");
	await knex.raw('alter table layouts add constraint layouts_version_check check (version >= 1 and schema_version >= 1)');
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('layouts');
}
