// POST /api/v1/check called directly with a constructed Request: a legal and an illegal move get
// 200 with the report; bad input of every kind gets 400 (413 when too large), never 500.
import { describe, expect, it } from 'vitest';
import { POST } from '../../../src/routes/api/v1/check/+server';

type Handler = (event: unknown) => Promise<Response>;
const post = POST as unknown as Handler;

function call(body: string | Uint8Array, headers: Record<string, string> = {}): Promise<Response> {
	const request = new Request('http://localhost/api/v1/check', { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: body as BodyInit });
	// the handler reads only `request`; the rest of a RequestEvent is not needed
	return post({ request, url: new URL(request.url), params: {}, locals: {}, getClientAddress: () => '127.0.0.1' });
}

const foot = (id: string, side: string, unit: string, x: number, y: number) => ({
	id,
	side,
	unit,
	class: 'foot',
	allowance: 6,
	footprint: { shape: 'round', diameterMm: 25.4 },
	at: { x, y, facing: 0 }
});

const legal = {
	board: { width: 44, depth: 60 },
	pieces: [foot('a1', 'red', 'u1', 5, 5), foot('c1', 'blue', 'u2', 30, 30)],
	move: { unit: 'u1', kind: 'move', paths: { a1: [{ x: 8, y: 9 }] } }
};

async function bad(res: Response, status: number) {
	expect(res.status).toBe(status);
	const body = await res.json();
	expect(typeof body.error.message).toBe('string');
	return body;
}

describe('POST /api/v1/check', () => {
	it('answers a legal move with its report', async () => {
		const res = await call(JSON.stringify(legal));
		expect(res.status).toBe(200);
		const report = await res.json();
		expect(report.verdict).toBe('legal');
		expect(report.pieces.a1).toEqual({ cost: 5, allowance: 6, findings: [] });
	});
	it('answers an illegal move with the findings', async () => {
		const res = await call(JSON.stringify({ ...legal, move: { unit: 'u1', kind: 'move', paths: { a1: [{ x: 28.5, y: 30 }] } } }));
		expect(res.status).toBe(200);
		const report = await res.json();
		expect(report.verdict).toBe('illegal');
		expect(report.findings.map((f: { code: string }) => f.code)).toEqual(expect.arrayContaining(['over-allowance', 'enters-keep-out', 'ends-in-keep-out']));
	});
	it('refuses a body that is not JSON', async () => {
		await bad(await call('{"board": '), 400);
		await bad(await call(''), 400);
	});
	it('refuses wrong types with the schema issues', async () => {
		const body = await bad(await call(JSON.stringify({ ...legal, board: { width: '44', depth: 60 } })), 400);
		expect(body.error.issues.some((i: { path: string[] }) => i.path.join('.') === 'board.width')).toBe(true);
	});
	it('refuses missing fields', async () => {
		const { move: _move, ...noMove } = legal;
		void _move;
		const body = await bad(await call(JSON.stringify(noMove)), 400);
		expect(body.error.issues.length).toBeGreaterThan(0);
	});
	it('refuses a path of more than 200 waypoints', async () => {
		const path = Array.from({ length: 201 }, (_, i) => ({ x: 5 + i * 0.01, y: 5 }));
		await bad(await call(JSON.stringify({ ...legal, move: { unit: 'u1', kind: 'move', paths: { a1: path } } })), 400);
		const ok = await call(JSON.stringify({ ...legal, move: { unit: 'u1', kind: 'move', paths: { a1: path.slice(0, 200) } } }));
		expect(ok.status).toBe(200);
	});
	it('refuses more than 2,000 pieces', async () => {
		const pieces = Array.from({ length: 2001 }, (_, i) => foot(`p${i}`, 'red', 'u1', 1 + (i % 40), 1 + Math.floor(i / 40)));
		await bad(await call(JSON.stringify({ ...legal, pieces })), 400);
	});
	it('refuses a body over 1 MiB with 413, declared or not', async () => {
		const big = JSON.stringify({ ...legal, padding: 'x'.repeat(1024 * 1024) });
		await bad(await call(big), 413);
		const stream = new TextEncoder().encode(big);
		await bad(await call(stream, { 'content-length': '10' }), 413);
	});
	it('refuses NaN and Infinity (written as JSON numbers that overflow, or as strings)', async () => {
		await bad(await call(JSON.stringify(legal).replace('"width":44', '"width":1e999')), 400);
		await bad(await call(JSON.stringify(legal).replace('"width":44', '"width":NaN')), 400);
		await bad(await call(JSON.stringify({ ...legal, board: { width: 'Infinity', depth: 60 } })), 400);
	});
	it('refuses an unknown move kind, class, footprint shape or terrain kind', async () => {
		await bad(await call(JSON.stringify({ ...legal, move: { ...legal.move, kind: 'charge' } })), 400);
		await bad(await call(JSON.stringify({ ...legal, pieces: [{ ...legal.pieces[0], class: 'wizard' }, legal.pieces[1]] })), 400);
		await bad(await call(JSON.stringify({ ...legal, pieces: [{ ...legal.pieces[0], footprint: { shape: 'square', sideMm: 25 } }, legal.pieces[1]] })), 400);
		await bad(await call(JSON.stringify({ ...legal, board: { width: 44, depth: 60, terrain: [{ id: 'x', kind: 'lava', outline: [[0, 0], [1, 0], [1, 1]] }] } })), 400);
	});
	it('refuses a move that names no piece of the table or a dash without its die', async () => {
		await bad(await call(JSON.stringify({ ...legal, move: { unit: 'nobody', kind: 'move' } })), 400);
		await bad(await call(JSON.stringify({ ...legal, move: { unit: 'u1', kind: 'dash', paths: {} } })), 400);
		await bad(await call(JSON.stringify({ ...legal, move: { unit: 'u1', kind: 'move', paths: { c1: [{ x: 1, y: 1 }] } } })), 400);
	});
	it('never answers 500 on odd JSON values', async () => {
		for (const body of ['null', '[]', '42', '"check"', 'true', '{}']) {
			const res = await call(body);
			expect(res.status).toBe(400);
		}
	});
});
