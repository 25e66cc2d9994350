// Builders for check requests in tests: pieces on 1 in round bases (25.4 mm) unless told, so
// edge-to-edge figures are centre distances minus whole numbers and boundaries are easy to set.
import type { CheckRequest, PieceIn, TerrainIn } from '../../../src/lib/schemas/check';

export const EPS = 0.005;
export const NUDGE = 1e-4;

type Extra = Partial<Omit<PieceIn, 'id' | 'side' | 'unit' | 'at'>> & { facing?: number };

export function piece(id: string, side: string, unit: string, x: number, y: number, extra: Extra = {}): PieceIn {
	const { facing, ...rest } = extra;
	return {
		id,
		side,
		unit,
		class: 'foot',
		allowance: 6,
		footprint: { shape: 'round', diameterMm: 25.4 },
		at: { x, y, facing: facing ?? 0 },
		...rest
	};
}

export function request(
	pieces: PieceIn[],
	move: CheckRequest['move'],
	board: { width?: number; depth?: number; terrain?: TerrainIn[]; objectives?: { id: string; x: number; y: number }[] } = {},
	profile?: CheckRequest['profile']
): CheckRequest {
	const req: CheckRequest = {
		board: { width: board.width ?? 44, depth: board.depth ?? 60, terrain: board.terrain ?? [], objectives: board.objectives ?? [] },
		pieces,
		move
	};
	if (profile) req.profile = profile;
	return req;
}

export function codes(report: { findings: { code: string }[] }): string[] {
	return report.findings.map((f) => f.code);
}

/** Codes of the findings that make a move illegal (warnings left out). */
export function errors(report: { findings: { code: string; severity: string }[] }): string[] {
	return report.findings.filter((f) => f.severity === 'error').map((f) => f.code);
}

export function rect(x0: number, y0: number, x1: number, y1: number): [number, number][] {
	return [
		[x0, y0],
		[x1, y0],
		[x1, y1],
		[x0, y1]
	];
}

/** Deterministic PRNG (mulberry32) so random cases are the same on every run. */
export function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}
