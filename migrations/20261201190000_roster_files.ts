// Uploaded files (roster imports, unit pictures): the bytes live in the S3 store under a key we
// make up; this table says whose they are, what the bytes were sniffed to be, and how big.
// Rosters remember which upload they were imported from.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('uploads', (t) => {
		t.uuid('id').primary();
		t.text('owner_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('key').notNullable().unique(); // u/<owner id>/<upload id>, never from the file name
		t.text('purpose').notNullable();
		t.text('content_type').notNullable(); // sniffed from the bytes, not the sender's claim
		t.integer('size_bytes').notNullable();
		t.text('sha256').notNullable();
		t.text('file_name').notNullable().defaultTo(''); // shown to the owner only; cleaned
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['owner_id', 'created_at']);
	});
	await knex.raw(
		"alter table uploads add constraint uploads_purpose_check check (purpose in ('roster-import','unit-picture'))"
	);
	await knex.raw('alter table uploads add constraint uploads_size_check check (size_bytes >= 0)');
	await knex.schema.alterTable('rosters', (t) => {
		t.uuid('source_upload_id').references('uploads.id').onDelete('SET NULL');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('rosters', (t) => {
		t.dropColumn('source_upload_id');
	});
	await knex.schema.dropTableIfExists('uploads');
}
