// Bad input: fast-check generated and mutated bodies against every JSON API route of the built
// app over real HTTP (keep-alive, 16 in flight): huge numbers, NaN and Infinity as strings,
// deep nesting, long strings, wrong types, missing and extra keys, broken JSON text, and
// oversize bodies. No answer may be a 5xx; every refusal names its reason in the usual error
// shape, and is a 400/413/422 unless it is a refusal of the route's own state (listed per route:
// a stale seq 409, a foreign id 403/404, wrong credentials 401). Then the same for uploads:
// wrong types, oversize, names with path separators.
//
// FUZZ_RUNS sets the bodies per route: 10,000 for the full run (docs/reliability.md), fewer by
// default so that npm test stays quick.
import { spawnSync } from 'node:child_process';
import { rmSync, writeFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE, closeTestDb, testDb, type Client } from '../helpers';
import { call, forward, gameInMovePhase, person, roster, type Json, type Person, type PlayedGame } from './world';
import { LAYOUT, UNITS_A } from '../../unit/games/fixtures';

const RUNS = Number(process.env.FUZZ_RUNS ?? 500);
const IN_FLIGHT = 16;
const SEED = Number(process.env.FUZZ_SEED ?? 20261205);

// ---------------------------------------------------------------------------------------------
// Bodies

const nest = (depth: number, leaf: unknown = 1): unknown => {
	let v: unknown = leaf;
	for (let i = 0; i < depth; i++) v = i % 2 ? { a: v } : [v];
	return v;
};

/** Values no schema should take where it wants something else. */
const nasty: fc.Arbitrary<unknown> = fc.oneof(
	fc.constantFrom(1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, -(2 ** 53) - 2, 2 ** 31, -(2 ** 31) - 1, 1e-320, -0, 0.1 + 0.2, 4294967296.5),
	fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '0x1f', '', ' ', '\u0000', '\ud800', '../../etc/passwd', 'a\\..\\b', '<script>alert(1)</script>', "'; drop table users; --", '%00', '1'),
	fc.integer({ min: 1000, max: 300_000 }).map((n) => 'x'.repeat(n)),
	fc.integer({ min: 20, max: 600 }).map((d) => nest(d)), // deeper nesting comes as raw text below
	fc.string({ maxLength: 40 }),
	fc.boolean(),
	fc.constant(null),
	fc.integer(),
	fc.double(),
	fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 50 }),
	fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 8 }),
	fc.integer({ min: 1000, max: 20_000 }).map((n) => Array.from({ length: n }, (_, i) => i))
);

type Path = (string | number)[];
function paths(v: unknown, at: Path = [], out: Path[] = []): Path[] {
	out.push(at);
	if (Array.isArray(v)) v.forEach((x, i) => paths(x, [...at, i], out));
	else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) paths(x, [...at, k], out);
	return out;
}
function setAt(root: unknown, path: Path, op: 'set' | 'delete' | 'extra', value: unknown): unknown {
	if (path.length === 0) return op === 'extra' && root && typeof root === 'object' ? { ...(root as object), ['__extra']: value } : value;
	const copy = structuredClone(root) as Record<string | number, unknown>;
	let parent = copy;
	for (const k of path.slice(0, -1)) {
		// An earlier mutation may have replaced a container with a scalar: nothing left to reach.
		if (!parent || typeof parent !== 'object') return copy;
		parent = parent[k] as Record<string | number, unknown>;
	}
	if (!parent || typeof parent !== 'object') return copy;
	const last = path[path.length - 1];
	if (op === 'delete') {
		if (Array.isArray(parent)) parent.splice(Number(last), 1);
		else delete parent[last];
	} else if (op === 'extra' && parent[last] && typeof parent[last] === 'object' && !Array.isArray(parent[last])) {
		(parent[last] as Record<string, unknown>)['__proto__x'] = value;
	} else parent[last] = value;
	return copy;
}

