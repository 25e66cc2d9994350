// Module resolve hook for seeds run under tsx (outside Vite): maps SvelteKit's `$lib/…` alias to
// src/lib/… so the seed can use the app's own entity modules. Registered by seeds/support/lib-alias.ts.
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

const LIB = fileURLToPath(new URL('../../src/lib/', import.meta.url));
const TRIES = ['', '.ts', '.js', '/index.ts', '/index.js'];

export async function resolve(specifier, context, next) {
	if (specifier.startsWith('$lib/')) {
		const base = LIB + specifier.slice('$lib/'.length);
		for (const t of TRIES) {
			const file = base + t;
			if (t === '' && !/\.[cm]?[jt]s$/.test(file)) continue;
			if (existsSync(file)) return next(pathToFileURL(file).href, context);
		}
	}
	return next(specifier, context);
}
