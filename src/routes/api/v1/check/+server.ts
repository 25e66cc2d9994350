// POST /api/v1/check: the stateless referee. Reads the body (at most 1 MiB), validates it with
// the shared schema and answers checkMove's report; bad input is a 400 or 413, never a 500.
import { json } from '@sveltejs/kit';
import { checkMove } from '$lib/referee';
import { checkRequestSchema, LIMITS } from '$lib/schemas/check';
import type { RequestHandler } from './$types';

function error(status: number, message: string, issues?: unknown[]): Response {
	return json({ error: issues ? { message, issues } : { message } }, { status });
}

const TOO_LARGE = `The request body is larger than ${LIMITS.bodyBytes} bytes`;

/** The body as text, or null once it passes the limit (stops reading there). */
async function readCapped(request: Request, maxBytes: number): Promise<string | null> {
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > maxBytes) return null;
	if (!request.body) return '';
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let total = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		total += value.byteLength;
		if (total > maxBytes) {
			await reader.cancel().catch(() => {});
			return null;
		}
		chunks.push(value);
	}
	const all = new Uint8Array(total);
	let at = 0;
	for (const c of chunks) {
		all.set(c, at);
		at += c.byteLength;
	}
	return new TextDecoder().decode(all);
}

export const POST: RequestHandler = async ({ request }) => {
	let text: string | null;
	try {
		text = await readCapped(request, LIMITS.bodyBytes);
	} catch {
		return error(400, 'The request body could not be read');
	}
	if (text === null) return error(413, TOO_LARGE);

	let raw: unknown;
	try {
		raw = JSON.parse(text);
	} catch {
		return error(400, 'The request body is not valid JSON');
	}

	const parsed = checkRequestSchema.safeParse(raw);
	if (!parsed.success) {
		return error(
			400,
			'The request body does not match the check request schema',
			parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }))
		);
	}

	try {
		return json(checkMove(parsed.data));
	} catch {
		// The schema should rule this out; if the engine still fails, the input is what we blame,
		// and the caller gets an answer rather than a crash.
		return error(400, 'The move could not be checked: the table it describes is not one the referee can measure');
	}
};
