// Players' rosters (the roster editor arrives later; the dashboard lists them).
import { use, type Db } from './index';

export interface RosterSummary {
	id: number;
	name: string;
	force: string;
	units: number;
	updatedAt: Date;
}

export async function listForOwner(ownerId: string, trx?: Db): Promise<RosterSummary[]> {
	const rows = await use(trx)('rosters')
		.where({ owner_id: ownerId })
		.select('id', 'name', 'force', use(trx).raw('jsonb_array_length(units)::int as units'), 'updated_at as updatedAt')
		.orderBy('name');
	return rows as RosterSummary[];
}

export const rosters = { listForOwner };
