// The request id from the URL, or the 400 to answer.
import { z } from 'zod';
import { jsonError } from '$lib/server/http';

const idSchema = z.coerce.number().int().positive().max(2 ** 31 - 1);

export function requestId(raw: string | undefined): number | Response {
	const p = idSchema.safeParse(raw);
	return p.success ? p.data : jsonError(400, 'The request id must be a positive whole number');
}
