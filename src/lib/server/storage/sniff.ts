// What an upload really is, from its bytes (file-type's magic numbers), never from its name
// or the Content-Type the sender claimed. Text formats have no magic number: a roster import
// must be UTF-8 text with no NUL bytes, and the roster parser does the rest.
import { fileTypeFromBuffer } from 'file-type';
import { imageSize } from 'image-size';
import { crc32 } from 'node:zlib';
import { decodeText, detectFormat } from '$lib/rosters/parse';
import type { UploadPurpose } from '$lib/server/db/uploads';

export const PICTURE_TYPES = ['image/png', 'image/jpeg', 'image/webp'] as const;

/** Wider or taller than this is no unit photo (and a decompression bomb's favourite shape). */
export const PICTURE_MAX_SIDE_PX = 8192;

/** PNG's first chunk is IHDR, 13 bytes, with a CRC-32 of its name and data (PNG spec, 5.3). */
function pngHeaderIntact(bytes: Uint8Array): boolean {
	if (bytes.length < 33) return false;
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const name = String.fromCharCode(...bytes.subarray(12, 16));
	return view.getUint32(8) === 13 && name === 'IHDR' && crc32(bytes.subarray(12, 29)) === view.getUint32(29);
}

/**
 * The picture's header must parse (image-size: PNG's IHDR, JPEG's frame header, WebP's VP8
 * chunk; for PNG also the IHDR's checksum), not just its first bytes: a PNG signature followed
 * by junk is no picture.
 */
function pictureHeader(bytes: Uint8Array, mime: string): { ok: true } | { ok: false; message: string } {
	const damaged = { ok: false, message: 'The picture is damaged: its header cannot be read' } as const;
	if (mime === 'image/png' && !pngHeaderIntact(bytes)) return damaged;
	let size: { width?: number; height?: number };
	try {
		size = imageSize(bytes);
	} catch {
		return damaged;
	}
	const { width = 0, height = 0 } = size;
	if (width < 1 || height < 1) return { ok: false, message: 'The picture is damaged: it has no width or height' };
	if (width > PICTURE_MAX_SIDE_PX || height > PICTURE_MAX_SIDE_PX) {
		return { ok: false, message: `The picture is ${width} × ${height} px; at most ${PICTURE_MAX_SIDE_PX} px a side, please` };
	}
	return { ok: true };
}

export type Sniffed = { ok: true; contentType: string } | { ok: false; message: string };

export async function sniff(bytes: Uint8Array, purpose: UploadPurpose): Promise<Sniffed> {
	if (bytes.length === 0) return { ok: false, message: 'The file is empty' };
	const detected = await fileTypeFromBuffer(bytes);
	if (purpose === 'unit-picture') {
		if (detected && (PICTURE_TYPES as readonly string[]).includes(detected.mime)) {
			const header = pictureHeader(bytes, detected.mime);
			return header.ok ? { ok: true, contentType: detected.mime } : header;
		}
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
