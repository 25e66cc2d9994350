// npm run bench:frame (or `-- bundle`) — the table page's JavaScript, gzipped: every JS file the
// play page of a 300-piece game loads in Chromium (entry, imported chunks, lazily loaded canvas
// code, workers), each gzipped at level 9 with node:zlib, summed; also the bytes as the server
// sent them (its own precompressed files). Target ≤ 200 KB gzipped. A measurement, not a test.
import { gzipSync } from 'node:zlib';
import { existsSync, readFileSync } from 'node:fs';
import type { Response } from '@playwright/test';
import { baseUrl, launch, setUpBenchGame, signIn, tablet } from './frame-browser';

const BASE = baseUrl('tests/bench/bundle-size.ts');
const TARGET_KB = 200;
/** The build's client manifest (set by the wrapper), to name hashed chunks by their source. */
const MANIFEST = process.env.BENCH_CLIENT_MANIFEST;
const sources = new Map<string, string>();
if (MANIFEST && existsSync(MANIFEST)) {
	const m = JSON.parse(readFileSync(MANIFEST, 'utf8')) as Record<string, { file: string; name?: string; src?: string }>;
	for (const [key, v] of Object.entries(m)) sources.set(`/${v.file}`, v.src ?? (v.name ? `${v.name} (${key})` : key));
}
const kb = (b: number) => `${(b / 1024).toFixed(2)} KB`;

interface Script {
	path: string;
	raw: number;
	gzip: number;
	served: number;
	encoding: string;
}

const browser = await launch();
try {
	const { context, page } = await tablet(browser, BASE);
	await signIn(page, 'ada');
	const { id } = await setUpBenchGame(page, `js-${Date.now().toString(36)}`);

	const seen = new Map<string, Promise<Script | null>>();
	const take = (res: Response) => {
		const url = new URL(res.url());
		const type = res.headers()['content-type'] ?? '';
		if (url.origin !== BASE || !(url.pathname.endsWith('.js') || type.includes('javascript'))) return;
		if (seen.has(url.pathname)) return;
		seen.set(
			url.pathname,
			(async () => {
				const body = await res.body();
				const sizes = await res.request().sizes();
				return {
					path: url.pathname,
					raw: body.length,
					gzip: gzipSync(body, { level: 9 }).length,
					served: sizes.responseBodySize,
					encoding: res.headers()['content-encoding'] ?? 'identity'
				};
			})().catch(() => null)
		);
	};
	// Context-wide, so requests of workers started by the page count too.
	context.on('response', take);
	await page.goto(`/games/${id}`, { waitUntil: 'networkidle' });
	await page.waitForFunction(() => document.querySelector('[data-testid="board-canvas"]')?.getAttribute('data-ready') === 'yes');
	// Whatever the screen loads on first use (picking a unit) belongs to the table page as well.
	await page.getByRole('button', { name: /^Ashfield file 3\b/ }).click();
	await page.waitForLoadState('networkidle');
	await page.waitForTimeout(500);

	const scripts = (await Promise.all(seen.values())).filter((s): s is Script => s !== null).sort((a, b) => b.gzip - a.gzip);
	const sum = (k: 'raw' | 'gzip' | 'served') => scripts.reduce((s, x) => s + x[k], 0);
	console.log(`play page (/games/${id}) loads ${scripts.length} JavaScript files:`);
	console.log(`  gzipped (level 9): ${kb(sum('gzip'))}; uncompressed ${kb(sum('raw'))}; as served ${kb(sum('served'))} (${[...new Set(scripts.map((s) => s.encoding))].join(', ')})`);
	console.log('  largest, gzipped:');
	for (const s of scripts.slice(0, 8)) console.log(`    ${kb(s.gzip).padStart(10)}  (${kb(s.raw)} raw)  ${s.path}${sources.has(s.path) ? `  ← ${sources.get(s.path)}` : ''}`);
	console.log(`target ≤ ${TARGET_KB} KB gzipped: ${sum('gzip') <= TARGET_KB * 1024 ? 'met' : 'NOT met'}`);
} finally {
	await browser.close();
}
