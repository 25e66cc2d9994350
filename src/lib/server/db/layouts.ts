// Saved table layouts: find / list / add / update / remove. Updates name the version they were
// edited from and change nothing when it is stale; owner checks are the caller's (routes).
import { use, type Db } from './index';
import { LAYOUT_SCHEMA_VERSION, type Layout, type LayoutSummary, type SavedLayout } from '$lib/schemas/layout';

const SUMMARY_COLUMNS = [
	'l.id',
	'l.name',
	'l.owner_id as ownerId',
	'u.display_name as ownerName',
	'l.version',
	'l.created_at as createdAt',
	'l.updated_at as updatedAt'
];

interface Row {
	id: number;
	name: string;
	ownerId: string;
	ownerName: string;
	version: number;
	createdAt: Date;
	updatedAt: Date;
	terrainCount: number;
	objectiveCount: number;
	doc?: Layout;
}

function summary(r: Row): LayoutSummary {
	return {
		id: r.id,
		name: r.name,
		ownerId: r.ownerId,
		ownerName: r.ownerName,
		version: r.version,
		terrainCount: r.terrainCount,
		objectiveCount: r.objectiveCount,
		createdAt: new Date(r.createdAt).toISOString(),
		updatedAt: new Date(r.updatedAt).toISOString()
	};
}

function base(trx?: Db) {
	const q = use(trx);
	return q('layouts as l')
		.join('users as u', 'u.id', 'l.owner_id')
		.select(
			...SUMMARY_COLUMNS,
			q.raw("jsonb_array_length(l.doc->'terrain')::int as \"terrainCount\""),
			q.raw("jsonb_array_length(l.doc->'objectives')::int as \"objectiveCount\"")
		);
}

/** One layout with its document, or null. */
export async function find(id: number, trx?: Db): Promise<SavedLayout | null> {
	const row = (await base(trx).select('l.doc').where('l.id', id).first()) as Row | undefined;
	return row ? { ...summary(row), doc: row.doc as Layout } : null;
}

/** Every saved layout (any signed-in user may reuse one): the caller's first, then by name. */
export async function list(viewerId: string, trx?: Db): Promise<LayoutSummary[]> {
	const rows = (await base(trx)
		.orderByRaw('(l.owner_id = ?) desc', [viewerId])
		.orderBy('l.name')
		.orderBy('l.id')
		.limit(500)) as Row[];
	return rows.map(summary);
}

export async function add(ownerId: string, doc: Layout, trx?: Db): Promise<SavedLayout> {
	const [{ id }] = await use(trx)('layouts')
		.insert({ owner_id: ownerId, name: doc.name, doc: JSON.stringify(doc), schema_version: LAYOUT_SCHEMA_VERSION })
		.returning(['id']);
	const saved = await find(id, trx);
	if (!saved) throw new Error('layout vanished after insert');
	return saved;
}

export type UpdateResult = { kind: 'ok'; layout: SavedLayout } | { kind: 'missing' } | { kind: 'stale'; current: SavedLayout };

/** Replace the document if `version` is still the current one; one statement, so two saves cannot both win. */
export async function update(id: number, doc: Layout, version: number, trx?: Db): Promise<UpdateResult> {
	const q = use(trx);
	const changed = await q('layouts')
		.where({ id, version })
		.update({
			name: doc.name,
			doc: JSON.stringify(doc),
			schema_version: LAYOUT_SCHEMA_VERSION,
			version: q.raw('version + 1'),
			updated_at: q.fn.now()
		});
	const current = await find(id, trx);
	if (!current) return { kind: 'missing' };
	return changed === 1 ? { kind: 'ok', layout: current } : { kind: 'stale', current };
}

export async function remove(id: number, trx?: Db): Promise<boolean> {
	return (await use(trx)('layouts').where({ id }).delete()) > 0;
}

export const layouts = { find, list, add, update, remove };
