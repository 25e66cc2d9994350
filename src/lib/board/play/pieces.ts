// A roster's units to the pieces of a game: one piece per figure, ids `a-u1-p3` (side, unit
// number, piece number; a joined leader's pieces `a-u1-l1`), everything the engine measures
// copied from the unit's profile. Pure: the server expands, the tests check, the screen names.
import type { Unit } from '../../schemas/roster';
import type { GamePiece, Side } from '../../schemas/game';
import type { PieceIn } from '../../schemas/check';

/** The unit profile fields the expansion reads (a roster's Unit, or a leader's profile). */
type UnitProfile = Pick<Unit, 'name' | 'class' | 'flies' | 'allowanceIn' | 'footprint' | 'pieces' | 'value' | 'ring'>;

function piecesOf(side: Side, unitId: string, unitName: string, p: UnitProfile, tag: 'p' | 'l'): GamePiece[] {
	const out: GamePiece[] = [];
	for (let k = 1; k <= p.pieces; k++) {
		out.push({
			id: `${unitId}-${tag}${k}`,
			side,
			unit: unitId,
			unitName,
			leader: tag === 'l',
			class: p.class,
			flies: p.flies ?? false,
			allowance: p.allowanceIn,
			footprint: p.footprint,
			value: p.value ?? 0,
			ring: p.ring ? { radius: p.ring.radiusIn, label: p.ring.label } : undefined,
			at: null
		});
	}
	return out;
}

/** Every piece of a roster for one side, none deployed yet. */
export function expandRoster(side: Side, units: readonly (UnitProfile & { leader?: UnitProfile })[]): GamePiece[] {
	const out: GamePiece[] = [];
	units.forEach((u, i) => {
		const unitId = `${side}-u${i + 1}`;
		out.push(...piecesOf(side, unitId, u.name, u, 'p'));
		// A joined leader moves and is spaced with its unit, so its pieces carry the unit's id.
		if (u.leader) out.push(...piecesOf(side, unitId, u.name, u.leader, 'l'));
	});
	return out;
}

/** The engine's view of the deployed pieces (pieces still in the roster panel are not on the table). */
export function enginePieces(pieces: readonly GamePiece[]): PieceIn[] {
	const out: PieceIn[] = [];
	for (const p of pieces) {
		if (!p.at) continue;
		out.push({
			id: p.id,
			side: p.side,
			unit: p.unit,
			class: p.class,
			flies: p.flies,
			allowance: p.allowance,
			footprint: p.footprint,
			at: { x: p.at.x, y: p.at.y, facing: p.at.facing ?? 0 },
			value: p.value,
			ring: p.ring ? { radius: p.ring.radius } : undefined
		});
	}
	return out;
}

export interface UnitSummary {
	unit: string;
	name: string;
	side: Side;
	pieces: GamePiece[];
	deployed: number;
	hasRing: boolean;
}

/** The units of a game in roster order, with how many of their pieces stand on the table. */
export function unitsOf(pieces: readonly GamePiece[]): UnitSummary[] {
	const byUnit = new Map<string, UnitSummary>();
	for (const p of pieces) {
		let u = byUnit.get(p.unit);
		if (!u) {
			u = { unit: p.unit, name: p.unitName, side: p.side, pieces: [], deployed: 0, hasRing: false };
			byUnit.set(p.unit, u);
		}
		u.pieces.push(p);
		if (p.at) u.deployed++;
		if (p.ring) u.hasRing = true;
	}
	return [...byUnit.values()];
}
