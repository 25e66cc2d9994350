// Running an event over real HTTP: pair a round (draft, hidden from players), swap by hand,
// publish (a game per table, every player e-mailed), report → confirm, organiser entry,
// standings, the results/standings/statistics CSV, and the archive's filters.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb, waitForMail } from '../helpers';
import { clubWithOrganiser, createEvent, enterFree, join, person, type Person } from './setup';

afterAll(closeTestDb);

let clubId: number;
let organiser: Person;
let players: Person[];
let eventId: number;

const pairingsOf = (round: number) =>
	testDb()('event_pairings as p').join('event_rounds as r', 'r.id', 'p.round_id').where({ 'r.event_id': eventId, 'r.number': round }).select('p.*', 'r.status as round_status').orderByRaw('p.table_no nulls last');
const byId = (id: string | null) => players.find((p) => p.id === id)!;

beforeAll(async () => {
	({ clubId, organiser } = await clubWithOrganiser());
	players = [await person('anna'), await person('bert'), await person('cleo')];
	for (const p of players) await join(clubId, p);
	eventId = await createEvent(organiser, clubId, { rounds: '2' });
	for (const p of players) await enterFree(eventId, p);
});

describe('round 1', () => {
	it('pairs as a draft the players do not see yet, with a bye for the odd count', async () => {
		expect((await organiser.client.post(`/events/${eventId}?/pair`, {})).status).toBe(200);
		const draft = await pairingsOf(1);
		expect(draft).toHaveLength(2);
		expect(draft[0].round_status).toBe('draft');
		expect(draft[0].table_no).toBe(1);
		expect(draft[1]).toMatchObject({ table_no: null, player_b: null, result_status: 'confirmed', outcome: 'a' });
		expect((await testDb()('events').where({ id: eventId }).first()).status).toBe('closed');
		const asPlayer = await (await players[0].client.get(`/events/${eventId}`)).text();
		expect(asPlayer).not.toContain('data-testid="round-1"');
		const asOrganiser = await (await organiser.client.get(`/events/${eventId}`)).text();
		expect(asOrganiser).toContain('data-testid="round-1"');
		// A second draft is refused while this one waits.
		expect((await organiser.client.post(`/events/${eventId}?/pair`, {})).status).toBe(409);
	});

	it('lets the organiser swap the bye with a seated player before publishing', async () => {
		const [table, bye] = await pairingsOf(1);
		const roundId = table.round_id;
		const res = await organiser.client.post(`/events/${eventId}?/swap`, { roundId: String(roundId), first: bye.player_a, second: table.player_b });
		expect(res.status).toBe(200);
		const after = await pairingsOf(1);
		expect(after[0].player_b).toBe(bye.player_a);
		expect(after[1].player_a).toBe(table.player_b);
		// Not for players.
		expect((await players[0].client.post(`/events/${eventId}?/swap`, { roundId: String(roundId), first: bye.player_a, second: table.player_a })).status).toBe(403);
	});

	it('publishes: a game for the table with both players seated, every player e-mailed', async () => {
		const [table] = await pairingsOf(1);
		const res = await organiser.client.post(`/events/${eventId}?/publish`, { roundId: String(table.round_id) });
		expect(res.status).toBe(200);
		const [t, bye] = await pairingsOf(1);
		expect(t.round_status).toBe('published');
		expect(t.game_id).not.toBeNull();
		expect(bye.game_id).toBeNull();
		const seats = await testDb()('game_players').where({ game_id: t.game_id }).orderBy('side');
		expect(seats.map((s: { user_id: string }) => s.user_id)).toEqual([t.player_a, t.player_b]);
		const game = await testDb()('games').where({ id: t.game_id }).first();
		expect(game.title).toContain('round 1 · table 1');
		expect(game.profile.keepOut).toBe(1); // the event's profile, Table Standard

		for (const id of [t.player_a, t.player_b]) {
			const [m] = await waitForMail(byId(id).email);
			expect(m.subject).toContain('round 1 pairings');
			expect(m.text).toContain(`/games/${t.game_id}`);
		}
		const [byeMail] = await waitForMail(byId(bye.player_a).email);
		expect(byeMail.text).toContain('You have the bye');
		expect((await organiser.client.post(`/events/${eventId}?/publish`, { roundId: String(t.round_id) })).status).toBe(409);
	});

	it('takes a result from a player and its confirmation from the opponent only', async () => {
		const [t, bye] = await pairingsOf(1);
		const a = byId(t.player_a);
		const b = byId(t.player_b);
		const outsider = byId(bye.player_a);
		const result = { pairingId: String(t.id), outcome: 'a', valueA: '7', valueB: '3' };
		expect((await outsider.client.post(`/events/${eventId}?/report`, result)).status).toBe(403);
		expect((await a.client.post(`/events/${eventId}?/report`, { ...result, outcome: 'nobody' })).status).toBe(400);
		expect((await a.client.post(`/events/${eventId}?/report`, result)).status).toBe(200);
		expect((await a.client.post(`/events/${eventId}?/confirm`, { pairingId: String(t.id) })).status).toBe(409);
		expect((await outsider.client.post(`/events/${eventId}?/confirm`, { pairingId: String(t.id) })).status).toBe(403);
		expect((await b.client.post(`/events/${eventId}?/confirm`, { pairingId: String(t.id) })).status).toBe(200);
		const done = (await pairingsOf(1))[0];
		expect(done).toMatchObject({ outcome: 'a', value_a: 7, value_b: 3, result_status: 'confirmed', reported_by: a.id, confirmed_by: b.id });
		// Confirmed results are changed by organisers only.
		expect((await a.client.post(`/events/${eventId}?/report`, result)).status).toBe(409);
	});

	it('computes the standings from confirmed results (win 3, bye 3, loss 0)', async () => {
		const [t, bye] = await pairingsOf(1);
		const res = await players[0].client.get(`/api/v1/events/${eventId}/standings`);
		expect(res.status).toBe(200);
		const { standings } = (await res.json()) as { standings: { id: string; points: number; rank: number; valueDiff: number; opponentsPoints: number }[] };
		const of = (id: string) => standings.find((s) => s.id === id)!;
		expect(of(t.player_a)).toMatchObject({ points: 3, valueDiff: 4, opponentsPoints: 0 });
		expect(of(bye.player_a)).toMatchObject({ points: 3, valueDiff: 0, opponentsPoints: 0 });
		expect(of(t.player_b)).toMatchObject({ points: 0, valueDiff: -4, opponentsPoints: 3, rank: 3 });
		// Winner and bye are level on points and opponents' points; the value difference parts them.
		expect(standings[0].id).toBe(t.player_a);
	});
});

