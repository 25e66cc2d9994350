// The engine runs in the browser on every drag frame and in the server: it may not import
// Svelte, Konva, SvelteKit's $app / $env, server modules or Node built-ins.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '../../../src/lib/referee');
const FORBIDDEN = [/^svelte(\/|$)/, /^konva(\/|$)/, /^svelte-konva/, /^\$app\//, /^\$env\//, /^\$lib\/server(\/|$)/, /^node:/, /(^|\/)server\//, /^(fs|path|os|crypto|child_process|http|https|url|util|stream|buffer)$/];

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? files(p) : /\.(ts|js|svelte)$/.test(name) ? [p] : [];
	});
}

/** Module specifiers of static imports, re-exports and dynamic imports. */
export function specifiers(source: string): string[] {
	const out: string[] = [];
	const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g;
	for (const m of source.matchAll(re)) out.push(m[1] ?? m[2] ?? m[3] ?? m[4]);
	return out;
}

export function forbidden(spec: string): boolean {
	return FORBIDDEN.some((re) => re.test(spec));
}

describe('the engine imports nothing from the browser UI, SvelteKit or the server', () => {
	it('the scanner catches each forbidden kind (so a pass means something)', () => {
		const sample = `import { x } from 'svelte/store';\nimport Konva from 'konva';\nimport { page } from '$app/stores';\nimport { env } from '$env/dynamic/private';\nimport { db } from '$lib/server/db';\nimport fs from 'node:fs';\nexport * from "../server/http";\nconst m = await import('node:path');`;
		expect(specifiers(sample).filter(forbidden)).toHaveLength(8);
		expect(forbidden('flatbush')).toBe(false);
		expect(forbidden('../schemas/check')).toBe(false);
	});
	it('src/lib/referee has no forbidden import', () => {
		const all = files(ROOT);
		expect(all.length).toBeGreaterThan(5);
		const bad = all.flatMap((f) => specifiers(readFileSync(f, 'utf8')).filter(forbidden).map((s) => `${f}: ${s}`));
		expect(bad).toEqual([]);
	});
});
