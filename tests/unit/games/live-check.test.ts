// The drag's live check as the worker answers it (play/live-check.ts) and the client's rule that
// the newest draft wins (play/live-client.ts): the answer is the engine's own report on the live
// table, the cost split and spacing links are hand-worked from the invented table of fixtures.ts,
// and however many drafts come while one is checked, only the newest is asked next.
import { describe, expect, it } from 'vitest';
import { checkMove } from '$lib/referee';
import { liveCheckTable } from '$lib/board/play/rules';
import { liveAnswer, linksOf, type LiveAnswer, type LiveAsk, type LiveEnd, type LiveSlot } from '$lib/board/play/live-check';
import { LiveClient, type LivePort, type LiveQuestion } from '$lib/board/play/live-client';
import { LAYOUT, PROFILE } from './fixtures';
import { ready } from './ready-table';

const round32 = { shape: 'round', diameterMm: 32 } as const;
const end = (id: string, x: number, y: number): LiveEnd => ({ id, footprint: round32, pose: { x, y, facing: 0 } });

describe('the live check in the worker', () => {
	it('answers with the engine report on the live table, the cost split and the links', () => {
		const s = ready();
		const table = liveCheckTable(LAYOUT, PROFILE, s.pieces);
		const slot: LiveSlot = { tableId: 0, table: null };
		const move = { unit: 'a-u1', kind: 'move' as const, paths: { 'a-u1-p2': [{ x: 12, y: 10 }] } };
		const a = liveAnswer(slot, { type: 'live', id: 1, tableId: 1, table, move, ends: [end('a-u1-p1', 10, 6), end('a-u1-p2', 12, 10), end('a-u1-p3', 14, 6)] });
		expect(a.missingTable).toBeUndefined();
		expect(a.report).toEqual(checkMove({ ...table, move }));
		// 4 in straight ahead: all of it across, none turning (a round base) or climbing
		expect(a.breakdown).toEqual([{ piece: 'a-u1-p2', cost: 4, allowance: 6, horizontal: 4, pivot: 0, climb: 0 }]);
		expect(a.breakdown[0].cost).toBeCloseTo(4, 9);
		// p1 and p3 are nearest each other (4 in between centres) rather than p2 (hypot(2, 4) = 4.47 in);
		// p2 is as near to both and keeps the first; p3's link to p1 is already drawn
		expect(a.links.map((l) => [l.a, l.b])).toEqual([['a-u1-p1', 'a-u1-p3'], ['a-u1-p2', 'a-u1-p1']]);
		expect(a.links[0].gapIn).toBeCloseTo(4 - 32 / 25.4, 9);
		expect(a.links[1].gapIn).toBeCloseTo(Math.hypot(2, 4) - 32 / 25.4, 9);
	});

	it('keeps the table for later asks, and says so when asked about a table it never got', () => {
		const s = ready();
		const table = liveCheckTable(LAYOUT, PROFILE, s.pieces);
		const slot: LiveSlot = { tableId: 0, table: null };
		const move = { unit: 'a-u1', kind: 'move' as const, paths: { 'a-u1-p1': [{ x: 10, y: 30 }] } };
		expect(liveAnswer(slot, { type: 'live', id: 1, tableId: 3, move, ends: [] }).missingTable).toBe(true);
		liveAnswer(slot, { type: 'live', id: 2, tableId: 3, table, move: null, ends: [] });
		const later = liveAnswer(slot, { type: 'live', id: 3, tableId: 3, move, ends: [] });
		// 24 in for a 6 in allowance
		expect(later.report?.verdict).toBe('illegal');
		expect(later.report?.findings.some((f) => f.code === 'over-allowance')).toBe(true);
		expect(liveAnswer(slot, { type: 'live', id: 4, tableId: 4, move, ends: [] }).missingTable).toBe(true);
	});

	it('links each piece to its nearest unit-mate once per pair', () => {
		const links = linksOf([end('p1', 0, 0), end('p2', 2, 0), end('p3', 10, 0)]);
		expect(links.map((l) => `${l.a}-${l.b}`)).toEqual(['p1-p2', 'p3-p2']);
		expect(links[1].gapIn).toBeCloseTo(8 - 32 / 25.4, 9);
		expect(linksOf([end('p1', 0, 0)])).toEqual([]);
	});
});

/** A port that holds every ask until the test answers it. */
function heldPort() {
	const asks: LiveAsk[] = [];
	const slot: LiveSlot = { tableId: 0, table: null };
	const port: LivePort = { onmessage: null, postMessage: (a) => void asks.push(a), terminate: () => {} };
	const answerNext = () => {
		const ask = asks.shift()!;
		port.onmessage!({ data: liveAnswer(slot, ask) } as MessageEvent<LiveAnswer>);
		return ask;
	};
	return { port, asks, answerNext };
}

describe('the live check client', () => {
	it('has at most one ask in flight and asks the newest draft next, with the table once', () => {
		const s = ready();
		const { port, asks, answerNext } = heldPort();
		const got: string[] = [];
		const client = new LiveClient((_a, q) => got.push(q.context), { port });
		const q = (n: number): LiveQuestion => ({ context: `draft ${n}`, move: { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 10, y: 6 + n / 10 }] } }, ends: [] });
		client.ask(q(1));
		// no table yet: nothing is sent
		expect(asks).toHaveLength(0);
		client.setTable(liveCheckTable(LAYOUT, PROFILE, s.pieces));
		client.ask(q(2));
		client.ask(q(3));
		client.ask(q(4));
		expect(asks).toHaveLength(1);
		expect(asks[0].table).toBeDefined();
		expect(asks[0].move?.paths?.['a-u1-p1'][0].y).toBeCloseTo(6.2, 9);
		expect(client.outstanding).toBe(2);
		answerNext();
		// draft 3 was replaced by 4 while 2 was checked
		expect(asks).toHaveLength(1);
		expect(asks[0].table).toBeUndefined();
		expect(asks[0].move?.paths?.['a-u1-p1'][0].y).toBeCloseTo(6.4, 9);
		answerNext();
		expect(got).toEqual(['draft 2', 'draft 4']);
		expect(client.outstanding).toBe(0);
		client.ask(q(5));
		client.clear();
		answerNext();
		expect(client.outstanding).toBe(0);
		expect(got).toEqual(['draft 2', 'draft 4', 'draft 5']);
	});

	it('sends the table again when the worker lost it, without reporting the miss', () => {
		const s = ready();
		const { port, asks } = heldPort();
		const got: string[] = [];
		const client = new LiveClient((_a, q) => got.push(q.context), { port });
		client.setTable(liveCheckTable(LAYOUT, PROFILE, s.pieces));
		client.ask({ context: 'x', move: null, ends: [] });
		const first = asks.shift()!;
		port.onmessage!({ data: { type: 'live', id: first.id, report: null, breakdown: [], links: [], missingTable: true } } as unknown as MessageEvent<LiveAnswer>);
		expect(got).toEqual([]);
		expect(asks).toHaveLength(1);
		expect(asks[0].table).toBeDefined();
	});
});