/** The text of one body: a mutation of the valid template, random JSON, or broken JSON text. */
function bodies(template: unknown): fc.Arbitrary<string> {
	const all = paths(template);
	const mutated = fc
		.tuple(fc.integer({ min: 0, max: all.length - 1 }), fc.constantFrom('set', 'set', 'set', 'delete', 'extra'), nasty, fc.integer({ min: 1, max: 3 }))
		.map(([i, op, value, times]) => {
			let body = template;
			for (let t = 0; t < times; t++) body = setAt(body, all[(i + t * 7) % all.length], op as 'set', value);
			return JSON.stringify(body) ?? 'null';
		});
	const randomJson = fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v) ?? 'null');
	const text = JSON.stringify(template);
	const broken = fc.oneof(
		fc.integer({ min: 0, max: Math.max(0, text.length - 1) }).map((n) => text.slice(0, n)), // cut short
		fc.tuple(fc.integer({ min: 0, max: text.length }), fc.string({ minLength: 1, maxLength: 4 })).map(([n, s]) => text.slice(0, n) + s + text.slice(n)), // junk inside
		fc.constantFrom('{"seq": NaN}', '{"seq": Infinity}', '{"seq": 1e400}', '{"seq": -1e400}', '[' .repeat(5000) + ']'.repeat(5000), '{"a":'.repeat(3000) + '1' + '}'.repeat(3000), '{"__proto__": {"isAdmin": true}}', '{"constructor": {"prototype": {"x": 1}}}', '\uFEFF{}', 'null', 'true', '"just a string"', '0', ''),
		fc.constant(text.replace(/"seq":\d+/, '"seq":"1"').replace(/:(\d+)/, ':"$1"'))
	);
	return fc.oneof({ weight: 6, arbitrary: mutated }, { weight: 2, arbitrary: randomJson }, { weight: 2, arbitrary: broken });
}

// ---------------------------------------------------------------------------------------------
// Sending

let resets = 0;

interface Route {
	method: 'POST' | 'PUT';
	path: string;
	who: () => Client | null;
	template: unknown;
	/** refusals of the route's state (not of the body), besides 400/413/422 */
	stateful: number[];
}

/**
 * Anonymous fuzz comes from an address of its own (TEST-NET-3, RFC 5737): its failed sign-ins
 * may use up that address's sign-in budget, never the loopback one the browser tests sign in from.
 */
const ANONYMOUS_ADDRESS = '203.0.113.77';

async function send(c: Client | null, method: string, path: string, body: string | Uint8Array, headers: Record<string, string> = {}): Promise<{ status: number; text: string; type: string }> {
	const h: Record<string, string> = { 'content-type': 'application/json', accept: 'application/json', origin: BASE, ...headers };
	if (!c) h['x-forwarded-for'] ??= ANONYMOUS_ADDRESS;
	try {
		const res = c ? await c.send(method, path, body as string, h) : await fetch(BASE + path, { method, headers: h, body: body as BodyInit, redirect: 'manual' });
		return { status: res.status, text: await res.text(), type: res.headers.get('content-type') ?? '' };
	} catch {
		// A route that answers without reading a long body makes the server drop the kept-alive
		// connection, and fetch loses the answer: ask again on a fresh connection to read it.
		resets += 1;
		return sendLarge(c, method, path, body, headers);
	}
}

/**
 * node:http for bodies the server may cut off: it keeps the answer even when the server stops
 * reading and closes the connection mid-body (fetch then reports only "fetch failed").
 */
async function sendLarge(c: Client | null, method: string, path: string, body: string | Uint8Array, headers: Record<string, string> = {}): Promise<{ status: number; text: string; type: string }> {
	const bytes = typeof body === 'string' ? Buffer.from(body) : Buffer.from(body);
	const h: Record<string, string> = { 'content-type': 'application/json', accept: 'application/json', origin: BASE, 'content-length': String(bytes.length), ...headers };
	if (!c) h['x-forwarded-for'] ??= ANONYMOUS_ADDRESS;
	if (c) {
		h['x-forwarded-for'] = c.address;
		if (c.cookies.size) h.cookie = [...c.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
	}
	if (bytes.length > 512 * 1024) return viaCurl(method, path, bytes, h);
	return new Promise((resolve) => {
		let answered = false;
		const req = httpRequest(BASE + path, { method, headers: h, agent: false }, (res) => {
			answered = true;
			let text = '';
			res.setEncoding('utf8');
			res.on('data', (d) => (text += d));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, text, type: String(res.headers['content-type'] ?? '') }));
			res.on('error', () => resolve({ status: res.statusCode ?? 0, text, type: String(res.headers['content-type'] ?? '') }));
		});
		req.on('error', (e) => {
			if (!answered) resolve({ status: 0, text: `no answer: ${e.message}`, type: '' });
		});
		// Like a careful client: headers first, then the body in slices, stopping as soon as an
		// answer comes (a server that refuses early closes the connection on the unread rest).
		req.flushHeaders();
		void (async () => {
			await new Promise((r) => setTimeout(r, 20));
			for (let at = 0; at < bytes.length && !answered; at += 64 * 1024) {
				if (!req.write(bytes.subarray(at, at + 64 * 1024))) await new Promise((r) => req.once('drain', r));
				await new Promise((r) => setImmediate(r));
			}
			if (!answered) req.end();
		})().catch(() => undefined);
	});
}

