// Clubs with their members, and players' rosters (units kept as validated JSON documents).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('clubs', (t) => {
		t.increments('id').primary();
		t.text('name').notNullable().unique();
		t.text('town').notNullable().defaultTo('');
		t.text('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
	await knex.schema.createTable('club_members', (t) => {
		t.integer('club_id').notNullable().references('clubs.id').onDelete('CASCADE');
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('role').notNullable().defaultTo('member');
		t.timestamp('joined_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.primary(['club_id', 'user_id']);
	});
	await knex.raw(
		"alter table club_members add constraint club_members_role_check check (role in ('member','organiser'))"
	);
	await knex.schema.createTable('rosters', (t) => {
		t.increments('id').primary();
		t.text('owner_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('force').notNullable();
		t.jsonb('units').notNullable().defaultTo('[]');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['owner_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('rosters');
	await knex.schema.dropTableIfExists('club_members');
	await knex.schema.dropTableIfExists('clubs');
}
