// Shared by the browser benchmarks: Debian's Chromium with the flags of playwright.config.ts
// (never a downloaded browser), a demo sign-in, and the 300-piece bench game set up through the
// app's own HTTP API (layout, two rosters, a one-tablet game, both sides deployed, round 1).
import { chromium, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';
import { benchLayout, benchRoster, placementsFor } from './frame-scene';
import type { GameView } from '../../src/lib/schemas/game';

/** The app's address; the wrapper script sets it after bringing the app up. */
export function baseUrl(script: string): string {
	const url = process.env.BENCH_BASE_URL;
	if (!url) {
		console.error(`${script} measures the running app: run it through \`npm run bench:frame\`, which builds and starts one (or set BENCH_BASE_URL).`);
		process.exit(2);
	}
	return url.replace(/\/+$/, '');
}

export async function launch(): Promise<Browser> {
	return chromium.launch({
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
	});
}

export async function tablet(browser: Browser, base: string): Promise<{ context: BrowserContext; page: Page }> {
	const context = await browser.newContext({ baseURL: base, viewport: { width: 1024, height: 768 }, hasTouch: true });
	// tsx compiles this file keeping function names through a `__name` helper, which the page
	// lacks when page.evaluate sends a function over: give the page a no-op one.
	await context.addInitScript('window.__name = (f) => f;');
	return { context, page: await context.newPage() };
}

export async function signIn(page: Page, key = 'ada'): Promise<void> {
	const who = DEMO_PEOPLE.find((p) => p.key === key)!;
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(who.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

async function call<T>(page: Page, method: 'GET' | 'POST', path: string, data?: unknown, want = [200, 201]): Promise<T> {
	const res = method === 'GET' ? await page.request.get(path) : await page.request.post(path, { data });
	const body = await res.json().catch(() => null);
	if (!want.includes(res.status())) throw new Error(`${method} ${path} answered ${res.status()}: ${JSON.stringify(body).slice(0, 400)}`);
	return body as T;
}

/**
 * A one-tablet game for the signed-in user on the bench layout, both 150-piece rosters chosen
 * and deployed, deployment ended on both sides: round 1, side A to move. Returns the game id.
 */
export async function setUpBenchGame(page: Page, tag: string): Promise<{ id: number; game: GameView }> {
	const { layout } = await call<{ layout: { id: number } }>(page, 'POST', '/api/v1/layouts', { doc: benchLayout(`Bench table ${tag}`) });
	const ra = await call<{ roster: { id: number } }>(page, 'POST', '/api/v1/rosters', benchRoster(`Bench A ${tag}`, 'Ashfield'));
	const rb = await call<{ roster: { id: number } }>(page, 'POST', '/api/v1/rosters', benchRoster(`Bench B ${tag}`, 'Brackenly'));
	const { id } = await call<{ id: number }>(page, 'POST', '/api/v1/games', {
		title: `Frame bench ${tag}`,
		layoutId: layout.id,
		opponent: { mode: 'shared' },
		rosterA: ra.roster.id,
		rosterB: rb.roster.id
	});
	let { game } = await call<{ game: GameView }>(page, 'GET', `/api/v1/games/${id}`);
	for (const side of ['a', 'b'] as const) {
		({ game } = await call<{ game: GameView }>(page, 'POST', `/api/v1/games/${id}/deploy`, { seq: game.seq, side, placements: placementsFor(game.state.pieces, side) }));
		({ game } = await call<{ game: GameView }>(page, 'POST', `/api/v1/games/${id}/end-turn`, { seq: game.seq }));
	}
	if (game.state.phase !== 'move' || game.state.round !== 1) throw new Error(`the bench game is in ${game.state.phase}, round ${game.state.round}`);
	return { id, game };
}

export const pct = (sorted: number[], q: number): number => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
