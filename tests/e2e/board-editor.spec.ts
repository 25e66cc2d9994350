// The board editor in Chromium at both tablet sizes: sign in, draw a block by dragging and
// place an objective by a touch tap, save under a name, reload, and find both again.
import { test, expect, type Page } from '@playwright/test';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';
import { fitView, toPx } from '../../src/lib/board/view';

const mira = DEMO_PEOPLE.find((p) => p.key === 'mira')!;

/** Page coordinates of a board point (inches), through the view the canvas reports. */
async function boardPoint(page: Page, x: number, y: number) {
	const canvas = page.getByTestId('board-canvas');
	const box = (await canvas.boundingBox())!;
	const [scale, offsetX, offsetY] = (await canvas.getAttribute('data-view'))!.split(' ').map(Number);
	const p = toPx({ scale, offsetX, offsetY }, { x, y });
	return { x: box.x + p.x, y: box.y + p.y };
}

test('draw a block and an objective, save, reload and see them', async ({ page }, info) => {
	const name = `Editor check ${info.project.name} ${Date.now().toString(36)}`;
	await page.goto('/layouts/new');
	await expect(page).toHaveURL(/\/sign-in/);
	await page.getByLabel('E-mail').fill(mira.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/layouts\/new/);
	await expect(page.getByTestId('board-canvas')).toHaveAttribute('data-ready', 'yes');
	await expect(page.getByTestId('layout-counts')).toContainText('0 blocks');
	// on opening, the whole 44 × 60 in table is fitted to the canvas
	const box = (await page.getByTestId('board-canvas').boundingBox())!;
	const fitted = fitView({ width: 44, depth: 60 }, { width: box.width, height: box.height });
	const [scale, offsetX, offsetY] = (await page.getByTestId('board-canvas').getAttribute('data-view'))!.split(' ').map(Number);
	// the canvas measures itself in whole pixels, the bounding box in fractions: within a pixel
	expect(Math.abs(scale - fitted.scale) * 60).toBeLessThan(1.5);
	expect(Math.abs(offsetX - fitted.offsetX)).toBeLessThan(1.5);
	expect(Math.abs(offsetY - fitted.offsetY)).toBeLessThan(1.5);

	// toolbar targets are finger-sized
	const blockTool = page.getByRole('button', { name: 'Block', exact: true });
	const size = (await blockTool.boundingBox())!;
	expect(size.height).toBeGreaterThanOrEqual(44);
	expect(size.width).toBeGreaterThanOrEqual(44);

	// a block from (10, 20) to (18, 26) in by a mouse drag
	await blockTool.click();
	const a = await boardPoint(page, 10, 20);
	const b = await boardPoint(page, 18, 26);
	await page.mouse.move(a.x, a.y);
	await page.mouse.down();
	await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 4 });
	await page.mouse.move(b.x, b.y, { steps: 4 });
	await page.mouse.up();
	await expect(page.getByTestId('item-panel')).toContainText('Block');
	await expect(page.getByLabel('Width (in)')).toHaveValue('8.00');
	await expect(page.getByLabel('Depth (in)')).toHaveValue('6.00');
	await page.getByLabel('Height (in)').fill('2.5');
	await page.getByLabel('Height (in)').press('Enter');

	// an objective at (30, 40) in by a finger tap
	await page.getByRole('button', { name: 'Objective', exact: true }).click();
	const o = await boardPoint(page, 30, 40);
	await page.touchscreen.tap(o.x, o.y);
	await expect(page.getByTestId('item-panel')).toContainText('At 30.00 in, 40.00 in');

	await page.getByRole('button', { name: 'Select', exact: true }).click();
	await page.getByTestId('item-panel').getByRole('button', { name: /Delete this/ }).waitFor();
	// tapping the felt clears the selection and shows the table panel again
	const empty = await boardPoint(page, 40, 8);
	await page.touchscreen.tap(empty.x, empty.y);
	await expect(page.getByTestId('layout-counts')).toContainText('1 blocks');
	await expect(page.getByTestId('layout-counts')).toContainText('1 objectives');

	await page.getByLabel('Layout name').fill(name);
	await page.getByLabel('Layout name').press('Tab');
	await page.getByRole('button', { name: /^⬇?\s*Save/ }).first().click();
	await expect(page.getByTestId('save-status')).toContainText(`Saved “${name}” (version 1)`);
	await expect(page).toHaveURL(/\/layouts\/\d+\/edit$/);
	await page.screenshot({ path: `test-results/screens/board-editor-saved-${info.project.name}.png` });

	await page.reload();
	await expect(page.getByTestId('board-canvas')).toHaveAttribute('data-ready', 'yes');
	await expect(page.getByLabel('Layout name')).toHaveValue(name);
	await expect(page.getByTestId('layout-counts')).toContainText('1 blocks');
	await expect(page.getByTestId('layout-counts')).toContainText('1 objectives');

	// the block is where it was drawn, with its height: tap its middle to select it
	const mid = await boardPoint(page, 14, 23);
	await page.touchscreen.tap(mid.x, mid.y);
	await expect(page.getByTestId('item-panel')).toContainText('Block');
	await expect(page.getByLabel('Height (in)')).toHaveValue('2.5');
	const obj = await boardPoint(page, 30, 40);
	await page.touchscreen.tap(obj.x, obj.y);
	await expect(page.getByTestId('item-panel')).toContainText('At 30.00 in, 40.00 in');
	await page.screenshot({ path: `test-results/screens/board-editor-reloaded-${info.project.name}.png` });

	// and it is in the list as Mira's own
	await page.goto('/layouts');
	await expect(page.getByTestId('my-layouts')).toContainText(name);
});

test('the demo table draws with every kind of terrain', async ({ page }, info) => {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(mira.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/dashboard/);
	await page.goto('/layouts/new?start=demo');
	await expect(page.getByTestId('board-canvas')).toHaveAttribute('data-ready', 'yes');
	await expect(page.getByTestId('layout-counts')).toContainText('3 blocks · 1 ruins · 2 other terrain · 4 objectives · 2 zones');
	// select the ruin by tapping its floor, then a wall is listed
	const ruin = await boardPoint(page, 22, 31);
	await page.touchscreen.tap(ruin.x, ruin.y);
	await expect(page.getByTestId('item-panel')).toContainText('Ruin “Old chapel”');
	await expect(page.getByTestId('item-panel')).toContainText('2 walls');
	await page.screenshot({ path: `test-results/screens/board-editor-demo-${info.project.name}.png` });
});
