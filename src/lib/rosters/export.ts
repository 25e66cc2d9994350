// Writes a roster in the two import formats, so that importing an export gives the same
// roster back (tests/unit/rosters check this for random rosters).
import Papa from 'papaparse';
import type { Profile, Roster } from '$lib/schemas/roster';
import { CSV_COLUMNS, CSV_FIRST_LINE, escapeCell, type CsvColumn } from './csv-format';
import { formatHullPoints } from './footprint';
import { JSON_FORMAT, JSON_VERSION } from './parse-json';

// String(n) is the shortest text that reads back as the same double, so numbers survive.
const n = (v: number | undefined) => (v === undefined ? '' : String(v));

function profileRow(p: Profile, joins: string): Record<CsvColumn, string> {
	const f = p.footprint;
	return {
		name: escapeCell(p.name),
		joins: escapeCell(joins),
		class: p.class,
		flies: p.flies ? 'yes' : 'no',
		allowance_in: n(p.allowanceIn),
		shape: f.shape,
		diameter_mm: f.shape === 'round' ? n(f.diameterMm) : '',
		length_mm: f.shape === 'oval' ? n(f.lengthMm) : '',
		width_mm: f.shape === 'oval' ? n(f.widthMm) : '',
		hull_in: f.shape === 'hull' ? formatHullPoints(f.points) : '',
		pieces: n(p.pieces),
		value: n(p.value),
		ring_radius_in: n(p.ring?.radiusIn),
		ring_label: p.ring ? escapeCell(p.ring.label) : '',
		points: n(p.points)
	};
}

/** A one-line preamble value: line breaks would end the comment line early. */
const oneLine = (s: string) => s.replace(/[\r\n]+/g, ' ');

export function rosterToCsv(roster: Pick<Roster, 'name' | 'force' | 'units'>): string {
	const rows: Record<CsvColumn, string>[] = [];
	for (const u of roster.units) {
		rows.push(profileRow(u, ''));
		if (u.leader) rows.push(profileRow(u.leader, u.name));
	}
	const table = Papa.unparse({ fields: [...CSV_COLUMNS], data: rows.map((r) => CSV_COLUMNS.map((c) => r[c])) }, { newline: '\n' });
	return [CSV_FIRST_LINE, `# name: ${oneLine(roster.name)}`, `# force: ${oneLine(roster.force)}`, table].join('\n') + '\n';
}

export function rosterToJson(roster: Pick<Roster, 'name' | 'force' | 'units'>): string {
	return JSON.stringify({ format: JSON_FORMAT, version: JSON_VERSION, name: roster.name, force: roster.force, units: roster.units }, null, 2) + '\n';
}

/** A safe download name: letters, digits and dashes only. */
export function exportFileName(name: string, ext: 'csv' | 'json'): string {
	const base = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
	return `${base || 'roster'}.${ext}`;
}

/** The downloadable template: the columns and one row of each kind, to overwrite. */
export const TEMPLATE_ROSTER: Pick<Roster, 'name' | 'force' | 'units'> = {
	name: 'My roster',
	force: 'My force',
	units: [
		{
			name: 'Example foot unit', class: 'foot', flies: false, allowanceIn: 6,
			footprint: { shape: 'round', diameterMm: 32 }, pieces: 10, value: 1, points: 100,
			leader: { name: 'Example leader', class: 'foot', flies: false, allowanceIn: 6, footprint: { shape: 'round', diameterMm: 40 }, pieces: 1, value: 1, ring: { radiusIn: 6, label: 'Example ring' }, points: 40 }
		},
		{ name: 'Example riders', class: 'mounted', flies: false, allowanceIn: 10, footprint: { shape: 'oval', lengthMm: 75, widthMm: 42 }, pieces: 3, value: 1, points: 90 },
		{ name: 'Example vehicle', class: 'vehicle', flies: false, allowanceIn: 10, footprint: { shape: 'hull', points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] }, pieces: 1, value: 0, points: 150 }
	]
};
