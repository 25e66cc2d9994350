// The judge desk in Chromium: a player asks for a ruling on a logged move; a judge in another
// browser context takes it from the queue, replays the move with its measurements, adjusts it,
// and the player's open replay shows the ruling live (server-sent events), without a reload.
import { test, expect, type Page } from '@playwright/test';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';
import { LAYOUT, UNITS_A, UNITS_B } from '../unit/games/fixtures';

const ada = DEMO_PEOPLE.find((p) => p.key === 'ada')!;
const jun = DEMO_PEOPLE.find((p) => p.key === 'jun')!; // holds the site-wide judge role

async function signIn(page: Page, email: string) {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/dashboard/);
}

/** A shared-tablet game played to its first move, through the table's API as the signed-in player. */
async function gameWithAMove(page: Page): Promise<{ gameId: number; moveSeq: number }> {
	const api = page.request;
	const post = async (path: string, data: unknown) => {
		const res = await api.post(path, { data });
		expect(res.ok(), `${path}: ${await res.text()}`).toBe(true);
		return res.json();
	};
	const ra = await post('/api/v1/rosters', { name: 'Desk test A', force: 'Test force', units: UNITS_A });
	const rb = await post('/api/v1/rosters', { name: 'Desk test B', force: 'Test force', units: UNITS_B });
	const created = await post('/api/v1/games', { title: `Desk e2e ${Date.now()}`, layout: LAYOUT, opponent: { mode: 'shared' }, rosterA: ra.roster?.id ?? ra.id, rosterB: rb.roster?.id ?? rb.id });
	const gameId = created.id as number;
	const g = (p: string) => `/api/v1/games/${gameId}${p}`;
	let seq = (await (await api.get(g(''))).json()).game.seq as number;
	for (const [path, body] of [
		['/deploy', { side: 'a', placements: [{ piece: 'a-u1-p1', at: { x: 10, y: 6 } }, { piece: 'a-u1-p2', at: { x: 12, y: 6 } }, { piece: 'a-u1-p3', at: { x: 14, y: 6 } }, { piece: 'a-u2-p1', at: { x: 20, y: 6 } }] }],
		['/end-turn', {}],
		['/deploy', { side: 'b', placements: [{ piece: 'b-u1-p1', at: { x: 10, y: 54, facing: 270 } }, { piece: 'b-u1-p2', at: { x: 13, y: 54, facing: 270 } }] }],
		['/end-turn', {}],
		['/moves', { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 11 }], 'a-u1-p2': [{ x: 12, y: 11 }], 'a-u1-p3': [{ x: 14, y: 11 }] } }]
	] as const) {
		seq = (await post(g(path), { seq, ...body })).seq;
	}
	return { gameId, moveSeq: seq };
}

test('a player asks for a ruling; a judge takes it, replays and adjusts the move; the player sees it live', async ({ browser }, info) => {
	const screens = (name: string) => `test-results/screens/judge-${name}-${info.project.name}.png`;
	const playerCtx = await browser.newContext();
	const judgeCtx = await browser.newContext();
	const player = await playerCtx.newPage();
	const judge = await judgeCtx.newPage();

	await signIn(player, ada.email);
	const { gameId, moveSeq } = await gameWithAMove(player);

	// The player asks, from the replay of the log, about the move.
	await player.goto(`/games/${gameId}/replay`);
	await expect(player.getByTestId('replay-position')).toContainText(`#${moveSeq}`);
	await expect(player.getByTestId('fold-agrees')).toBeVisible();
	// On a busy machine the first tap can land before the page has hydrated: tap until the form opens.
	const note = player.getByLabel('What should the judge look at?');
	await expect(async () => {
		await player.getByRole('button', { name: `Ask for a ruling on #${moveSeq}` }).click();
		await expect(note).toBeVisible({ timeout: 2000 });
	}).toPass({ timeout: 30_000 });
	await note.fill('The lead piece looks a little far forward');
	await player.getByRole('button', { name: 'Send the request' }).click();
	await expect(player.getByTestId('game-requests')).toContainText('open');
	const requests = await (await player.request.get(`/api/v1/rulings?game=${gameId}`)).json();
	const requestId = requests.requests[0].id as number;
	await player.screenshot({ path: screens('1-request-open'), fullPage: true });

	// The judge, in another browser context, takes it from the queue.
	await signIn(judge, jun.email);
	await judge.goto('/judge');
	const item = judge.getByTestId(`queue-item-${requestId}`);
	await expect(item).toContainText('The lead piece looks a little far forward');
	await expect(item).toContainText(`Entry #${moveSeq}`);
	await judge.screenshot({ path: screens('2-queue'), fullPage: true });
	await item.getByRole('button', { name: `Take #${requestId}` }).click();
	await expect(judge).toHaveURL(new RegExp(`/judge/${requestId}$`));
	await expect(judge.getByTestId('desk-status')).toContainText(`Taken by ${jun.displayName}`);
	// The player's list shows it taken once their page refreshes its data.
	await player.reload();
	await expect(player.getByTestId(`request-${requestId}`)).toContainText('taken');

	// Replay: the desk opens before the disputed move; step forward to after it.
	await expect(judge.getByTestId('replay-position')).toContainText(`#${moveSeq} — before`);
	await judge.getByRole('button', { name: 'Forward ▶' }).click();
	await expect(judge.getByTestId('replay-position')).toContainText(`#${moveSeq} — after`);
	const measures = judge.getByTestId('replay-measures');
	await expect(measures).toContainText('5.00 in of 6');
	await expect(judge.getByTestId('report-agrees')).toBeVisible();
	await judge.getByRole('button', { name: '◀ Back' }).click();
	await expect(judge.getByTestId('replay-position')).toContainText(`#${moveSeq} — before`);
	await judge.getByRole('button', { name: 'Forward ▶' }).click();
	await judge.screenshot({ path: screens('3-replay'), fullPage: true });

	// Adjust: the lead piece ends 1 in shorter; the engine checks it live.
	await judge.getByText('Adjust: place the pieces').click();
	const y = judge.getByLabel('a-u1-p1 y');
	await y.fill('10');
	await y.press('Tab');
	await expect(judge.getByTestId('adjust-verdict')).toContainText('legal');
	await expect(judge.getByTestId('ruling-form')).toContainText('4.00 in of 6');
	await judge.getByLabel('Reason (both players will read it)').fill('Measured again: the lead piece ended 1 in too far');
	await judge.screenshot({ path: screens('4-adjust'), fullPage: true });
	await judge.getByRole('button', { name: 'Record the ruling' }).click();
	await expect(judge.getByTestId('desk-done')).toContainText(`signed ${jun.displayName}`);

	// The player's open page hears of it live.
	await expect(player.getByTestId('latest-ruling')).toContainText(`Judge ${jun.displayName} adjusts #${moveSeq}`, { timeout: 15_000 });
	await expect(player.getByTestId(`request-${requestId}`)).toContainText('ruled');
	await expect(player.getByTestId('ruling-signature')).toContainText(jun.displayName);
	await player.screenshot({ path: screens('5-player-sees-ruling'), fullPage: true });

	await playerCtx.close();
	await judgeCtx.close();
});
