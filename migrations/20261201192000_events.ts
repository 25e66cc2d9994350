// Clubs' invitations, events (one-day events and leagues) with judges, entries and their
// payments (checkout sessions at the payment provider; no card data is ever stored here), the
// provider's processed webhook events (replays are ignored), rounds, pairings and results.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('club_invitations', (t) => {
		t.text('token_hash').primary(); // SHA-256 of the link's token: the token is never stored
		t.integer('club_id').notNullable().references('clubs.id').onDelete('CASCADE');
		t.text('email').notNullable();
		t.text('role').notNullable().defaultTo('member');
		t.text('invited_by').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.text('used_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['club_id']);
	});
	await knex.raw("alter table club_invitations add constraint club_invitations_role_check check (role in ('member','organiser'))");

	await knex.schema.createTable('events', (t) => {
		t.increments('id').primary();
		t.integer('club_id').notNullable().references('clubs.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('kind').notNullable().defaultTo('one-day');
		t.date('starts_on').notNullable();
		t.date('ends_on').notNullable();
		t.text('venue').notNullable().defaultTo('');
		t.text('profile_name').notNullable().defaultTo('Table Standard');
		t.jsonb('profile').notNullable().defaultTo('{}');
		t.integer('rounds').notNullable().defaultTo(3);
		// Saved layouts (ids in the layouts table) dealt to the tables in turn; a game keeps its
		// own snapshot, so a layout removed later changes no game.
		t.jsonb('layout_ids').notNullable().defaultTo('[]');
		t.integer('entry_fee_cents').notNullable().defaultTo(0);
		t.text('currency').notNullable().defaultTo('eur');
		t.integer('capacity').notNullable().defaultTo(16);
		t.text('status').notNullable().defaultTo('open');
		t.text('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['club_id']);
	});
	await knex.raw("alter table events add constraint events_kind_check check (kind in ('one-day','league'))");
	await knex.raw("alter table events add constraint events_status_check check (status in ('open','closed','finished'))");
	await knex.raw('alter table events add constraint events_dates_check check (ends_on >= starts_on)');
	await knex.raw('alter table events add constraint events_numbers_check check (entry_fee_cents >= 0 and capacity >= 2 and rounds >= 1)');

	await knex.schema.createTable('event_judges', (t) => {
		t.integer('event_id').notNullable().references('events.id').onDelete('CASCADE');
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.primary(['event_id', 'user_id']);
	});

	await knex.schema.createTable('event_entries', (t) => {
		t.increments('id').primary();
		t.integer('event_id').notNullable().references('events.id').onDelete('CASCADE');
		t.text('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.integer('roster_id').references('rosters.id').onDelete('SET NULL');
		t.text('status').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['event_id', 'user_id']);
	});
	await knex.raw("alter table event_entries add constraint event_entries_status_check check (status in ('awaiting-payment','entered','withdrawn'))");

	await knex.schema.createTable('payments', (t) => {
		t.increments('id').primary();
		t.integer('entry_id').notNullable().references('event_entries.id').onDelete('RESTRICT');
		t.text('session_id').notNullable().unique(); // the provider's checkout session
		t.text('payment_intent').unique();
		t.integer('amount_cents').notNullable();
		t.text('currency').notNullable();
		t.text('status').notNullable().defaultTo('open');
		t.text('refund_id');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('paid_at', { useTz: true });
		t.timestamp('refunded_at', { useTz: true });
		t.index(['entry_id']);
	});
	await knex.raw("alter table payments add constraint payments_status_check check (status in ('open','paid','refund-requested','refunded'))");

	await knex.schema.createTable('payment_webhook_events', (t) => {
		t.text('id').primary(); // the provider's event id: a second delivery is a replay
		t.text('type').notNullable();
		t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});

	await knex.schema.createTable('event_rounds', (t) => {
		t.increments('id').primary();
		t.integer('event_id').notNullable().references('events.id').onDelete('CASCADE');
		t.integer('number').notNullable();
		t.text('status').notNullable().defaultTo('draft');
		t.timestamp('published_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['event_id', 'number']);
	});
	await knex.raw("alter table event_rounds add constraint event_rounds_status_check check (status in ('draft','published'))");

	await knex.schema.createTable('event_pairings', (t) => {
		t.increments('id').primary();
		t.integer('round_id').notNullable().references('event_rounds.id').onDelete('CASCADE');
		t.integer('table_no'); // null for the bye
		t.integer('layout_id');
		t.text('player_a').notNullable().references('users.id').onDelete('RESTRICT');
		t.text('player_b').references('users.id').onDelete('RESTRICT'); // null: the bye
		t.integer('game_id').references('games.id').onDelete('SET NULL');
		t.text('outcome'); // 'a', 'b' or 'draw' once a result is reported
		t.integer('value_a');
		t.integer('value_b');
		t.text('result_status').notNullable().defaultTo('none');
		t.text('reported_by').references('users.id').onDelete('SET NULL');
		t.timestamp('reported_at', { useTz: true });
		t.text('confirmed_by').references('users.id').onDelete('SET NULL');
		t.timestamp('confirmed_at', { useTz: true });
		t.index(['round_id']);
		t.index(['game_id']);
	});
	await knex.raw("alter table event_pairings add constraint event_pairings_outcome_check check (outcome is null or outcome in ('a','b','draw'))");
	await knex.raw("alter table event_pairings add constraint event_pairings_result_check check (result_status in ('none','reported','confirmed'))");
	await knex.raw('alter table event_pairings add constraint event_pairings_values_check check (coalesce(value_a, 0) >= 0 and coalesce(value_b, 0) >= 0)');
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('event_pairings');
	await knex.schema.dropTableIfExists('event_rounds');
	await knex.schema.dropTableIfExists('payment_webhook_events');
	await knex.schema.dropTableIfExists('payments');
	await knex.schema.dropTableIfExists('event_entries');
	await knex.schema.dropTableIfExists('event_judges');
	await knex.schema.dropTableIfExists('events');
	await knex.schema.dropTableIfExists('club_invitations');
}