/**
 * Large bodies go through curl: when the server refuses early and closes the connection, curl
 * still reads the answer, where Node's client reports a reset and drops it.
 */
function viaCurl(method: string, path: string, bytes: Buffer, headers: Record<string, string>): { status: number; text: string; type: string } {
	const file = join(tmpdir(), `fuzz-body-${process.pid}-${Math.random().toString(36).slice(2)}`);
	writeFileSync(file, bytes);
	try {
		const args = ['-s', '-X', method, '--data-binary', `@${file}`, '-w', '\n%{http_code} %{content_type}', BASE + path];
		for (const [k, v] of Object.entries(headers)) if (k !== 'content-length') args.push('-H', `${k}: ${v}`);
		const r = spawnSync('curl', args, { encoding: 'utf8', maxBuffer: 16 * 1024 * 1024 });
		const out = r.stdout ?? '';
		const cut = out.lastIndexOf('\n');
		const [code, type = ''] = out.slice(cut + 1).split(' ');
		return { status: Number(code) || 0, text: out.slice(0, cut), type };
	} finally {
		rmSync(file, { force: true });
	}
}

/** Runs `jobs` with a fixed number in flight. */
async function pool<T>(jobs: (() => Promise<T>)[], width = IN_FLIGHT): Promise<T[]> {
	const out: T[] = new Array(jobs.length);
	let next = 0;
	await Promise.all(
		Array.from({ length: width }, async () => {
			while (next < jobs.length) {
				const i = next++;
				out[i] = await jobs[i]();
			}
		})
	);
	return out;
}

function refusalMessage(r: { status: number; text: string; type: string }): string | null {
	if (r.type.includes('application/json')) {
		try {
			const m = JSON.parse(r.text)?.error?.message ?? JSON.parse(r.text)?.message;
			return typeof m === 'string' && m.trim() ? m : null;
		} catch {
			return null;
		}
	}
	// The server's own body-size cap answers before any route, in plain text.
	return r.status === 413 && r.text.trim() ? r.text.trim() : null;
}

interface Tally {
	sent: number;
	byStatus: Record<number, number>;
	problems: string[];
}

async function fuzzRoute(route: Route, runs: number): Promise<Tally> {
	const texts = fc.sample(bodies(route.template), { numRuns: runs, seed: SEED });
	const tally: Tally = { sent: 0, byStatus: {}, problems: [] };
	const allowed = new Set([200, 201, 400, 413, 422, ...route.stateful]);
	await pool(
		texts.map((text) => async () => {
			const r = await send(route.who(), route.method, route.path, text);
			tally.sent += 1;
			tally.byStatus[r.status] = (tally.byStatus[r.status] ?? 0) + 1;
			const bad = r.status >= 500 || !allowed.has(r.status) || (r.status >= 400 && !refusalMessage(r));
			if (bad && tally.problems.length < 5) tally.problems.push(`${r.status} for ${text.slice(0, 200)} → ${r.text.slice(0, 200)}`);
			else if (bad) tally.problems.push('…');
		})
	);
	return tally;
}

// ---------------------------------------------------------------------------------------------
// The world the routes act on

let game: PlayedGame;
let fuzzer: Person;
let rosterId: number;
let layoutId: number;
const figures: Record<string, Tally> = {};

beforeAll(async () => {
	const a = await person('fuzz-a', ['admin', 'judge']);
	const b = await person('fuzz-b');
	game = await gameInMovePhase(a, b, 'Fuzz game');
	fuzzer = a;
	rosterId = await roster(a.id, 'Fuzz list', UNITS_A);
	const layout = await call(a.c, 'POST', '/api/v1/layouts', { doc: LAYOUT });
	expect(layout.status).toBe(201);
	layoutId = layout.json.layout.id;
}, 60_000);

