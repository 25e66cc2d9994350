// An event end to end in Chromium: the organiser creates it, two players enter and pay on the
// local payment fake's page, the organiser pairs and publishes round 1, one player reports the
// result, the other confirms it, and the standings show it. Screenshots at each step.
import { test, expect, type Browser, type Page } from '@playwright/test';
import { DEMO_CLUB, DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';

const person = (key: string) => DEMO_PEOPLE.find((p) => p.key === key)!;
const priya = person('priya');
const ada = person('ada');
const tomas = person('tomas');

async function signedIn(browser: Browser, who: { email: string }): Promise<Page> {
	// One context per person (their own cookies), at the project's tablet size.
	const context = await browser.newContext({
		baseURL: process.env.TEST_BASE_URL ?? 'http://127.0.0.1:3100',
		viewport: test.info().project.use.viewport ?? undefined,
		hasTouch: true
	});
	const page = await context.newPage();
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(who.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/dashboard/);
	return page;
}

const shot = (page: Page, name: string) => page.screenshot({ path: `test-results/screens/events-${name}-${test.info().project.name}.png`, fullPage: true });

test('an organiser runs a paid event: entries paid on the provider’s page, round 1 published, a result confirmed, standings', async ({ browser }, info) => {
	const eventName = `Fennmoor Winter Muster (${info.project.name})`;

	// The organiser creates the event from the club page.
	const org = await signedIn(browser, priya);
	await org.goto('/clubs');
	await org.getByRole('link', { name: DEMO_CLUB.name }).click();
	await org.getByRole('link', { name: '+ New event' }).click();
	await org.getByLabel('Event name').fill(eventName);
	await org.getByLabel('Venue').fill('Fennmoor Guild Hall');
	await org.getByLabel('Rounds').fill('2');
	await org.getByLabel('Capacity (players)').fill('8');
	await org.getByLabel('Entry fee (0 for free)').fill('5.00');
	await org.getByRole('group', { name: 'Judges (from the club)' }).getByText(person('jun').displayName).click();
	await shot(org, '1-new-event');
	await org.getByRole('button', { name: 'Create the event' }).click();
	await expect(org.getByRole('heading', { name: eventName })).toBeVisible();
	await expect(org.getByTestId('event-facts')).toContainText('entry fee: 5.00 EUR');
	const eventUrl = org.url();

	// Two players enter and pay on the payment fake's page.
	for (const who of [ada, tomas]) {
		const p = await signedIn(browser, who);
		await p.goto(eventUrl);
		await expect(p.getByTestId('payment-caution')).toContainText('Money is taken here');
		if (who === ada) await shot(p, '2-register-with-caution');
		await p.getByRole('button', { name: 'Enter and pay 5.00 EUR' }).click();
		await expect(p.getByRole('heading', { name: 'Test checkout' })).toBeVisible();
		await expect(p.getByTestId('amount')).toHaveText('5.00 EUR');
		if (who === ada) await shot(p, '3-provider-pay-page');
		await p.getByRole('button', { name: 'Pay 5.00 EUR' }).click();
		await expect(p.getByTestId('payment-result')).toContainText('Paid — you are entered');
		if (who === ada) await shot(p, '4-paid');
		await p.getByRole('link', { name: 'Back to the event' }).click();
		await expect(p.getByTestId('my-entry')).toContainText('You are entered');
		await p.context().close();
	}

	// The organiser sees both paid, pairs round 1 as a draft and publishes it.
	await org.goto(eventUrl);
	await expect(org.getByTestId('entries').getByTestId('entry-state')).toHaveText(['✓ entered · payment paid', '✓ entered · payment paid']);
	await org.getByRole('button', { name: 'Pair round 1' }).click();
	await expect(org.getByTestId('round-1')).toContainText('draft, not yet published');
	await shot(org, '5-draft-round');
	await org.getByRole('button', { name: 'Publish round 1' }).click();
	await expect(org.getByTestId('notice')).toContainText('Round 1 published: 1 games started, 2 players e-mailed');
	await expect(org.getByTestId('round-1').getByRole('link', { name: 'Open the game' })).toBeVisible();

	// Ada reports a win; Tomas confirms it.
	const a = await signedIn(browser, ada);
	await a.goto(eventUrl);
	const reportForm = a.getByTestId('round-1').locator('[data-testid^="report-form-"]');
	await reportForm.getByLabel('Outcome').selectOption({ label: `${ada.displayName} won` });
	await reportForm.getByLabel(`Value ${ada.displayName}`).fill('6');
	await reportForm.getByLabel(`Value ${tomas.displayName}`).fill('2');
	await reportForm.getByRole('button', { name: 'Report the result' }).click();
	await expect(a.getByTestId('round-1').getByTestId('result')).toContainText('awaiting confirmation');

	const t = await signedIn(browser, tomas);
	await t.goto(eventUrl);
	await expect(t.getByTestId('round-1').getByTestId('result')).toContainText(`reported: ${ada.displayName} won 6–2`);
	await t.getByRole('button', { name: 'Confirm this result' }).click();
	await expect(t.getByTestId('round-1').getByTestId('result')).toContainText(`✓ ${ada.displayName} won 6–2`);

	// The standings show it: Ada first on 3 points, +4 on objective value.
	const first = t.getByTestId('standings').locator('tbody tr').first();
	await expect(first).toContainText(ada.displayName);
	await expect(first.locator('td').nth(5)).toHaveText('3');
	await expect(first.locator('td').nth(7)).toHaveText('+4');
	await shot(t, '6-standings');

	await org.goto(eventUrl);
	await expect(org.getByTestId('standings').locator('tbody tr').first()).toContainText(ada.displayName);
	await shot(org, '7-organiser-view');
	await Promise.all([org.context().close(), a.context().close(), t.context().close()]);
});
