// Processes of our own for the fault tests: a second app server (same build and settings as
// the test server, another port) that a test may kill -9, a throwaway PostgreSQL cluster that a
// test may stop and start, and a plain HTTP client for either. The shared cluster on 54329 and
// the test server itself are never touched.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, chownSync, chmodSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { BASE } from '../helpers';

/** The test slot of this run (the test server listens on 3100 + slot). */
export const SLOT = Math.max(0, Number(new URL(BASE).port) - 3100) % 10;

export interface AppProcess {
	base: string;
	child: ChildProcess;
	output: () => string;
	/** SIGKILL: no shutdown hooks, no flushing, open transactions abandoned mid-way. */
	kill9: () => Promise<void>;
	stop: () => Promise<void>;
}

const exited = (child: ChildProcess) =>
	new Promise<void>((resolve) => {
		if (child.exitCode !== null || child.signalCode !== null) resolve();
		else child.once('exit', () => resolve());
	});

export async function waitFor(what: string, ok: () => Promise<boolean>, timeoutMs = 30_000, everyMs = 100): Promise<number> {
	const start = Date.now();
	for (;;) {
		try {
			if (await ok()) return Date.now() - start;
		} catch {
			/* not yet */
		}
		if (Date.now() - start > timeoutMs) throw new Error(`${what}: not within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, everyMs));
	}
}

/** Starts `node <build dir>` on `port` with the test server's settings and `env` on top. */
export async function startApp(port: number, env: Record<string, string> = {}): Promise<AppProcess> {
	const build = process.env.BUILD_DIR;
	if (!build || !existsSync(build)) throw new Error('BUILD_DIR is not set or missing: run the reliability tests through npm test');
	const base = `http://127.0.0.1:${port}`;
	const childEnv: Record<string, string> = { ...(process.env as Record<string, string>), PORT: String(port), ORIGIN: base, ...env };
	delete childEnv.NODE_OPTIONS; // the built server needs no TypeScript loader
	const child = spawn(process.execPath, [build], { env: childEnv, stdio: ['ignore', 'pipe', 'pipe'] });
	let out = '';
	child.stdout!.on('data', (d) => (out += d));
	child.stderr!.on('data', (d) => (out += d));
	await waitFor(`the app on ${port}`, async () => {
		if (child.exitCode !== null) throw new Error(`the app on ${port} exited: ${out}`);
		return (await fetch(`${base}/api/v1/check`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' })).status === 400;
	}, 20_000).catch((e) => {
		child.kill('SIGKILL');
		throw new Error(`${(e as Error).message}\n${out}`);
	});
	return {
		base,
		child,
		output: () => out,
		kill9: async () => {
			child.kill('SIGKILL');
			await exited(child);
		},
		stop: async () => {
			if (child.exitCode !== null || child.signalCode !== null) return;
			child.kill('SIGTERM');
			const t = setTimeout(() => child.kill('SIGKILL'), 5000);
			await exited(child);
			clearTimeout(t);
		}
	};
}

/** A cookie-keeping JSON/form client for a server at any base URL. */
export class Remote {
	readonly cookies = new Map<string, string>();
	constructor(
		public base: string,
		public address = `10.250.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`
	) {}

	static withCookies(base: string, from: { cookies: Map<string, string>; address: string }): Remote {
		const r = new Remote(base, from.address);
		for (const [k, v] of from.cookies) r.cookies.set(k, v);
		return r;
	}

	private headers(extra: Record<string, string>): Record<string, string> {
		const h: Record<string, string> = { 'x-forwarded-for': this.address, origin: this.base, ...extra };
		if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
		return h;
	}

	private keep(res: Response): Response {
		for (const raw of res.headers.getSetCookie()) {
			const [pair] = raw.split(';');
			const i = pair.indexOf('=');
			const name = pair.slice(0, i);
			const value = decodeURIComponent(pair.slice(i + 1));
			if (!value || /max-age=0/i.test(raw)) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
		return res;
	}

	async raw(method: string, path: string, body?: string, headers: Record<string, string> = {}): Promise<Response> {
		return this.keep(await fetch(this.base + path, { method, redirect: 'manual', headers: this.headers(headers), body }));
	}

	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	async call(method: string, path: string, body?: unknown): Promise<{ status: number; json: any; headers: Headers }> {
		const res = await this.raw(method, path, body === undefined ? undefined : JSON.stringify(body), { 'content-type': 'application/json', accept: 'application/json' });
		const text = await res.text();
		let json: unknown = {};
		try {
			json = text ? JSON.parse(text) : {};
		} catch {
			json = { text };
		}
		return { status: res.status, json, headers: res.headers };
	}

	async form(path: string, fields: Record<string, string>): Promise<Response> {
		return this.raw('POST', path, new URLSearchParams(fields).toString(), { accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' });
	}
}

// ---------------------------------------------------------------------------------------------
// A throwaway PostgreSQL cluster

function pgBin(): string {
	if (process.env.PGBIN && existsSync(join(process.env.PGBIN, 'pg_ctl'))) return process.env.PGBIN;
	for (const v of readdirSync('/usr/lib/postgresql').sort().reverse()) {
		const d = `/usr/lib/postgresql/${v}/bin`;
		if (existsSync(`${d}/pg_ctl`)) return d;
	}
	throw new Error('PostgreSQL binaries not found');
}

const isRoot = () => process.getuid?.() === 0;

function asPg(cmd: string, args: string[]): { status: number | null; out: string } {
	const [file, argv] = isRoot() ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
	const r = spawnSync(file, argv, { encoding: 'utf8', timeout: 60_000 });
	return { status: r.status, out: `${r.stdout}${r.stderr}` };
}

export interface Cluster {
	port: number;
	url: (db: string) => string;
	start: () => void;
	stop: () => void;
	destroy: () => void;
}

/** initdb into a temporary folder; started on `port`, loopback only. */
export function throwawayCluster(port: number): Cluster {
	const bin = pgBin();
	const dir = mkdtempSync(join(tmpdir(), 'inchwarden-pg-'));
	const data = join(dir, 'data');
	if (isRoot()) {
		const pw = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' });
		const gid = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' });
		chownSync(dir, Number(pw.stdout.trim()), Number(gid.stdout.trim()));
	}
	chmodSync(dir, 0o700);
	const init = asPg(`${bin}/initdb`, ['-D', data, '-U', 'postgres', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8', '--no-sync']);
	if (init.status !== 0) throw new Error(`initdb failed: ${init.out}`);
	const cluster: Cluster = {
		port,
		url: (db) => `postgres://postgres@127.0.0.1:${port}/${db}`,
		start: () => {
			const r = asPg(`${bin}/pg_ctl`, ['-D', data, '-l', join(dir, 'pg.log'), '-w', '-t', '60', '-o', `-c listen_addresses=127.0.0.1 -p ${port} -k ${dir} -c fsync=off`, 'start']);
			if (r.status !== 0) throw new Error(`pg_ctl start failed: ${r.out}`);
		},
		stop: () => {
			const r = asPg(`${bin}/pg_ctl`, ['-D', data, '-m', 'fast', '-w', 'stop']);
			if (r.status !== 0) throw new Error(`pg_ctl stop failed: ${r.out}`);
		},
		destroy: () => {
			asPg(`${bin}/pg_ctl`, ['-D', data, '-m', 'immediate', '-w', 'stop']);
			rmSync(dir, { recursive: true, force: true });
		}
	};
	return cluster;
}

/** Creates `db` in a cluster and migrates it to the latest schema with the Knex CLI. */
export function migratedDatabase(adminUrl: string, url: string, name: string): void {
	const create = spawnSync('psql', [adminUrl, '-qc', `create database "${name}"`], { encoding: 'utf8' });
	if (create.status !== 0) throw new Error(`create database failed: ${create.stderr}`);
	const env = { ...process.env, DATABASE_URL: url, NODE_OPTIONS: '--import tsx' };
	const m = spawnSync('node_modules/.bin/knex', ['migrate:latest', '--knexfile', 'knexfile.ts'], { encoding: 'utf8', env, timeout: 60_000 });
	if (m.status !== 0) throw new Error(`migrate failed: ${m.stdout}${m.stderr}`);
}

export function dropDatabase(adminUrl: string, name: string): void {
	spawnSync('psql', [adminUrl, '-qc', `drop database if exists "${name}" with (force)`], { encoding: 'utf8' });
}
