// The frame benchmark's table, invented for the bench: a 44 × 60 in layout with some terrain and
// deep deployment zones, two rosters of 150 pieces (ten units of 15), and where every piece is
// deployed (units in 5 × 3 blocks, side A facing side B across the middle). Pure data.
import type { RosterInput } from '../../src/lib/schemas/roster';
import type { GamePiece, Pose } from '../../src/lib/schemas/game';

export const PIECES_PER_UNIT = 15;
export const UNITS_PER_SIDE = 10;
/** centre-to-centre spacing inside a unit block, in (25 mm bases: 0.98 in across) */
export const PITCH_IN = 1.25;

export function benchLayout(name: string) {
	return {
		schemaVersion: 1,
		name,
		board: { width: 44, depth: 60 },
		terrain: [
			{ id: 'cairn', kind: 'block', name: 'Cairn', height: 2, outline: [[4, 28], [8, 28], [8, 32], [4, 32]] },
			{ id: 'bothy', kind: 'block', name: 'Bothy', height: 3, outline: [[36, 27], [40, 27], [40, 33], [36, 33]] },
			{ id: 'reed-bed', kind: 'area', name: 'Reed bed', outline: [[18, 28], [26, 27], [27, 32], [17, 33]] },
			{ id: 'sinkhole', kind: 'impassable', name: 'Sinkhole', outline: [[12, 29], [14, 28.5], [15, 31], [12.5, 31.5]] }
		],
		objectives: [
			{ id: 'obj-1', x: 10, y: 30, name: 'Marker 1' },
			{ id: 'obj-2', x: 32, y: 30, name: 'Marker 2' }
		],
		zones: [
			{ id: 'zone-a', side: 'a', outline: [[0, 0], [44, 0], [44, 24], [0, 24]] },
			{ id: 'zone-b', side: 'b', outline: [[0, 36], [44, 36], [44, 60], [0, 60]] }
		]
	};
}

/** Ten units of 15 foot pieces on 25 mm bases; every third unit carries a support ring. */
export function benchRoster(name: string, prefix: string): RosterInput {
	return {
		name,
		force: `${prefix} bench force`,
		units: Array.from({ length: UNITS_PER_SIDE }, (_, i) => ({
			name: `${prefix} file ${i + 1}`,
			class: 'foot' as const,
			flies: false,
			allowanceIn: 6,
			footprint: { shape: 'round' as const, diameterMm: 25 },
			pieces: PIECES_PER_UNIT,
			value: 1,
			points: 50,
			...(i % 3 === 0 ? { ring: { radiusIn: 6, label: 'Bench ring' } } : {})
		}))
	};
}

/**
 * Where each piece of a side stands: unit k in a 5 × 3 block, five blocks across the table,
 * two block rows deep; side A's front row about 6 in from the middle line, side B's likewise.
 */
export function placementsFor(pieces: readonly GamePiece[], side: 'a' | 'b'): { piece: string; at: Pose }[] {
	const units = [...new Set(pieces.filter((p) => p.side === side).map((p) => p.unit))];
	const out: { piece: string; at: Pose }[] = [];
	units.forEach((unit, k) => {
		const col = k % 5;
		const blockRow = Math.floor(k / 5); // 0 = front
		const x0 = 2.5 + col * 8.25;
		const members = pieces.filter((p) => p.unit === unit);
		members.forEach((p, j) => {
			const x = x0 + (j % 5) * PITCH_IN;
			const r = Math.floor(j / 5) + blockRow * 4.5; // rows back from the front
			const y = side === 'a' ? 22.5 - r * PITCH_IN : 37.5 + r * PITCH_IN;
			out.push({ piece: p.id, at: { x: round3(x), y: round3(y), facing: side === 'a' ? 90 : 270 } });
		});
	});
	return out;
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;
