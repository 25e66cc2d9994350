// My rosters: the list, a new empty roster, and imports (upload → S3 → parse → roster, or the
// list of bad rows with their lines and the choice to take only the good ones).
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { issueList, rosterSchema } from '$lib/schemas/roster';
import { formatRowError, type RowError } from '$lib/rosters/parse';
import { rosters } from '$lib/server/db/rosters';
import { requireUser } from '$lib/server/auth/roles';
import { maxBytesFor, storeUpload, tooLarge } from '$lib/server/storage/files';
import { importUpload } from '$lib/server/storage/rosters';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	return { rosters: await rosters.listForOwner(user.id), importMaxBytes: maxBytesFor('roster-import') };
};

const fieldText = (v: FormDataEntryValue | null) => (typeof v === 'string' ? v : '');

interface ImportFailure {
	form: 'import';
	message: string;
	errors: (RowError & { text: string })[];
	fileId?: string;
	rows?: number;
	goodRows?: number;
	name?: string;
	force?: string;
}

async function runImport(userId: string, fileId: string, onlyGoodRows: boolean, name: string, force: string) {
	const outcome = await importUpload(userId, { fileId, onlyGoodRows, name, force });
	if (outcome.ok) {
		const skipped = outcome.skipped.length > 0 ? `&skipped=${outcome.result.rows - outcome.result.goodRows}` : '';
		redirect(303, `/rosters/${outcome.roster.id}?imported=${outcome.result.goodRows}${skipped}`);
	}
	const errors = 'errors' in outcome ? outcome.errors : [];
	const result = 'result' in outcome ? outcome.result : undefined;
	return fail(outcome.status, {
		form: 'import',
		message: outcome.message,
		errors: errors.map((e) => ({ ...e, text: formatRowError(e) })),
		// Offer "only the good rows" without a second upload when there are some to take.
		fileId: result && !result.fatal && result.units.length > 0 ? fileId : undefined,
		rows: result?.rows,
		goodRows: result?.goodRows,
		name,
		force
	} satisfies ImportFailure);
}

export const actions: Actions = {
	create: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = await request.formData().catch(() => null);
		if (!form) return fail(400, { form: 'create', message: 'The form could not be read', issues: [] });
		const parsed = rosterSchema.safeParse({ name: fieldText(form.get('name')), force: fieldText(form.get('force')), units: [] });
		if (!parsed.success) return fail(400, { form: 'create', message: 'Check the name and force', issues: issueList(parsed.error) });
		const roster = await rosters.add(user.id, parsed.data);
		redirect(303, `/rosters/${roster.id}`);
	},

	import: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = await request.formData().catch(() => null);
		if (!form) return fail(413, { form: 'import', message: tooLarge(maxBytesFor('roster-import')).message, errors: [] });
		const file = form.get('file');
		const name = fieldText(form.get('name'));
		const force = fieldText(form.get('force'));
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { form: 'import', message: 'Choose a CSV or JSON roster file first', errors: [], name, force });
		}
		if (file.size > maxBytesFor('roster-import')) {
			return fail(413, { form: 'import', message: tooLarge(maxBytesFor('roster-import')).message, errors: [], name, force });
		}
		const stored = await storeUpload({ ownerId: user.id, purpose: 'roster-import', bytes: new Uint8Array(await file.arrayBuffer()), fileName: file.name });
		if (!stored.ok) return fail(stored.status, { form: 'import', message: stored.message, errors: [], name, force });
		return runImport(user.id, stored.upload.id, form.get('onlyGoodRows') === 'on', name, force);
	},

	importGood: async ({ locals, request }) => {
		const user = requireUser(locals);
		const form = await request.formData().catch(() => null);
		const fileId = z.uuid().safeParse(form ? fieldText(form.get('fileId')) : '');
		if (!form || !fileId.success) return fail(400, { form: 'import', message: 'Upload the file again', errors: [] });
		return runImport(user.id, fileId.data, true, fieldText(form.get('name')), fieldText(form.get('force')));
	}
};
