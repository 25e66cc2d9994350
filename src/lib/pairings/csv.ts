// CSV text for the results and statistics exports (RFC 4180 quoting). A text cell that a
// spreadsheet would run as a formula (= + - @ at its start) is prefixed with an apostrophe.
export type Cell = string | number | null | undefined;

function cell(v: Cell): string {
	if (v === null || v === undefined) return '';
	if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
	const safe = /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
	return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function toCsv(header: readonly string[], rows: readonly (readonly Cell[])[]): string {
	return [header, ...rows].map((r) => r.map(cell).join(',')).join('\r\n') + '\r\n';
}
