// What an import parse gives back, whatever the file format: the good units, and every
// problem with the line it is on, so the player can fix the file or take only the good rows.
import type { Unit } from '$lib/schemas/roster';

export type RosterFileFormat = 'csv' | 'json';

export interface RowError {
	/** 1-based line in the file as a text editor counts it. */
	line: number;
	/** The CSV column or JSON path the problem is in, when there is one. */
	field?: string;
	/** The unit (or leader) name on that row, when it could be read. */
	unit?: string;
	message: string;
}

export interface ParseResult {
	format: RosterFileFormat;
	/** From the file (CSV preamble, JSON fields), when it says. */
	name?: string;
	force?: string;
	/** Units from the rows without problems, with their joined leaders when those are good too. */
	units: Unit[];
	errors: RowError[];
	/** Unit and leader rows found in the file, and how many of them are good. */
	rows: number;
	goodRows: number;
	/** A problem with the whole file (not text, no header, not JSON): no row can be taken. */
	fatal: boolean;
}

export function formatRowError(e: RowError): string {
	const where = e.field ? `Line ${e.line} (${e.field})` : `Line ${e.line}`;
	return `${where}: ${e.message}`;
}

export function fatalResult(format: RosterFileFormat, line: number, message: string): ParseResult {
	return { format, units: [], errors: [{ line, message }], rows: 0, goodRows: 0, fatal: true };
}

/** 1-based line of a character offset. */
export function lineAt(text: string, offset: number): number {
	let line = 1;
	for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) line++;
	return line;
}
