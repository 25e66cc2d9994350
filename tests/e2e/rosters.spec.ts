// A player builds a roster with a round, an oval and a hull unit (and a joined leader), sees
// the footprints previewed, saves, exports, imports the example CSV and a file with a bad row.
import { test, expect, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';

const mira = DEMO_PEOPLE.find((p) => p.key === 'mira')!;

async function signIn(page: Page) {
	await page.goto('/rosters');
	await expect(page).toHaveURL(/\/sign-in/);
	await page.getByLabel('E-mail').fill(mira.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/rosters$/);
}

test('build a roster with round, oval and hull units, export it, import files', async ({ page }, info) => {
	const shots = (name: string) => `test-results/screens/rosters-${name}-${info.project.name}.png`;
	const rosterName = `Mosslight ${info.project.name}`;
	await signIn(page);

	await page.getByTestId('roster-new').getByLabel('Roster name').fill(rosterName);
	await page.getByTestId('roster-new').getByLabel('Force').fill('The Mosslight Order');
	await page.getByRole('button', { name: 'Create roster' }).click();
	await expect(page).toHaveURL(/\/rosters\/\d+$/);
	await expect(page.getByRole('heading', { name: rosterName })).toBeVisible();

	const cards = page.getByTestId('unit-card');
	// Round base from the picker.
	await page.getByRole('button', { name: 'Add unit on a round base' }).click();
	await cards.nth(0).getByLabel('Unit name').fill('Lantern Guard');
	await cards.nth(0).getByLabel('Footprint', { exact: true }).first().selectOption({ label: 'Round 40 mm' });
	await cards.nth(0).getByLabel('Points', { exact: true }).first().fill('90');
	// Oval base of a size the picker does not offer.
	await page.getByRole('button', { name: 'Add unit on an oval base' }).click();
	await cards.nth(1).getByLabel('Unit name').fill('Fen Riders');
	await cards.nth(1).getByLabel('Class').selectOption('mounted');
	await cards.nth(1).getByLabel('Footprint', { exact: true }).selectOption({ label: 'Oval, other size…' });
	await cards.nth(1).getByLabel('Length (mm)').fill('80');
	await cards.nth(1).getByLabel('Width (mm)').fill('45');
	await cards.nth(1).getByLabel('Move allowance (in)').fill('10');
	await cards.nth(1).getByLabel('Points', { exact: true }).fill('75');
	// A hull typed as points, first with a mistake the editor must name.
	await page.getByRole('button', { name: 'Add unit with a hull' }).click();
	await cards.nth(2).getByLabel('Unit name').fill('Peat Crawler');
	const hull = cards.nth(2).getByLabel(/Hull points/);
	await hull.fill('0 0; 3 0');
	await expect(cards.nth(2).getByRole('alert')).toContainText('A hull needs at least 3 points (this one has 2)');
	await expect(page.getByRole('button', { name: 'Save roster' })).toBeDisabled();
	await hull.fill('-3 -1.5; 3 -1.5; 3.75 0; 3 1.5; -3 1.5');
	await cards.nth(2).getByLabel('Points', { exact: true }).fill('150');
	// A joined leader with a support ring.
	await cards.nth(0).getByRole('button', { name: 'Add a joined leader' }).click();
	await cards.nth(0).getByLabel('Leader name').fill('Wick-Captain Ysolde');
	await cards.nth(0).getByLabel('Grants a support ring').nth(1).check();
	await cards.nth(0).getByLabel('Ring label').fill('Steady flame');
	await cards.nth(0).getByLabel('Points', { exact: true }).nth(1).fill('40');

	// Every footprint is drawn, each with its own shape.
	await expect(cards.nth(0).getByTestId('footprint-preview').first()).toHaveAttribute('data-shape', 'round');
	await expect(cards.nth(1).getByTestId('footprint-preview')).toHaveAttribute('data-shape', 'oval');
	await expect(cards.nth(2).getByTestId('footprint-preview')).toHaveAttribute('data-shape', 'hull');
	await expect(cards.nth(1).getByTestId('footprint-preview')).toContainText('80 × 45 mm oval');
	await expect(cards.nth(2).getByTestId('footprint-preview')).toContainText('hull, 5 points, 6.75 × 3 in');
	await expect(page.getByTestId('roster-total')).toHaveText('355 points · 3 units · 12 pieces');

	await page.getByRole('button', { name: 'Save roster' }).click();
	await expect(page.getByRole('status').filter({ hasText: /✔ Saved/ })).toBeVisible();
	await page.screenshot({ path: shots('editor'), fullPage: true });

	// What was saved comes back after a reload.
	await page.reload();
	await expect(cards).toHaveCount(3);
	await expect(cards.nth(2).getByLabel('Unit name')).toHaveValue('Peat Crawler');
	await expect(cards.nth(0).getByLabel('Leader name')).toHaveValue('Wick-Captain Ysolde');

	// Export as CSV: a download with the units in it.
	const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
	expect(download.suggestedFilename()).toBe(`mosslight-${info.project.name}.csv`);
	const csv = readFileSync((await download.path())!, 'utf8');
	expect(csv).toContain(`# name: ${rosterName}`);
	expect(csv).toContain('Peat Crawler,,vehicle,no,6,hull,,,,-3 -1.5; 3 -1.5; 3.75 0; 3 1.5; -3 1.5,1,0,,,150');
	expect(csv).toContain('Wick-Captain Ysolde,Lantern Guard,foot,no,6,round,32,,,,1,1,6,Steady flame,40');

	// Import the example CSV from docs/.
	await page.getByRole('link', { name: '← Rosters' }).click();
	await page.getByLabel('Roster file').setInputFiles('docs/roster-example.csv');
	await page.getByRole('button', { name: 'Upload and import' }).click();
	await expect(page).toHaveURL(/\/rosters\/\d+\?imported=6$/);
	await expect(page.getByTestId('import-notice')).toHaveText('✔ Imported 6 rows.');
	await expect(page.getByRole('heading', { name: 'Saltmarsh patrol' })).toBeVisible();
	await expect(cards).toHaveCount(5);
	await expect(page.getByTestId('roster-total')).toHaveText('680 points · 5 units · 19 pieces');
	await expect(page.locator('[data-testid="footprint-preview"][data-shape="hull"]')).toHaveCount(1);
	await expect(page.locator('[data-testid="footprint-preview"][data-shape="oval"]')).toHaveCount(2);
	await page.screenshot({ path: shots('imported'), fullPage: true });

	// A file with one bad row: the problem is named by line, then only the good row is taken.
	await page.goto('/rosters');
	const bad = 'name,class,allowance_in,shape,diameter_mm,pieces,points\nBog Sprites,swarm,7,round,25,4,30\nStone Ghosts,spectre,5,round,32,3,40\n';
	await page.getByLabel('Roster file').setInputFiles({ name: 'sprites.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
	await page.getByTestId('roster-import').getByLabel('Name (if the file has none)').fill(`Sprites ${info.project.name}`);
	await page.getByRole('button', { name: 'Upload and import' }).click();
	const problems = page.getByTestId('import-problems');
	await expect(problems).toContainText('1 row of 2 has problems: nothing was saved');
	await expect(problems).toContainText('Line 3 (class): The class "spectre" is not one of foot, beast, swarm, mounted, vehicle, monster');
	await page.screenshot({ path: shots('import-problems'), fullPage: true });
	await page.getByRole('button', { name: 'Import only the 1 good row of 2' }).click();
	await expect(page).toHaveURL(/\/rosters\/\d+\?imported=1&skipped=1$/);
	await expect(page.getByTestId('import-notice')).toHaveText('✔ Imported 1 row; 1 with problems skipped.');
	await expect(page.getByRole('heading', { name: `Sprites ${info.project.name}` })).toBeVisible();
	await expect(cards).toHaveCount(1);
});
