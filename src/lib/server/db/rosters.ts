// Players' rosters: the dashboard's summary list, and the editor's find / add / update / remove.
// Units are stored as one JSON document that has passed the shared roster schema.
import type { Unit } from '$lib/schemas/roster';
import { use, type Db } from './index';

export interface RosterSummary {
	id: number;
	name: string;
	force: string;
	units: number;
	updatedAt: Date;
}

export interface StoredRoster {
	id: number;
	ownerId: string;
	name: string;
	force: string;
	units: Unit[];
	sourceUploadId: string | null;
	createdAt: Date;
	updatedAt: Date;
}

const COLUMNS = [
	'id',
	'owner_id as ownerId',
	'name',
	'force',
	'units',
	'source_upload_id as sourceUploadId',
	'created_at as createdAt',
	'updated_at as updatedAt'
];

export async function listForOwner(ownerId: string, trx?: Db): Promise<RosterSummary[]> {
	const rows = await use(trx)('rosters')
		.where({ owner_id: ownerId })
		.select('id', 'name', 'force', use(trx).raw('jsonb_array_length(units)::int as units'), 'updated_at as updatedAt')
		.orderBy('name');
	return rows as RosterSummary[];
}

async function find(id: number, trx?: Db): Promise<StoredRoster | undefined> {
	return use(trx)('rosters').where({ id }).first(COLUMNS);
}

interface RosterFields {
	name: string;
	force: string;
	units: Unit[];
}

async function add(ownerId: string, r: RosterFields & { sourceUploadId?: string }, trx?: Db): Promise<StoredRoster> {
	const [row] = await use(trx)('rosters')
		.insert({
			owner_id: ownerId,
			name: r.name,
			force: r.force,
			units: JSON.stringify(r.units),
			source_upload_id: r.sourceUploadId ?? null
		})
		.returning(COLUMNS);
	return row as StoredRoster;
}

async function update(id: number, r: RosterFields, trx?: Db): Promise<StoredRoster | undefined> {
	const [row] = await use(trx)('rosters')
		.where({ id })
		.update({ name: r.name, force: r.force, units: JSON.stringify(r.units), updated_at: use(trx).fn.now() })
		.returning(COLUMNS);
	return row as StoredRoster | undefined;
}

async function remove(id: number, trx?: Db): Promise<boolean> {
	return (await use(trx)('rosters').where({ id }).delete()) > 0;
}

export const rosters = { listForOwner, find, add, update, remove };
