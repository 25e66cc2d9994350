// Accounts, roles, sessions (Lucia 3 tables, ids are hashes of the tokens), password resets.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('users', (t) => {
		t.text('id').primary();
		t.text('email').notNullable();
		t.text('display_name').notNullable();
		t.text('password_hash').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
	// E-mail addresses are unique regardless of case.
	await knex.raw('create unique index users_email_lower_idx on users (lower(email))');

	await knex.schema.createTable('user_roles', (t) => {
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('role').notNullable();
		t.timestamp('granted_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.primary(['user_id', 'role']);
	});
	await knex.raw(
		"alter table user_roles add constraint user_roles_role_check check (role in ('judge','organiser','admin'))"
	);

	await knex.schema.createTable('sessions', (t) => {
		t.text('id').primary(); // SHA-256 of the cookie token, hex: the token itself is never stored
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['user_id']);
	});

	await knex.schema.createTable('password_resets', (t) => {
		t.text('token_hash').primary();
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('password_resets');
	await knex.schema.dropTableIfExists('sessions');
	await knex.schema.dropTableIfExists('user_roles');
	await knex.schema.dropTableIfExists('users');
}