afterAll(async () => {
	const summary = Object.entries(figures).map(([k, t]) => `${k}: ${t.sent} bodies, ${JSON.stringify(t.byStatus)}`);
	console.log(`fuzz (${RUNS} per route, seed ${SEED}; ${resets} answers read again on a fresh connection):\n${summary.join('\n')}`);
	await closeTestDb();
});

function routes(): Route[] {
	const me = () => fuzzer.c;
	const anon = () => null;
	const g = (p: string) => `/api/v1/games/${game.id}${p}`;
	const seq = game.seq;
	const gameRoute = (p: string, template: unknown): Route => ({ method: 'POST', path: g(p), who: me, template, stateful: [403, 409] });
	return [
		{
			method: 'POST',
			path: '/api/v1/check',
			who: anon,
			template: {
				board: { width: 44, depth: 60, terrain: [{ id: 't1', kind: 'block', outline: [[20, 20], [24, 20], [24, 24], [20, 24]], height: 2 }] },
				pieces: [
					{ id: 'a1', side: 'red', unit: 'u1', class: 'foot', allowance: 6, footprint: { shape: 'round', diameterMm: 25.4 }, at: { x: 5, y: 5, facing: 0 } },
					{ id: 'c1', side: 'blue', unit: 'u2', class: 'foot', allowance: 6, footprint: { shape: 'oval', lengthMm: 60, widthMm: 35 }, at: { x: 30, y: 30, facing: 0 } }
				],
				move: { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8, y: 9 }] } }
			},
			stateful: []
		},
		{ method: 'POST', path: '/api/v1/session', who: anon, template: { email: 'nobody@example.test', password: 'not the password' }, stateful: [401, 429] },
		{ method: 'POST', path: '/api/v1/games', who: me, template: { title: 'Fuzzed', layout: LAYOUT, opponent: { mode: 'shared' }, rosterA: rosterId, firstSide: 'a' }, stateful: [] },
		{ method: 'POST', path: '/api/v1/games/join', who: me, template: { token: 'abcdefghijklmnopqrstuvwxyz234567' }, stateful: [404, 409, 410] },
		gameRoute('/moves', { seq, unit: 'a-u1', kind: 'move', paths: forward(9) }),
		gameRoute('/accept', { seq }),
		gameRoute('/take-back', { seq }),
		gameRoute('/end-turn', { seq }),
		gameRoute('/roll', { seq, unit: 'a-u2' }),
		gameRoute('/deploy', { seq, side: 'a', placements: [{ piece: 'a-u1-p1', at: { x: 10, y: 6, facing: 90 } }] }),
		gameRoute('/roster', { seq, side: 'a', rosterId }),
		gameRoute('/ruling-request', { seq, note: 'Please look at this' }),
		{ method: 'POST', path: '/api/v1/layouts', who: me, template: { doc: LAYOUT }, stateful: [404] },
		{ method: 'PUT', path: `/api/v1/layouts/${layoutId}`, who: me, template: { doc: LAYOUT, version: 1 }, stateful: [409] },
		{ method: 'POST', path: '/api/v1/rosters', who: me, template: { name: 'Fuzz roster', force: 'Fuzzers', units: UNITS_A }, stateful: [] },
		{ method: 'PUT', path: `/api/v1/rosters/${rosterId}`, who: me, template: { name: 'Fuzz roster', force: 'Fuzzers', units: UNITS_A }, stateful: [] },
		{ method: 'POST', path: '/api/v1/rosters/import', who: me, template: { fileId: '00000000-0000-4000-8000-000000000000', onlyGoodRows: false, name: 'x' }, stateful: [403, 404] },
		{ method: 'POST', path: '/api/v1/rulings', who: me, template: { gameId: game.id, seq, moveSeq: 1, note: 'Look', photos: [] }, stateful: [403, 404, 409] },
		{ method: 'POST', path: '/api/v1/rulings/999999/take', who: me, template: {}, stateful: [403, 404, 409] },
		{ method: 'POST', path: '/api/v1/rulings/999999/ruling', who: me, template: { outcome: 'adjust', reason: 'Moved back', positions: { 'a-u1-p1': { x: 10, y: 6 } }, allowIllegal: false }, stateful: [403, 404, 409] },
		{ method: 'POST', path: '/api/v1/admin/backup', who: me, template: { format: 'inchwarden-backup', version: 1, exportedAt: '2026-12-05T10:00:00Z', scope: { kind: 'game', id: 999999 }, tables: { game_moves: [{ game_id: 999999, seq: 1, kind: 'accept', actor: 'nobody', payload: {} }] }, objects: {} }, stateful: [] },
		{ method: 'POST', path: '/api/v1/payments/webhook', who: anon, template: { id: 'evt_1', type: 'checkout.session.completed', data: { object: { id: 'cs_1' } } }, stateful: [] }
	];
}

