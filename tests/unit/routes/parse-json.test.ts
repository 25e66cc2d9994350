// parseJson: the one door of every JSON API route — bad JSON 400, too large 413, NUL 400.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { hasUnstorableText, parseJson } from '../../../src/lib/server/http';

const schema = z.object({ name: z.string() });
const post = (body: string) => new Request('http://localhost/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body });

describe('parseJson', () => {
	it('passes a body that matches the schema', async () => {
		const r = await parseJson(post('{"name":"Fennmoor"}'), schema);
		expect(r).toEqual({ ok: true, data: { name: 'Fennmoor' } });
	});
	it('refuses a string holding U+0000 with 400 before it can reach PostgreSQL', async () => {
		const r = await parseJson(post('{"name":"a\\u0000b"}'), schema);
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.response.status).toBe(400);
			expect((await r.response.json()).error.message).toMatch(/NUL/);
		}
	});
	it('answers 413 when the server refuses the body as too large', async () => {
		const tooLarge = { json: () => Promise.reject(Object.assign(new Error('Payload Too Large'), { status: 413 })) } as unknown as Request;
		const r = await parseJson(tooLarge, schema);
		expect(r.ok === false && r.response.status).toBe(413);
	});
	it('answers 400 for text that is not JSON', async () => {
		const r = await parseJson(post('{name:'), schema);
		expect(r.ok === false && r.response.status).toBe(400);
	});
});

describe('hasUnstorableText', () => {
	it('finds U+0000 in nested values and in keys, and nowhere else', () => {
		expect(hasUnstorableText({ a: [1, { b: 'x\u0000' }] })).toBe(true);
		expect(hasUnstorableText({ ['k\u0000']: 1 })).toBe(true);
		expect(hasUnstorableText({ a: [1, { b: 'x\\u0000 as text' }], c: null })).toBe(false);
	});
	it('finds a lone surrogate, which PostgreSQL jsonb refuses, and passes a paired one', () => {
		expect(hasUnstorableText({ id: 'a\ud800b' })).toBe(true);
		expect(hasUnstorableText({ id: 'moth \ud83e\udd8b' })).toBe(false);
	});
	it('walks very deep nesting without overflowing the stack', () => {
		let deep: unknown = 'end\u0000';
		for (let i = 0; i < 100_000; i++) deep = [deep];
		expect(hasUnstorableText(deep)).toBe(true);
	});
});
