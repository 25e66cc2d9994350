// The reach map on the play screen, in Chromium at both tablet sizes: Ada plays both sides on one
// tablet; she picks a piece of her Signal Mast Crew and its reach is shaded (the legend gives its
// area), shows every piece's map and hides the shading; she drags the piece beyond its 5 in, sees
// the finder's route and its cost while dragging, the live check's spacing warning, and is offered
// the nearest legal spot; she takes it, brings the unit-mates up, submits, and the server accepts.
// The table is set up through the API (the UI's deployment is play.spec's job). Screenshots go to
// test-results/screens/.
import { test, expect, type Page } from '@playwright/test';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/data/demo';
import { toPx } from '../../src/lib/board/view';

const ada = DEMO_PEOPLE.find((p) => p.key === 'ada')!;

/** An invented open table: zones in 12 in strips at both ends, one objective mid-table. */
function openTable(name: string) {
	return {
		schemaVersion: 1,
		name,
		board: { width: 44, depth: 60 },
		terrain: [],
		objectives: [{ id: 'cairn', x: 30, y: 30, name: 'Cairn' }],
		zones: [
			{ id: 'zone-a', side: 'a', outline: [[0, 0], [44, 0], [44, 12], [0, 12]] },
			{ id: 'zone-b', side: 'b', outline: [[0, 48], [44, 48], [44, 60], [0, 60]] }
		]
	};
}

async function boardPoint(page: Page, x: number, y: number) {
	await page.evaluate(() => window.scrollTo(0, 0));
	const canvas = page.getByTestId('board-canvas');
	const box = (await canvas.boundingBox())!;
	const [scale, offsetX, offsetY] = (await canvas.getAttribute('data-view'))!.split(' ').map(Number);
	const p = toPx({ scale, offsetX, offsetY }, { x, y });
	return { x: box.x + p.x, y: box.y + p.y };
}

