// The move log in words: a checked move's costs per piece against its allowance and its findings
// with marks, a ruling signed by its judge, and every kind of entry labelled.
import { describe, expect, it } from 'vitest';
import { describeEntry, logKindLabel, logRows, rulingOf } from '$lib/board/play/log-words';
import { moveLogKindSchema, type MoveLogEntry } from '$lib/schemas/game';

const base = { actor: 'u1', actorName: 'Ada Test', round: 1, createdAt: '2026-12-02T10:00:00.000Z', report: null };
const pieces = [{ id: 'a-u1-p1', side: 'a', unit: 'a-u1', unitName: 'Lantern Guard', leader: false, class: 'foot', flies: false, allowance: 6, footprint: { shape: 'round', diameterMm: 32 }, value: 1, at: { x: 1, y: 1, facing: 0 } }] as const;
const summaries = { objectives: [], rings: [] };

describe('log rows', () => {
	it('gives a refused move its costs and findings in words', () => {
		const e: MoveLogEntry = {
			...base,
			seq: 7,
			kind: 'refused',
			side: 'a',
			payload: { unit: 'a-u1', kind: 'move', paths: { 'a-u1-p1': [{ x: 1, y: 7.6 }] } },
			report: {
				verdict: 'illegal',
				pieces: { 'a-u1-p1': { cost: 6.6, allowance: 6, findings: [] } },
				findings: [
					{ code: 'over-allowance', severity: 'error', pieces: ['a-u1-p1'], measured: 6.6, limit: 6, message: 'a-u1-p1 moves 6.60 in; it may move 6 in' },
					{ code: 'overhang', severity: 'warning', pieces: ['a-u1-p1'], measured: 0.1, limit: 0, message: 'a-u1-p1 overhangs a little' }
				],
				summaries
			}
		};
		const [row] = logRows([e], pieces as never);
		expect(row).toMatchObject({ seq: 7, actor: 'Ada Test', sideText: 'Side A', round: 1, kindText: 'Refused move', verdict: 'illegal', die: null });
		expect(row.costs).toEqual(['a-u1-p1: 6.60 in of 6']);
		expect(row.findings).toEqual(['✕ a-u1-p1 moves 6.60 in; it may move 6 in', 'ℹ a-u1-p1 overhangs a little']);
		expect(row.summary).toBe('Side A: Lantern Guard — Move refused: a-u1-p1 moves 6.60 in; it may move 6 in');
	});

	it('signs a ruling with the judge, the outcome and the reason', () => {
		const e: MoveLogEntry = {
			...base,
			seq: 9,
			kind: 'ruling',
			side: null,
			actorName: 'Jude Judge',
			payload: {
				requestId: 3,
				moveSeq: 7,
				outcome: 'adjust',
				reason: 'the base was on the line',
				allowIllegal: false,
				ruled: { 'a-u1-p1': { x: 1, y: 6, facing: 0 } },
				changes: [{ piece: 'a-u1-p1', from: { x: 1, y: 1, facing: 0 }, to: { x: 1, y: 6, facing: 0 } }],
				settledPending: false,
				judge: { id: 'j1', name: 'Jude Judge' },
				signedAt: '2026-12-02T10:05:00.000Z'
			}
		};
		expect(rulingOf(e)?.outcome).toBe('adjust');
		const [row] = logRows([e], pieces as never);
		expect(row.sideText).toBe('Judge');
		expect(row.ruling).toEqual({ judge: 'Jude Judge', signedAt: '2026-12-02T10:05:00.000Z', outcome: 'adjust', reason: 'the base was on the line', moveSeq: 7 });
		expect(row.summary).toBe('Judge Jude Judge adjusts move #7: "the base was on the line"; 1 piece(s) placed anew');
		// an unreadable ruling is said to be one, not dropped
		expect(describeEntry({ ...e, payload: {} }, [])).toMatch(/could not be read/);
	});

	it('labels every kind the log knows, the ruling included', () => {
		for (const k of moveLogKindSchema.options) expect(logKindLabel[k]).toMatch(/\w/);
		expect(moveLogKindSchema.safeParse('ruling').success).toBe(true);
	});
});
