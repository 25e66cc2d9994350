// Games at the table: the game row (layout snapshot, profile, current state), its two sides and
// their players, e-mail invitations (stored as token hashes), and the append-only move log.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('games', (t) => {
		t.increments('id').primary();
		t.text('title').notNullable();
		t.text('created_by').notNullable().references('users.id').onDelete('RESTRICT');
		// The layout the game was set up from, for reference only: the game plays on its own
		// snapshot (`layout`), so editing or deleting the saved layout never changes a game.
		t.integer('layout_id');
		t.jsonb('layout').notNullable();
		t.jsonb('profile').notNullable();
		// Current positions, round, turn, active side, the move awaiting acceptance: always
		// rewritten in the same transaction as the log entry that changes them.
		t.jsonb('state').notNullable();
		// The seq of the last log entry; a submission names the seq it saw (optimistic locking).
		t.integer('seq').notNullable().defaultTo(0);
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['created_by']);
	});

	await knex.schema.createTable('game_players', (t) => {
		t.integer('game_id').notNullable().references('games.id').onDelete('CASCADE');
		t.text('side').notNullable();
		// Null while the invited opponent has not joined yet; the same user on both sides is
		// one tablet shared by two people.
		t.text('user_id').references('users.id').onDelete('SET NULL');
		t.integer('roster_id').references('rosters.id').onDelete('SET NULL');
		t.primary(['game_id', 'side']);
		t.index(['user_id']);
	});
	await knex.raw("alter table game_players add constraint game_players_side_check check (side in ('a','b'))");

	await knex.schema.createTable('game_invitations', (t) => {
		t.text('token_hash').primary(); // SHA-256 of the link's token: the token is never stored
		t.integer('game_id').notNullable().references('games.id').onDelete('CASCADE');
		t.text('side').notNullable();
		t.text('email').notNullable();
		t.text('invited_by').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.text('used_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['game_id']);
	});

	await knex.schema.createTable('game_moves', (t) => {
		t.bigIncrements('id').primary();
		t.integer('game_id').notNullable().references('games.id').onDelete('RESTRICT');
		t.integer('seq').notNullable();
		t.text('kind').notNullable();
		t.text('actor').notNullable().references('users.id').onDelete('RESTRICT');
		t.text('side');
		t.integer('round').notNullable().defaultTo(0);
		t.jsonb('payload').notNullable().defaultTo('{}');
		t.jsonb('report');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['game_id', 'seq']);
	});
	await knex.raw(`alter table game_moves add constraint game_moves_seq_check check (seq >= 1)`);
	await knex.raw(`alter table game_moves add constraint game_moves_kind_check check (kind in
		('roster','deploy','roll','move','refused','accept','take-back','ruling-request','end-turn'))`);

	// The move log is a record: nothing may rewrite or remove an entry, whatever the client.
	await knex.raw(`
		create function game_moves_append_only() returns trigger language plpgsql as $$
		begin
			raise exception 'game_moves is append-only: % refused', tg_op using errcode = '55000';
		end
		$$`);
	await knex.raw(`create trigger game_moves_no_update before update or delete on game_moves
		for each row execute function game_moves_append_only()`);
	await knex.raw(`create trigger game_moves_no_truncate before truncate on game_moves
		for each statement execute function game_moves_append_only()`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('game_moves');
	await knex.raw('drop function if exists game_moves_append_only()');
	await knex.schema.dropTableIfExists('game_invitations');
	await knex.schema.dropTableIfExists('game_players');
	await knex.schema.dropTableIfExists('games');
}
