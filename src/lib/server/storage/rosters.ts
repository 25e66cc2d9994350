// Rosters as files, and the owner check every roster route shares: import a stored upload
// into a new roster (all rows clean, or only the good ones when the player says so).
import { issueList, rosterSchema } from '$lib/schemas/roster';
import { parseRosterFile, formatRowError, type ParseResult, type RowError } from '$lib/rosters/parse';
import { rosters, type StoredRoster } from '$lib/server/db/rosters';
import { readOwnUpload, type Refusal } from './files';

const MAX_ID = 2 ** 31 - 1; // rosters.id is a serial (int4): larger numbers are no roster

/** The roster, if this user owns it; 404 for ids that cannot exist, 403 for someone else's. */
export async function ownRoster(userId: string, idParam: string): Promise<{ ok: true; roster: StoredRoster } | Refusal> {
	const id = /^\d{1,10}$/.test(idParam) ? Number(idParam) : NaN;
	if (!Number.isInteger(id) || id < 1 || id > MAX_ID) return { ok: false, status: 404, message: 'No such roster' };
	const roster = await rosters.find(id);
	if (!roster) return { ok: false, status: 404, message: 'No such roster' };
	if (roster.ownerId !== userId) return { ok: false, status: 403, message: 'This roster belongs to someone else' };
	return { ok: true, roster };
}

export type ImportOutcome =
	| { ok: true; roster: StoredRoster; result: ParseResult; skipped: RowError[] }
	| { ok: false; status: 400; message: string; errors: RowError[]; result?: ParseResult }
	| Refusal;

export async function importUpload(
	userId: string,
	input: { fileId: string; onlyGoodRows: boolean; name?: string; force?: string }
): Promise<ImportOutcome> {
	const file = await readOwnUpload(userId, input.fileId);
	if (!file.ok) return file;
	if (file.upload.purpose !== 'roster-import') {
		return { ok: false, status: 400, message: 'That file was not uploaded as a roster import', errors: [] };
	}
	const result = parseRosterFile(file.bytes);
	const count = (n: number) => `${n} row${n === 1 ? '' : 's'}`;
	if (result.fatal) return { ok: false, status: 400, message: formatRowError(result.errors[0]), errors: result.errors, result };
	if (result.errors.length > 0 && !input.onlyGoodRows) {
		return {
			ok: false,
			status: 400,
			message: `${count(result.rows - result.goodRows)} of ${result.rows} ${result.rows - result.goodRows === 1 ? 'has' : 'have'} problems: nothing was saved`,
			errors: result.errors,
			result
		};
	}
	if (result.rows > 0 && result.units.length === 0) {
		return { ok: false, status: 400, message: 'No row of the file is good: nothing was saved', errors: result.errors, result };
	}
	const parsed = rosterSchema.safeParse({
		name: input.name?.trim() || result.name || 'Imported roster',
		force: input.force?.trim() || result.force || '',
		units: result.units
	});
	if (!parsed.success) {
		return {
			ok: false,
			status: 400,
			message: 'The roster name or force is not right',
			errors: issueList(parsed.error).map((i) => ({ line: 1, field: i.path.join('.'), message: i.message })),
			result
		};
	}
	const roster = await rosters.add(userId, { ...parsed.data, sourceUploadId: file.upload.id });
	return { ok: true, roster, result, skipped: result.errors };
}

/** What the API shows of a roster. */
export function rosterView(r: StoredRoster) {
	return { id: r.id, name: r.name, force: r.force, units: r.units, sourceUploadId: r.sourceUploadId, createdAt: r.createdAt, updatedAt: r.updatedAt };
}
