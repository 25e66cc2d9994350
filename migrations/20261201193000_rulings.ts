// The judge desk: ruling requests (one per 'ruling-request' entry of the move log, with its
// evidence photos), shareable links to turn reports, and 'ruling' as a kind of log entry — a
// ruling is appended to the move log like everything else, never written over what it rules on.
import type { Knex } from 'knex';

const KINDS_BEFORE = ['roster', 'deploy', 'roll', 'move', 'refused', 'accept', 'take-back', 'ruling-request', 'end-turn'];
const KINDS_AFTER = [...KINDS_BEFORE, 'ruling'];
const kindCheck = (kinds: string[]) => `check (kind in (${kinds.map((k) => `'${k}'`).join(',')}))`;

export async function up(knex: Knex): Promise<void> {
	await knex.raw('alter table game_moves drop constraint game_moves_kind_check');
	await knex.raw(`alter table game_moves add constraint game_moves_kind_check ${kindCheck(KINDS_AFTER)}`);

	await knex.schema.createTable('ruling_requests', (t) => {
		t.increments('id').primary();
		t.integer('game_id').notNullable().references('games.id').onDelete('RESTRICT');
		// The log entry that opened the request, and the entry it asks about.
		t.integer('request_seq').notNullable();
		t.integer('move_seq').notNullable();
		t.text('requested_by').notNullable().references('users.id').onDelete('RESTRICT');
		t.text('note').notNullable().defaultTo('');
		t.text('status').notNullable().defaultTo('open');
		t.text('taken_by').references('users.id').onDelete('SET NULL');
		t.timestamp('taken_at', { useTz: true });
		// The 'ruling' log entry that settled it.
		t.integer('ruled_seq');
		t.timestamp('ruled_at', { useTz: true });
		// When the judges were told by e-mail; null until the mail has gone out.
		t.timestamp('notified_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['game_id', 'request_seq']);
		t.index(['status', 'created_at']);
		t.foreign(['game_id', 'request_seq']).references(['game_id', 'seq']).inTable('game_moves');
		t.foreign(['game_id', 'move_seq']).references(['game_id', 'seq']).inTable('game_moves');
	});
	await knex.raw("alter table ruling_requests add constraint ruling_requests_status_check check (status in ('open','taken','ruled'))");
	// A taken or ruled request names its judge; an open one names nobody.
	await knex.raw(`alter table ruling_requests add constraint ruling_requests_taken_check check (
		(status = 'open' and taken_by is null and taken_at is null) or (status <> 'open' and taken_at is not null))`);
	await knex.raw(`alter table ruling_requests add constraint ruling_requests_ruled_check check (
		(status = 'ruled') = (ruled_seq is not null))`);
	await knex.raw('alter table ruling_requests add constraint ruling_requests_seq_check check (move_seq < request_seq)');

	await knex.schema.createTable('ruling_request_photos', (t) => {
		t.integer('request_id').notNullable().references('ruling_requests.id').onDelete('CASCADE');
		t.uuid('upload_id').notNullable().references('uploads.id').onDelete('RESTRICT');
		t.integer('position').notNullable().defaultTo(0);
		t.primary(['request_id', 'upload_id']);
	});

	// A turn report shared by link (with an organiser): only a hash of the link's token is kept.
	await knex.schema.createTable('turn_report_links', (t) => {
		t.text('token_hash').primary();
		t.integer('game_id').notNullable().references('games.id').onDelete('CASCADE');
		t.integer('round').notNullable();
		t.text('created_by').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['game_id']);
	});

	// Whichever route appends a 'ruling-request' entry (the table's own, or the judge desk's),
	// its request row and photo links are written by the same INSERT, in the same transaction:
	// the log stays the one source, and no request can exist without its entry or vice versa.
	await knex.raw(`
		create function ruling_request_from_log() returns trigger language plpgsql as $$
		declare
			rid integer;
			target integer;
		begin
			if new.kind <> 'ruling-request' then
				return null;
			end if;
			target := coalesce((new.payload->>'moveSeq')::integer, new.seq - 1);
			insert into ruling_requests (game_id, request_seq, move_seq, requested_by, note)
			values (new.game_id, new.seq, target, new.actor, coalesce(new.payload->>'note', ''))
			on conflict (game_id, request_seq) do nothing
			returning id into rid;
			if rid is not null and jsonb_typeof(new.payload->'photos') = 'array' then
				insert into ruling_request_photos (request_id, upload_id, position)
				select rid, p.value::uuid, p.ordinality - 1
				from jsonb_array_elements_text(new.payload->'photos') with ordinality as p(value, ordinality);
			end if;
			return null;
		end
		$$`);
	await knex.raw(`create trigger game_moves_ruling_request after insert on game_moves
		for each row when (new.kind = 'ruling-request') execute function ruling_request_from_log()`);
}

export async function down(knex: Knex): Promise<void> {
	// The log is append-only: rulings on record cannot be removed, so the narrower check could
	// not hold. Refuse plainly instead of leaving the log half-valid.
	const [{ n }] = (await knex('game_moves').where({ kind: 'ruling' }).count({ n: '*' })) as { n: number | string }[];
	if (Number(n) > 0) throw new Error(`game_moves holds ${n} ruling entries: the rulings migration cannot be undone`);
	await knex.raw('drop trigger if exists game_moves_ruling_request on game_moves');
	await knex.raw('drop function if exists ruling_request_from_log()');
	await knex.schema.dropTableIfExists('turn_report_links');
	await knex.schema.dropTableIfExists('ruling_request_photos');
	await knex.schema.dropTableIfExists('ruling_requests');
	await knex.raw('alter table game_moves drop constraint game_moves_kind_check');
	await knex.raw(`alter table game_moves add constraint game_moves_kind_check ${kindCheck(KINDS_BEFORE)}`);
}
