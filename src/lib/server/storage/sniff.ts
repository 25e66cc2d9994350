// What an upload really is, from its bytes (file-type's magic numbers), never from its name
// or the Content-Type the sender claimed. Text formats have no magic number: a roster import
// must be UTF-8 text with no NUL bytes, and the roster parser does the rest.
import { fileTypeFromBuffer } from 'file-type';
import { decodeText, detectFormat } from '$lib/rosters/parse';
import type { UploadPurpose } from '$lib/server/db/uploads';

export const PICTURE_TYPES = ['image/png', 'image/jpeg', 'image/webp'] as const;

export type Sniffed = { ok: true; contentType: string } | { ok: false; message: string };

export async function sniff(bytes: Uint8Array, purpose: UploadPurpose): Promise<Sniffed> {
	if (bytes.length === 0) return { ok: false, message: 'The file is empty' };
	const detected = await fileTypeFromBuffer(bytes);
	if (purpose === 'unit-picture') {
		if (detected && (PICTURE_TYPES as readonly string[]).includes(detected.mime)) return { ok: true, contentType: detected.mime };
		return {
			ok: false,
			message: `A unit picture must be a PNG, JPEG or WebP image; this file is ${detected ? `${detected.ext.toUpperCase()} (${detected.mime})` : 'not an image'}`
		};
	}
	if (detected) {
		const hint = detected.ext === 'xlsx' || detected.ext === 'ods' ? ': save the sheet as CSV (UTF-8) first' : '';
		return { ok: false, message: `A roster file must be CSV or JSON text; this file is ${detected.ext.toUpperCase()} (${detected.mime})${hint}` };
	}
	const text = decodeText(bytes);
	if (!text.ok) return { ok: false, message: `A roster file must be CSV or JSON text. Line ${text.line}: ${text.message}` };
	return { ok: true, contentType: detectFormat(text.text) === 'json' ? 'application/json' : 'text/csv; charset=utf-8' };
}
