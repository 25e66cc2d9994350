// The role matrix: every page and API route × {anonymous, player of the game, opponent,
// stranger, judge (of the game's event), organiser (of the club the event belongs to), admin},
// each cell's status asserted. The table below is the one docs/reliability.md shows. Every 200
// from the API is also checked for e-mail addresses: nobody's but the asker's own may appear.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb } from '../helpers';
import { LAYOUT } from '../../unit/games/fixtures';
import { call, clubEventFor, forward, gameInMovePhase, person, roster, type Person } from './world';
import { UNITS_A } from '../../unit/games/fixtures';

export const ROLES = ['anonymous', 'player', 'opponent', 'stranger', 'judge', 'organiser', 'admin'] as const;
type Role = (typeof ROLES)[number];

interface Ids {
	game: number;
	request: number;
	club: number;
	event: number;
	layout: number;
	roster: number;
}

/**
 * [what, method path, expected statuses in ROLES order]. Pages: anonymous visitors are sent to
 * sign-in (303); API routes answer 401. `{x}` is filled from the world below.
 */
export const MATRIX: [string, string, string][] = [
	['landing page', 'GET /', '200 303 303 303 303 303 303'],
	['sign-in page', 'GET /sign-in', '200 303 303 303 303 303 303'],
	['dashboard', 'GET /dashboard', '303 200 200 200 200 200 200'],
	['games list', 'GET /games', '303 200 200 200 200 200 200'],
	['play screen', 'GET /games/{game}', '303 200 200 403 403 403 403'],
	['replay', 'GET /games/{game}/replay', '303 200 200 403 200 200 403'],
	['turn report', 'GET /games/{game}/report', '303 200 200 403 200 200 403'],
	['judge queue', 'GET /judge', '303 403 403 403 200 403 403'],
	['judge desk', 'GET /judge/{request}', '303 403 403 403 200 403 403'],
	['clubs list', 'GET /clubs', '303 200 200 200 200 200 200'],
	['club page', 'GET /clubs/{club}', '303 200 200 403 403 200 403'],
	['club archive', 'GET /clubs/{club}/archive', '303 200 200 403 403 200 403'],
	['club statistics', 'GET /clubs/{club}/statistics', '303 200 200 403 403 200 403'],
	['events list', 'GET /events', '303 200 200 200 200 200 200'],
	['event page', 'GET /events/{event}', '303 200 200 200 200 200 200'],
	['new event', 'GET /events/new?club={club}', '303 403 403 403 403 200 403'],
	['layouts list', 'GET /layouts', '303 200 200 200 200 200 200'],
	['layout editor', 'GET /layouts/{layout}/edit', '303 200 403 403 403 403 403'],
	['rosters list', 'GET /rosters', '303 200 200 200 200 200 200'],
	['roster editor', 'GET /rosters/{roster}', '303 200 403 403 403 403 403'],
	['admin', 'GET /admin', '303 403 403 403 403 403 303'],
	['admin roles', 'GET /admin/roles', '303 403 403 403 403 403 200'],
	['admin outbox', 'GET /admin/outbox', '303 403 403 403 403 403 200'],
	['admin backup', 'GET /admin/backup', '303 403 403 403 403 403 200'],
	['check API', 'POST /api/v1/check', '200 200 200 200 200 200 200'],
	['session', 'GET /api/v1/session', '401 200 200 200 200 200 200'],
	['my games', 'GET /api/v1/games', '401 200 200 200 200 200 200'],
	['game', 'GET /api/v1/games/{game}', '401 200 200 403 403 403 403'],
	['move log', 'GET /api/v1/games/{game}/log', '401 200 200 403 403 403 403'],
	['live events', 'GET /api/v1/games/{game}/events', '401 200 200 403 403 403 403'],
	['a change (stale seq)', 'POST /api/v1/games/{game}/accept', '401 409 409 403 403 403 403'],
	['game’s ruling requests', 'GET /api/v1/rulings?game={game}', '401 200 200 403 200 200 403'],
	['judge queue API', 'GET /api/v1/rulings', '401 403 403 403 200 403 403'],
	['ruling request', 'GET /api/v1/rulings/{request}', '401 200 200 403 200 200 403'],
	['take a request', 'POST /api/v1/rulings/{request}/take', '401 403 403 403 200 403 403'],
	['standings', 'GET /api/v1/events/{event}/standings', '401 200 200 200 200 200 200'],
	['results CSV', 'GET /api/v1/events/{event}/results.csv', '401 200 200 200 200 200 200'],
	['standings CSV', 'GET /api/v1/events/{event}/standings.csv', '401 200 200 200 200 200 200'],
	['club statistics CSV', 'GET /api/v1/clubs/{club}/statistics.csv', '401 200 200 403 403 200 403'],
	['my rosters', 'GET /api/v1/rosters', '401 200 200 200 200 200 200'],
	['a roster', 'GET /api/v1/rosters/{roster}', '401 200 403 403 403 403 403'],
	['layouts', 'GET /api/v1/layouts', '401 200 200 200 200 200 200'],
	['a layout', 'GET /api/v1/layouts/{layout}', '401 200 200 200 200 200 200'],
	['save a layout (stale version)', 'PUT /api/v1/layouts/{layout}', '401 409 403 403 403 403 403'],
	['my files', 'GET /api/v1/files', '401 200 200 200 200 200 200'],
	['backup export', 'GET /api/v1/admin/backup?game={game}', '401 403 403 403 403 403 200']
];

