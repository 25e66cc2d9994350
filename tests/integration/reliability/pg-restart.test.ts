// PostgreSQL stopped and started under a running app: while it is down the app answers 503
// (JSON for the API, a plain page otherwise), never 500, and stays up; once it is back the app
// recovers by itself, with no restart. Both the cluster (initdb into a temporary folder, port
// 54390 + slot) and the app (3200 + slot) are this test's own: the shared cluster is not touched.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dropDatabase, migratedDatabase, Remote, SLOT, startApp, throwawayCluster, waitFor, type AppProcess, type Cluster } from './processes';
import { PASSWORD } from './world';

const PG_PORT = 54390 + SLOT;
const APP_PORT = 3200 + SLOT;

let cluster: Cluster;
let app: AppProcess | null = null;
let user: Remote;

beforeAll(async () => {
	cluster = throwawayCluster(PG_PORT);
	cluster.start();
	migratedDatabase(cluster.url('postgres'), cluster.url('reliability'), 'reliability');
	app = await startApp(APP_PORT, { DATABASE_URL: cluster.url('reliability') });
	user = new Remote(app.base);
	const res = await user.form('/sign-up', { email: 'pg-restart@example.test', displayName: 'Restart Tester', password: PASSWORD });
	expect(res.status).toBe(303);
}, 90_000);

afterAll(async () => {
	await app?.stop();
	try {
		dropDatabase(cluster.url('postgres'), 'reliability');
	} finally {
		cluster?.destroy();
	}
});

describe('PostgreSQL stops and starts while the app runs', () => {
	it('answers 503 while the database is down and recovers by itself', async () => {
		expect((await user.call('GET', '/api/v1/session')).status).toBe(200);
		expect((await user.raw('GET', '/dashboard', undefined, { accept: 'text/html' })).status).toBe(200);

		cluster.stop();

		// The API: 503 with a message in the usual error shape, and a hint when to retry.
		const api = await user.call('GET', '/api/v1/session');
		expect(api.status).toBe(503);
		expect(api.json.error.message).toMatch(/database/i);
		expect(api.headers.get('retry-after')).toBe('5');
		const games = await user.call('GET', '/api/v1/games');
		expect(games.status).toBe(503);
		// A page: a plain 503 page, not the 500 error page.
		const page = await user.raw('GET', '/dashboard', undefined, { accept: 'text/html' });
		expect(page.status).toBe(503);
		expect(page.headers.get('content-type')).toMatch(/text\/html/);
		expect(await page.text()).toMatch(/Back in a moment/);
		// A signed-out visitor's form post that needs the database (sign-in): 503 too.
		const anon = new Remote(app!.base);
		const signIn = await anon.form('/sign-in', { email: 'pg-restart@example.test', password: PASSWORD });
		expect(signIn.status).toBe(503);
		// What needs no database keeps working: the stateless referee.
		const check = await anon.call('POST', '/api/v1/check', {
			board: { width: 44, depth: 60 },
			pieces: [{ id: 'a1', side: 'red', unit: 'u1', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 5, y: 5, facing: 0 } }],
			move: { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8, y: 9 }] } }
		});
		expect(check.status).toBe(200);
		// Still down a few seconds later: still 503, and the process is alive.
		await new Promise((r) => setTimeout(r, 1500));
		expect((await user.call('GET', '/api/v1/session')).status).toBe(503);
		expect(app!.child.exitCode).toBeNull();
		expect(app!.output()).not.toMatch(/Something went wrong on our side/);

		const restartedAt = Date.now();
		cluster.start();
		const pgUpMs = Date.now() - restartedAt;
		// Recovery without touching the app: the pool reconnects on the next request.
		const recoverMs = await waitFor('the app recovers', async () => (await user.call('GET', '/api/v1/session')).status === 200, 30_000, 200);
		console.log(`pg restart: PostgreSQL took ${pgUpMs} ms to start; the app answered 200 again ${recoverMs} ms after that`);
		expect((await user.raw('GET', '/dashboard', undefined, { accept: 'text/html' })).status).toBe(200);
		expect((await anon.form('/sign-in', { email: 'pg-restart@example.test', password: PASSWORD })).status).toBe(303);
	}, 60_000);
});