describe('every JSON API route takes bad bodies without a 5xx', () => {
	it('lists the routes it fuzzes: every POST/PUT JSON route of /api/v1', async () => {
		const { readdirSync, readFileSync, statSync } = await import('node:fs');
		const found: string[] = [];
		const walk = (dir: string) => {
			for (const f of readdirSync(dir)) {
				const p = `${dir}/${f}`;
				if (statSync(p).isDirectory()) walk(p);
				else if (f === '+server.ts') for (const m of readFileSync(p, 'utf8').matchAll(/export const (POST|PUT|PATCH)\b/g)) found.push(`${m[1]} ${p.slice('src/routes'.length, -'/+server.ts'.length)}`);
			}
		};
		walk('src/routes/api/v1');
		// Uploads take bytes, not JSON: they have their own test below.
		const uploads = ['POST /api/v1/files', 'POST /api/v1/rulings/photos'];
		// The route list names concrete ids; compare the shapes.
		const shape = (s: string) => s.replace(/\/\d+/g, '/[id]').replace(/\[id\]\//, '[id]/');
		const fuzzed = new Set(routes().map((r) => shape(`${r.method} ${r.path}`)));
		const missing = found.filter((f) => !uploads.includes(f) && !fuzzed.has(f));
		expect(missing).toEqual([]);
	});

	for (const name of ['check', 'session', 'games', 'games/join', 'moves', 'accept', 'take-back', 'end-turn', 'roll', 'deploy', 'roster', 'ruling-request', 'layouts', 'layouts/[id]', 'rosters', 'rosters/[id]', 'rosters/import', 'rulings', 'rulings/[id]/take', 'rulings/[id]/ruling', 'admin/backup', 'payments/webhook']) {
		it(`${name}: ${RUNS} bodies`, async () => {
			const route = routes().find((r) => r.path.replace(/\/\d+/g, '/[id]').replace(/^\/api\/v1\/(games\/\[id\]\/)?/, '') === name)!;
			expect(route, name).toBeDefined();
			const t = await fuzzRoute(route, RUNS);
			figures[`${route.method} ${route.path}`] = t;
			expect(t.sent).toBe(RUNS);
			expect(t.problems, t.problems.join('\n')).toEqual([]);
		}, 600_000);
	}

	it('oversize bodies: 413 (or 400) with a message on every JSON route, and the app stays up', async () => {
		const big = '{"pad":"' + 'x'.repeat(7 * 1024 * 1024) + '"}';
		const mid = '{"pad":"' + 'x'.repeat(1100 * 1024) + '"}';
		for (const route of routes()) {
			for (const text of [big, mid]) {
				const r = await sendLarge(route.who(), route.method, route.path, text);
				expect(r.status, `${route.method} ${route.path}: ${r.text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
				expect(r.status, `${route.method} ${route.path}`).toBeLessThan(500);
				expect([400, 413, 422, ...route.stateful], `${route.method} ${route.path}`).toContain(r.status);
				expect(refusalMessage(r), `${route.method} ${route.path}: ${r.text.slice(0, 200)}`).not.toBeNull();
			}
		}
		expect((await send(null, 'POST', '/api/v1/check', '{}')).status).toBe(400);
	}, 120_000);
});

describe('uploads take bad files without a 5xx', () => {
	const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');
	const names = ['../../etc/passwd', '..\\..\\boot.ini', '/abs/path.png', 'a/b/c.png', 'nul\u0000byte.png', 'x'.repeat(5000) + '.png', 'CON', '.hidden', 'ünïcödé ✓.png', '%2e%2e%2fup.png', ''];
	const contents: [string, Uint8Array | string][] = [
		['png', PNG],
		['png header then junk', Buffer.concat([PNG.subarray(0, 16), Buffer.from('not really an image')])],
		['html claiming png', '<html><script>alert(1)</script></html>'],
		['svg', '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'],
		['empty', ''],
		['random bytes', Buffer.from(Array.from({ length: 2048 }, (_, i) => (i * 7919) % 256))],
		['csv', 'name,class\nLantern Guard,foot\n'],
		['oversize', Buffer.alloc(6 * 1024 * 1024 + 10, 1)]
	];

	async function check(r: { status: number; text: string; type: string }, what: string): Promise<void> {
		expect(r.status, `${what}: ${r.text.slice(0, 200)}`).toBeLessThan(500);
		if (r.status >= 400) {
			expect([400, 403, 413, 415, 422], what).toContain(r.status);
			expect(refusalMessage(r), `${what}: ${r.text.slice(0, 200)}`).not.toBeNull();
		}
	}

	it('evidence photos (raw bytes + X-File-Name): wrong types refused (415/400), oversize 413, names cleaned', async () => {
		const seen: Record<number, number> = {};
		for (const [label, bytes] of contents) {
			for (const name of names) {
				const headers: Record<string, string> = { 'content-type': label === 'png' ? 'image/png' : 'image/png' };
				if (name && !/[\u0000-\u001f\u0080-\uffff]/.test(name)) headers['x-file-name'] = name;
				else if (name) headers['x-file-name'] = encodeURIComponent(name);
				const r = await sendLarge(fuzzer.c, 'POST', '/api/v1/rulings/photos', bytes, headers);
				seen[r.status] = (seen[r.status] ?? 0) + 1;
				await check(r, `photo ${label} named ${name.slice(0, 30)}`);
				if (label === 'png') expect(r.status).toBe(201);
				// Everything but the real PNG is refused, a PNG start followed by junk included (the
				// sniffer reads the picture's header, not only its signature).
				if (!['png', 'oversize'].includes(label)) expect(r.status, label).not.toBe(201);
				if (label === 'oversize') expect(r.status).toBe(413);
			}
		}
		figures['POST /api/v1/rulings/photos'] = { sent: contents.length * names.length, byStatus: seen, problems: [] };
	}, 120_000);

	it('files (multipart and raw, both purposes): no 5xx, refusals with a message, stored names without path separators', async () => {
		const seen: Record<number, number> = {};
		for (const purpose of ['roster-import', 'unit-picture', 'nonsense', '']) {
			for (const [label, bytes] of contents) {
				for (const name of names) {
					const form = new FormData();
					form.set('purpose', purpose);
					form.set('file', new Blob([bytes as BlobPart]), name || 'blob');
					const encoded = new Request(BASE, { method: 'POST', body: form });
					const r = await sendLarge(fuzzer.c, 'POST', '/api/v1/files', new Uint8Array(await encoded.arrayBuffer()), { 'content-type': encoded.headers.get('content-type')! });
					seen[r.status] = (seen[r.status] ?? 0) + 1;
					await check(r, `multipart ${purpose} ${label} ${name.slice(0, 30)}`);
					if (r.status === 201) expect(JSON.parse(r.text).file.fileName ?? '').not.toMatch(/[/\\\u0000]/);
				}
				const raw = await sendLarge(fuzzer.c, 'POST', `/api/v1/files?purpose=${encodeURIComponent(purpose)}`, bytes, { 'content-type': 'application/octet-stream', 'x-file-name': '../../x.csv' });
				seen[raw.status] = (seen[raw.status] ?? 0) + 1;
				await check(raw, `raw ${purpose} ${label}`);
			}
		}
		figures['POST /api/v1/files'] = { sent: Object.values(seen).reduce((a, b) => a + b, 0), byStatus: seen, problems: [] };
		// Whatever got stored: names without separators, keys of our own making.
		const rows = await testDb()('uploads').where({ owner_id: fuzzer.id });
		expect(rows.length).toBeGreaterThan(0);
		for (const u of rows) {
			expect(u.file_name).not.toMatch(/[/\\\u0000]/);
			expect(u.key).toBe(`u/${fuzzer.id}/${u.id}`);
		}
	}, 300_000);
});
