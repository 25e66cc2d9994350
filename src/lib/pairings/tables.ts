// Table assignment: pairings get table numbers in order (top pairs on table 1), and each table
// the event's layouts in turn, so a one-layout event plays every table on the same layout.
import type { Pair } from './swiss';

export interface TabledPair extends Pair {
	/** null for the bye, which plays no game */
	table: number | null;
	layoutId: number | null;
}

export function assignTables(pairs: readonly Pair[], layoutIds: readonly number[] = []): TabledPair[] {
	let next = 1;
	return pairs.map((p) => {
		if (p.b === null) return { ...p, table: null, layoutId: null };
		const table = next++;
		const layoutId = layoutIds.length ? layoutIds[(table - 1) % layoutIds.length] : null;
		return { ...p, table, layoutId };
	});
}
