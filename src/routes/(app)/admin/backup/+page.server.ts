// Admin backup page: links to export a game or a club, and a form to import a backup file.
// The import runs the same checks as the API (admins only, the document's schema, all or nothing).
import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/roles';
import { backupDocumentSchema, importDocument } from '$lib/server/backup';
import type { Actions, PageServerLoad } from './$types';

/** A backup file is JSON text; the server's body limit caps it first. */
const MAX_FILE_BYTES = 6 * 1024 * 1024;

export const load: PageServerLoad = ({ locals, url }) => {
	requireRole(locals, 'admin', url);
	return {};
};

export const actions: Actions = {
	import: async ({ locals, request, url }) => {
		requireRole(locals, 'admin', url);
		let text: string;
		try {
			const form = await request.formData();
			const file = form.get('file');
			if (!(file instanceof File) || file.size === 0) return fail(400, { problem: 'Choose a backup file (.json) to import' });
			if (file.size > MAX_FILE_BYTES) return fail(413, { problem: 'The file is larger than a backup can be (6 MiB)' });
			text = await file.text();
		} catch {
			return fail(400, { problem: 'The form could not be read' });
		}
		let raw: unknown;
		try {
			raw = JSON.parse(text);
		} catch {
			return fail(400, { problem: 'The file is not JSON' });
		}
		const doc = backupDocumentSchema.safeParse(raw);
		if (!doc.success) return fail(400, { problem: 'The file is not an Inchwarden backup' });
		const result = await importDocument(doc.data);
		if (!result.ok) return fail(result.status, { problem: result.message });
		const total = Object.values(result.counts).reduce((a, b) => a + (b ?? 0), 0);
		return { done: `Imported ${total} records (${doc.data.scope.kind} #${doc.data.scope.id})` };
	}
};