test('pick a piece, see its reach, drag beyond it, take the nearest legal spot, and the server accepts', async ({ page }, info) => {
	test.setTimeout(120_000);
	const tag = `${info.project.name} ${Date.now().toString(36)}`;
	const shot = (name: string) => `test-results/screens/reach-${name}-${info.project.name}.png`;

	await page.goto('/games');
	await page.getByLabel('E-mail').fill(ada.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/games$/);

	// --- the table through the API: both sides Ada's, her Signal Mast Crew (3 × 40 mm, 5 in) in a row
	const api = async (path: string, data: unknown, want: number) => {
		const r = await page.request.post(path, { data });
		expect(r.status(), await r.text()).toBe(want);
		return r.json();
	};
	const layout = await api('/api/v1/layouts', { doc: openTable(`Open ground ${tag}`) }, 201);
	const list = (await (await page.request.get('/api/v1/rosters')).json()).rosters as { id: number; name: string }[];
	const roster = list.find((r) => r.name === 'Copperline first muster')!;
	const { id } = await api('/api/v1/games', { title: `Reach ${tag}`, layoutId: layout.layout.id, opponent: { mode: 'shared' } }, 201);
	const g = (p: string) => `/api/v1/games/${id}${p}`;
	let seq = 0;
	const step = async (p: string, body: Record<string, unknown>) => (seq = (await api(g(p), { seq, ...body }, 200)).seq);
	await step('/roster', { side: 'a', rosterId: roster.id });
	await step('/roster', { side: 'b', rosterId: roster.id });
	// 40 mm bases 2 in apart: 0.43 in gaps, within the 2 in spacing
	await step('/deploy', { side: 'a', placements: [18, 20, 22].map((x, i) => ({ piece: `a-u2-p${i + 1}`, at: { x, y: 6, facing: 90 } })) });
	await step('/end-turn', {});
	await step('/deploy', { side: 'b', placements: [{ piece: 'b-u2-p1', at: { x: 20, y: 54, facing: 270 } }] });
	await step('/end-turn', {});

	await page.goto(`/games/${id}`);
	await expect(page.getByTestId('live-status')).toContainText('live');
	await expect(page.getByTestId('board-canvas')).toHaveAttribute('data-ready', 'yes');
	await expect(page.getByTestId('active-side')).toContainText("Side A's turn");
	await page.getByRole('button', { name: /Signal Mast Crew/ }).click();
	// zoom in about the unit (four wheel steps, ×1.35 each) and pan it to the board's middle, so
	// the screenshots read; every later point is converted through the view the canvas reports
	const about = await boardPoint(page, 20, 8);
	await page.mouse.move(about.x, about.y);
	for (let i = 0; i < 4; i++) await page.mouse.wheel(0, -200);
	await expect.poll(async () => Number((await page.getByTestId('board-canvas').getAttribute('data-view'))!.split(' ')[0])).toBeGreaterThan(20);
	const box = (await page.getByTestId('board-canvas').boundingBox())!;
	const now = await boardPoint(page, 20, 8);
	const empty = await boardPoint(page, 26, 14);
	await page.mouse.move(empty.x, empty.y);
	await page.mouse.down();
	await page.mouse.move(empty.x + (box.x + box.width / 2 - now.x), empty.y + (box.y + box.height / 2 - now.y), { steps: 8 });
	await page.mouse.up();

	// --- pick a-u2-p2 up: its reach is mapped off the main thread and shaded --------------------
	const p2 = await boardPoint(page, 20, 6);
	await page.mouse.click(p2.x, p2.y);
	const legend = page.getByTestId('reach-legend');
	await expect(legend).toHaveAttribute('data-reach-piece', 'a-u2-p2');
	await expect(legend).toContainText('reach of a-u2-p2');
	// π·5² = 78.54 sq in, less the bites of its two unit-mates 2 in to either side (its own base
	// and theirs overlap within 1.58 in of them) and the strip behind it that the table's edge cuts
	const area = Number(await legend.getAttribute('data-reach-area'));
	expect(area).toBeGreaterThan(40);
	expect(area).toBeLessThan(Math.PI * 25);
	await expect(legend).toHaveAttribute('data-reach-shown', 'yes');
	await page.screenshot({ path: shot('picked'), fullPage: true });

	await page.getByTestId('toggle-unit-maps').click();
	await expect(page.getByTestId('unit-maps')).toContainText("the reach of 3 of the unit's pieces");
	await page.screenshot({ path: shot('unit-maps'), fullPage: true });
	await page.getByTestId('toggle-unit-maps').click();
	await page.getByTestId('toggle-reach').click();
	await expect(legend).toHaveAttribute('data-reach-shown', 'no');
	await expect(legend).toContainText('Hidden');
	await page.getByTestId('toggle-reach').click();
	await expect(legend).toHaveAttribute('data-reach-shown', 'yes');

	// --- drag it: the route to the finger and its cost, then on beyond the reach ----------------
	const start = await boardPoint(page, 20, 6);
	const within = await boardPoint(page, 20, 10);
	const beyond = await boardPoint(page, 20, 15);
	await page.mouse.move(start.x, start.y);
	await page.mouse.down();
	await page.mouse.move(within.x, within.y, { steps: 10 });
	await expect(page.getByTestId('route-readout')).toContainText(/Shortest legal route for a-u2-p2: (3\.9\d|4\.0\d) in of 5/);
	await page.screenshot({ path: shot('dragging'), fullPage: true });
	await page.mouse.move(beyond.x, beyond.y, { steps: 10 });
	await page.mouse.up();
	// 9 in straight ahead for a 5 in piece: the nearest legal end is 5 in out, about 4 in back
	const offer = page.getByTestId('nearest-offer');
	await expect(offer).toHaveText(/^Move to nearest legal spot \((3\.9\d|4\.0\d) in away\)$/);
	await expect(page.getByTestId('live-verdict')).toContainText('Not legal');
	await expect(page.getByTestId('spacing-warning')).toContainText('Spacing breaks at a-u2-p2');
	await page.screenshot({ path: shot('offer'), fullPage: true });

	await offer.click();
	await expect(offer).toHaveCount(0);
	// the path is now the finder's route: within the allowance, and the check agrees
	await expect(page.getByTestId('allowance-readout')).toContainText(/a-u2-p2: (4\.9\d|5\.0\d) in of 5/);
	await expect(page.getByTestId('findings').filter({ hasText: 'path costs' })).toHaveCount(0);
	// the unit-mates are still 5 in behind: the engine's spacing verdict, in words
	await expect(page.getByTestId('spacing-warning')).toContainText('Spacing breaks');

	// --- bring the unit-mates up to 4.5 in ahead, 2.06 in from a-u2-p2's end (0.49 in gaps) ---
	for (const x of [18, 22]) {
		const from = await boardPoint(page, x, 6);
		const to = await boardPoint(page, x, 10.5);
		await page.mouse.move(from.x, from.y);
		await page.mouse.down();
		await page.mouse.move(to.x, to.y, { steps: 10 });
		await page.mouse.up();
	}
	await expect(page.getByTestId('live-verdict')).toContainText('Legal so far');
	await expect(page.getByTestId('spacing-warning')).toHaveCount(0);
	await expect(page.getByTestId('nearest-offer')).toHaveCount(0);
	await page.screenshot({ path: shot('legal'), fullPage: true });

	await page.getByRole('button', { name: 'Submit move' }).click();
	await expect(page.getByTestId('pending-move')).toContainText('awaits acceptance');
	await expect(page.getByTestId('move-log')).toContainText('Signal Mast Crew — Move, legal');
	const state = await (await page.request.get(g(''))).json();
	const moved = state.game.state.pieces.find((p: { id: string }) => p.id === 'a-u2-p2');
	expect(moved.at.y).toBeGreaterThan(10.9);
	expect(moved.at.y).toBeLessThan(11.05);
	await page.screenshot({ path: shot('accepted-by-server'), fullPage: true });
});