const BODIES: Record<string, unknown> = {
	'POST /api/v1/check': {
		board: { width: 44, depth: 60 },
		pieces: [{ id: 'a1', side: 'red', unit: 'u1', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 5, y: 5, facing: 0 } }],
		move: { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8, y: 9 }] } }
	},
	'POST /api/v1/games/{game}/accept': { seq: 0 },
	'PUT /api/v1/layouts/{layout}': { doc: LAYOUT, version: 999 }
};

const people = {} as Record<Exclude<Role, 'anonymous'>, Person>;
let ids: Ids;

beforeAll(async () => {
	const [player, opponent, stranger, judge, organiser, admin] = await Promise.all([
		person('rm-player'),
		person('rm-opponent'),
		person('rm-stranger'),
		person('rm-judge'),
		person('rm-organiser', ['organiser']),
		person('rm-admin', ['admin'])
	]);
	Object.assign(people, { player, opponent, stranger, judge, organiser, admin });
	const game = await gameInMovePhase(player, opponent, 'Role matrix game');
	const { clubId, eventId } = await clubEventFor(game, organiser, judge);
	const mv = await call(player.c, 'POST', `/api/v1/games/${game.id}/moves`, { seq: game.seq, unit: 'a-u1', kind: 'move', paths: forward(9) });
	expect(mv.status).toBe(201);
	const rr = await call(opponent.c, 'POST', `/api/v1/games/${game.id}/ruling-request`, { seq: mv.json.seq, note: 'Matrix check' });
	expect(rr.status).toBe(201);
	const list = await call(player.c, 'GET', `/api/v1/rulings?game=${game.id}`);
	const layout = await call(player.c, 'POST', '/api/v1/layouts', { doc: LAYOUT });
	expect(layout.status).toBe(201);
	ids = { game: game.id, request: list.json.requests[0].id, club: clubId, event: eventId, layout: layout.json.layout.id, roster: await roster(player.id, 'Matrix list', UNITS_A) };
}, 60_000);

afterAll(async () => {
	await closeTestDb();
});

const fill = (s: string) => s.replace(/\{(\w+)\}/g, (_, k: keyof Ids) => String(ids[k]));

describe('the role matrix', () => {
	for (const [what, route, cells] of MATRIX) {
		it(`${what}: ${route}`, async () => {
			const expected = cells.split(' ').map(Number);
			expect(expected).toHaveLength(ROLES.length);
			const [method, rawPath] = route.split(' ');
			const path = fill(rawPath);
			const got: number[] = [];
			for (const role of ROLES) {
				const c = role === 'anonymous' ? new Client() : people[role].c;
				const api = path.startsWith('/api/');
				const body = BODIES[route];
				const res = await c.send(method, path, body === undefined ? undefined : JSON.stringify(body), {
					accept: api ? (path.endsWith('/events') ? 'text/event-stream' : 'application/json') : 'text/html',
					...(body === undefined ? {} : { 'content-type': 'application/json' })
				});
				got.push(res.status);
				if (res.status === 303 && role === 'anonymous' && !api && expected[0] === 303) {
					expect(res.headers.get('location'), path).toMatch(/^\/sign-in\?next=/);
				}
				if (path.endsWith('/events')) {
					await res.body?.cancel();
					continue;
				}
				const text = await res.text();
				if (api && res.status === 200 && role !== 'anonymous' && !path.startsWith('/api/v1/admin/backup')) {
					// Personal data: no one else's e-mail address in any answer (a backup is the
					// admin's copy of the accounts themselves, so it carries them).
					for (const [other, p] of Object.entries(people)) if (other !== role) expect(text, `${role} sees ${other}'s address at ${path}`).not.toContain(p.email);
				}
				if (api && res.status >= 400) expect(JSON.parse(text).error.message, `${role} ${path}`).toEqual(expect.any(String));
			}
			expect(Object.fromEntries(ROLES.map((r, i) => [r, got[i]])), path).toEqual(Object.fromEntries(ROLES.map((r, i) => [r, expected[i]])));
		});
	}
});
