// Live sync: every entry appended to the move log notifies the game's listeners from the
// database itself (delivered on commit, so nobody hears of a rolled-back entry), whichever code
// path wrote it — and a change is written by one statement, without a round trip per entry.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.raw(`
		create function game_moves_notify() returns trigger language plpgsql as $$
		begin
			perform pg_notify('game_events', new.game_id || ':' || new.seq);
			return null;
		end
		$$`);
	await knex.raw(`create trigger game_moves_notify after insert on game_moves for each row execute function game_moves_notify()`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.raw('drop trigger if exists game_moves_notify on game_moves');
	await knex.raw('drop function if exists game_moves_notify()');
}
