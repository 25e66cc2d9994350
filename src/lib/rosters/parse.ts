// Entry point for roster imports: bytes in, a ParseResult out. The format is read from the
// content (a JSON roster starts with "{"), never from the file name, which the sender chose.
import { fatalResult, lineAt, type ParseResult, type RosterFileFormat } from './import-result';
import { parseRosterCsv } from './parse-csv';
import { parseRosterJson } from './parse-json';

export type TextCheck = { ok: true; text: string } | { ok: false; line: number; message: string };

/** UTF-8 text without NUL bytes (a byte-order mark is dropped), or where it stops being text. */
export function decodeText(bytes: Uint8Array): TextCheck {
	try {
		const text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
		const nul = text.indexOf('\u0000');
		if (nul >= 0) {
			return { ok: false, line: lineAt(text, nul), message: 'The file holds binary data (a NUL byte), not CSV or JSON text' };
		}
		return { ok: true, text };
	} catch {
		const loose = new TextDecoder('utf-8').decode(bytes);
		const bad = loose.indexOf('\uFFFD');
		return {
			ok: false,
			line: lineAt(loose, Math.max(0, bad)),
			message: 'The file is not UTF-8 text: it is binary data or another encoding. Save the roster as CSV (UTF-8) or JSON'
		};
	}
}

export function detectFormat(text: string): RosterFileFormat {
	return /^\s*[{[]/.test(text) ? 'json' : 'csv';
}

export function parseRosterText(text: string, format: RosterFileFormat = detectFormat(text)): ParseResult {
	return format === 'json' ? parseRosterJson(text) : parseRosterCsv(text);
}

export function parseRosterFile(bytes: Uint8Array): ParseResult {
	if (bytes.length === 0) return fatalResult('csv', 1, 'The file is empty');
	const decoded = decodeText(bytes);
	if (!decoded.ok) return fatalResult('csv', decoded.line, decoded.message);
	return parseRosterText(decoded.text);
}

export { formatRowError, type ParseResult, type RowError } from './import-result';
