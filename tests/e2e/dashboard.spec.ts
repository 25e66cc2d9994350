// A demo player signs in in Chromium and sees the dashboard (both tablet orientations).
import { test, expect } from '@playwright/test';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_CLUB } from '../../seeds/data/demo';

const ada = DEMO_PEOPLE.find((p) => p.key === 'ada')!;

test('a demo player signs in and sees the dashboard', async ({ page }, info) => {
	await page.goto('/dashboard');
	// The guarded group sends a signed-out visitor to the sign-in page first.
	await expect(page).toHaveURL(/\/sign-in/);
	await page.getByLabel('E-mail').fill(ada.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();

	await expect(page).toHaveURL(/\/dashboard/);
	await expect(page.getByRole('heading', { name: 'My games' })).toBeVisible();
	await expect(page.getByTestId('my-clubs')).toContainText(DEMO_CLUB.name);
	await expect(page.getByTestId('my-rosters')).toContainText('Copperline first muster');
	await page.screenshot({ path: `test-results/screens/dashboard-${info.project.name}.png`, fullPage: true });

	await page.getByRole('button', { name: 'Sign out' }).click();
	await page.goto('/dashboard');
	await expect(page).toHaveURL(/\/sign-in/);
});