describe('round 2 and the end', () => {
	it('pairs without a rematch, gives the bye to someone new, and lets the organiser enter a result', async () => {
		expect((await organiser.client.post(`/events/${eventId}?/pair`, {})).status).toBe(200);
		const r1 = await pairingsOf(1);
		const draft = await pairingsOf(2);
		const met = `${[r1[0].player_a, r1[0].player_b].sort()}`;
		expect(`${[draft[0].player_a, draft[0].player_b].sort()}`).not.toBe(met);
		expect(draft[1].player_a).not.toBe(r1[1].player_a);
		expect((await organiser.client.post(`/events/${eventId}?/publish`, { roundId: String(draft[0].round_id) })).status).toBe(200);
		const [t] = await pairingsOf(2);
		// A draw entered by the organiser counts at once.
		const res = await organiser.client.post(`/events/${eventId}?/enter`, { pairingId: String(t.id), outcome: 'draw', valueA: '2', valueB: '2' });
		expect(res.status).toBe(200);
		expect((await pairingsOf(2))[0]).toMatchObject({ result_status: 'confirmed', outcome: 'draw' });
		expect((await organiser.client.post(`/events/${eventId}?/pair`, {})).status).toBe(409); // both rounds paired
		expect((await organiser.client.post(`/events/${eventId}?/finish`, {})).status).toBe(200);
		expect(await (await players[1].client.get(`/events/${eventId}`)).text()).toContain('Final table');
	});

	it('exports the results and the standings as CSV with the reported figures', async () => {
		const r1 = await pairingsOf(1);
		const r2 = await pairingsOf(2);
		const name = (id: string | null) => (id ? byId(id).name : '');
		const csv = await (await players[2].client.get(`/api/v1/events/${eventId}/results.csv`)).text();
		expect(csv.split('\r\n')).toEqual([
			'round,table,player_a,player_b,winner,value_a,value_b,result_status,game_id',
			`1,1,${name(r1[0].player_a)},${name(r1[0].player_b)},${name(r1[0].player_a)},7,3,confirmed,${r1[0].game_id}`,
			`1,bye,${name(r1[1].player_a)},,${name(r1[1].player_a)},,,confirmed,`,
			`2,1,${name(r2[0].player_a)},${name(r2[0].player_b)},draw,2,2,confirmed,${r2[0].game_id}`,
			`2,bye,${name(r2[1].player_a)},,${name(r2[1].player_a)},,,confirmed,`,
			''
		]);
		const standings = await (await players[2].client.get(`/api/v1/events/${eventId}/standings.csv`)).text();
		const lines = standings.trim().split('\r\n');
		expect(lines[0]).toBe('rank,player,games,wins,draws,losses,byes,points,opponents_points,value_difference,head_to_head');
		expect(lines).toHaveLength(4);
		// Round 1 gave a win and a bye (3 + 3), round 2 a draw and a bye (1 + 1 + 3): 11 in all.
		const total = lines.slice(1).reduce((s, l) => s + Number(l.split(',')[7]), 0);
		expect(total).toBe(11);
	});

	it('files the event’s games in the club archive; statistics count the logged findings', async () => {
		const [t1] = await pairingsOf(1);
		const a = t1.player_a;
		// Arrange a move log as the table screen writes it: one refused move with a spacing finding
		// and a ruling request (the log is append-only, so these are plain appends).
		const finding = { code: 'spacing', severity: 'error', pieces: ['a-u1-p1'], measured: 2.4, limit: 2, message: 'too far from its unit' };
		await testDb()('game_moves').insert([
			{ game_id: t1.game_id, seq: 1, kind: 'refused', actor: a, side: 'a', round: 1, payload: '{}', report: JSON.stringify({ verdict: 'illegal', pieces: {}, findings: [finding], summaries: { objectives: [], rings: [] } }) },
			{ game_id: t1.game_id, seq: 2, kind: 'ruling-request', actor: a, side: 'a', round: 1, payload: JSON.stringify({ moveSeq: 1, note: 'was that 2 in?' }) },
			{ game_id: t1.game_id, seq: 3, kind: 'ruling', actor: organiser.id, side: null, round: 1, payload: JSON.stringify({ requestSeq: 2, decision: 'upheld' }) }
		]);
		const all = await (await organiser.client.get(`/clubs/${clubId}/archive`)).text();
		expect(all).toContain(`/games/${t1.game_id}`);
		const ruled = await (await organiser.client.get(`/clubs/${clubId}/archive?rulings=yes`)).text();
		expect(ruled).toContain(`/games/${t1.game_id}`);
		expect(ruled).toContain('1 logged game');
		const unruled = await (await organiser.client.get(`/clubs/${clubId}/archive?rulings=no`)).text();
		expect(unruled).not.toContain(`/games/${t1.game_id}"`);
		const byPlayer = await (await organiser.client.get(`/clubs/${clubId}/archive?player=${organiser.id}`)).text();
		expect(byPlayer).toContain('0 logged games');
		// Round 1's bye player had no game then, and must play in round 2: exactly one game.
		const byeOfRound1 = (await pairingsOf(1))[1].player_a;
		const oneGame = await (await organiser.client.get(`/clubs/${clubId}/archive?player=${byeOfRound1}&event=${eventId}`)).text();
		expect(oneGame).toMatch(/>1 logged game</);
		expect(await (await organiser.client.get(`/clubs/${clubId}/archive?from=2999-01-01`)).text()).toContain('0 logged games');
		expect(await (await organiser.client.get(`/clubs/${clubId}/archive?profile=Table%20Standard`)).text()).toContain(`/games/${t1.game_id}/replay`);
		expect(await (await organiser.client.get(`/clubs/${clubId}/archive?profile=Custom`)).text()).toContain('0 logged games');

		const csv = (await (await organiser.client.get(`/api/v1/clubs/${clubId}/statistics.csv`)).text()).split('\r\n');
		expect(csv).toContain('finding,spacing,,1');
		expect(csv).toContain('refused-by,spacing,,1');
		const ev = await testDb()('events').where({ id: eventId }).first('name');
		expect(csv).toContain(`rulings-per-event,${ev.name},2,1`);
		expect(csv).toContain(`rulings-given-per-event,${ev.name},2,1`);
		expect(csv.filter((l) => l.startsWith('rulings-per-game,') && l.endsWith(',1'))).toHaveLength(1);
	});
});
