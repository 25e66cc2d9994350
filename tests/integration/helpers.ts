// Helpers for integration tests: a cookie-jar client that talks to the built app over real
// HTTP like a browser without JavaScript (form posts, manual redirects), and test data.
import { randomBytes } from 'node:crypto';
import knexFactory, { type Knex } from 'knex';

export const BASE = (process.env.TEST_BASE_URL ?? 'http://127.0.0.1:3100').replace(/\/+$/, '');
export const SMTP_API = (process.env.FAKE_SMTP_API ?? 'http://127.0.0.1:2580').replace(/\/+$/, '');

export interface SetCookie {
	name: string;
	value: string;
	attributes: Record<string, string | true>;
	raw: string;
}

export function parseSetCookie(raw: string): SetCookie {
	const [pair, ...attrs] = raw.split(';').map((s) => s.trim());
	const eq = pair.indexOf('=');
	const attributes: Record<string, string | true> = {};
	for (const a of attrs) {
		const i = a.indexOf('=');
		if (i < 0) attributes[a.toLowerCase()] = true;
		else attributes[a.slice(0, i).toLowerCase()] = a.slice(i + 1);
	}
	return { name: pair.slice(0, eq), value: decodeURIComponent(pair.slice(eq + 1)), attributes, raw };
}

let counter = 0;
/** A made-up private (10/8) client address per call, so address limits never collide. */
export function freshAddress(): string {
	counter += 1;
	const r = randomBytes(2);
	return `10.${r[0]}.${r[1]}.${counter % 250}`;
}

/** An e-mail nobody else in this run uses. */
export function freshEmail(tag = 'user'): string {
	return `${tag}-${Date.now().toString(36)}-${randomBytes(4).toString('hex')}@example.test`;
}

export class Client {
	readonly cookies = new Map<string, string>();
	/** Every Set-Cookie header seen, newest last, for checking flags. */
	readonly setCookies: SetCookie[] = [];

	constructor(public address: string = freshAddress()) {}

	private headers(extra?: Record<string, string>): Record<string, string> {
		const h: Record<string, string> = { 'x-forwarded-for': this.address, ...extra };
		if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
		return h;
	}

	private keep(res: Response): Response {
		for (const raw of res.headers.getSetCookie()) {
			const c = parseSetCookie(raw);
			this.setCookies.push(c);
			if (c.value === '' || c.attributes['max-age'] === '0') this.cookies.delete(c.name);
			else this.cookies.set(c.name, c.value);
		}
		return res;
	}

	async get(path: string, headers?: Record<string, string>): Promise<Response> {
		return this.keep(
			await fetch(BASE + path, { headers: this.headers({ accept: 'text/html', ...headers }), redirect: 'manual' })
		);
	}

	/**
	 * A plain browser form post: urlencoded, same Origin, redirects not followed. The Accept
	 * header matters: without text/html SvelteKit answers an action with its JSON envelope.
	 */
	async post(path: string, fields: Record<string, string>, headers?: Record<string, string>): Promise<Response> {
		return this.keep(
			await fetch(BASE + path, {
				method: 'POST',
				redirect: 'manual',
				headers: this.headers({
					origin: BASE,
					accept: 'text/html',
					'content-type': 'application/x-www-form-urlencoded',
					...headers
				}),
				body: new URLSearchParams(fields).toString()
			})
		);
	}

	async send(method: string, path: string, body?: string, headers?: Record<string, string>): Promise<Response> {
		return this.keep(
			await fetch(BASE + path, { method, redirect: 'manual', headers: this.headers({ origin: BASE, ...headers }), body })
		);
	}

	session(): string | undefined {
		return this.cookies.get('inchwarden_session');
	}

	async signUp(email: string, password: string, displayName = 'Test Player'): Promise<Response> {
		return this.post('/sign-up', { email, displayName, password });
	}

	async signIn(email: string, password: string): Promise<Response> {
		return this.post('/sign-in', { email, password });
	}
}

function noticeText(html: string, role: 'alert' | 'status'): string | null {
	const m = html.match(new RegExp(`role="${role}"[^>]*>([\\s\\S]*?)</p>`));
	if (!m) return null;
	return m[1]
		.replace(/<span aria-hidden="true">[\s\S]*?<\/span>/g, '') // the mark beside the words
		.replace(/<[^>]*>/g, '')
		.replace(/\s+/g, ' ')
		.trim();
}
/** The words of the page's problem notice (role=alert), without markup or its mark. */
export const alertText = (html: string) => noticeText(html, 'alert');
/** The words of the page's news notice (role=status), without markup or its mark. */
export const statusText = (html: string) => noticeText(html, 'status');

export interface OutboxMessage {
	id: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	receivedAt: string;
}

/** Waits for the fake SMTP server to hold `count` messages to `to` (mail is sent off-path). */
export async function waitForMail(to: string, count = 1, timeoutMs = 10_000): Promise<OutboxMessage[]> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const res = await fetch(`${SMTP_API}/messages`);
		const all = (await res.json()) as OutboxMessage[];
		const mine = all.filter((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase()));
		if (mine.length >= count) return mine;
		if (Date.now() > until) throw new Error(`no mail to ${to} after ${timeoutMs} ms (have ${mine.length})`);
		await new Promise((r) => setTimeout(r, 100));
	}
}


let knex: Knex | null = null;
/**
 * Direct access to the test database, for arranging what HTTP cannot (an expired link, an
 * admin) and for checking what is stored. DATABASE_URL is the test database the test command
 * migrated and serves.
 */
export function testDb(): Knex {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set: run the integration tests through npm test');
	knex ??= knexFactory({ client: 'pg', connection: url, pool: { min: 0, max: 2 } });
	return knex;
}

export async function closeTestDb(): Promise<void> {
	await knex?.destroy();
	knex = null;
}
