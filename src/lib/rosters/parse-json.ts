// Reads a roster JSON file (format in docs/rosters.md): each unit is checked on its own
// against the shared schema, and problems name the line the unit starts on.
import { ROSTER_LIMITS, rosterSchema, unitSchema, type Unit } from '$lib/schemas/roster';
import { fatalResult, lineAt, type ParseResult, type RowError } from './import-result';

export const JSON_FORMAT = 'inchwarden-roster';
export const JSON_VERSION = 1;

/**
 * Start offsets of the elements of the top-level "units" array. JSON.parse keeps no
 * positions, so this walks the (already valid) text once, skipping strings and nesting.
 */
export function unitOffsets(text: string): number[] {
	let i = 0;
	const ws = () => {
		while (i < text.length && /\s/.test(text[i])) i++;
	};
	const str = (): string => {
		const start = i;
		i++; // opening quote
		while (i < text.length && text[i] !== '"') i += text[i] === '\\' ? 2 : 1;
		i++;
		return JSON.parse(text.slice(start, i)) as string;
	};
	const skip = (): void => {
		ws();
		const c = text[i];
		if (c === '"') return void str();
		if (c === '{' || c === '[') {
			const close = c === '{' ? '}' : ']';
			i++;
			ws();
			if (text[i] === close) return void i++;
			for (;;) {
				if (c === '{') {
					ws();
					str();
					ws();
					i++; // colon
				}
				skip();
				ws();
				if (text[i++] === close) return;
			}
		}
		while (i < text.length && !/[\s,\]}]/.test(text[i])) i++;
	};

	const out: number[] = [];
	ws();
	if (text[i] !== '{') return out;
	i++;
	ws();
	if (text[i] === '}') return out;
	for (;;) {
		ws();
		const key = str();
		ws();
		i++; // colon
		ws();
		if (key === 'units' && text[i] === '[') {
			i++;
			ws();
			if (text[i] === ']') i++;
			else
				for (;;) {
					ws();
					out.push(i);
					skip();
					ws();
					if (text[i++] === ']') break;
				}
		} else skip();
		ws();
		if (text[i++] !== ',') break;
	}
	return out;
}

function syntaxLine(text: string, message: string): number {
	const lc = /line (\d+) column/.exec(message);
	if (lc) return Number(lc[1]);
	const pos = /position (\d+)/.exec(message);
	return pos ? lineAt(text, Number(pos[1])) : 1;
}

export function parseRosterJson(text: string): ParseResult {
	let doc: unknown;
	try {
		doc = JSON.parse(text);
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		return fatalResult('json', syntaxLine(text, message), `The file is not valid JSON: ${message}`);
	}
	if (typeof doc !== 'object' || doc === null || Array.isArray(doc)) {
		return fatalResult('json', 1, `A roster JSON file is one object with "format": "${JSON_FORMAT}" and a "units" list`);
	}
	const d = doc as Record<string, unknown>;
	if (d.format !== undefined && d.format !== JSON_FORMAT) {
		return fatalResult('json', 1, `"format" is "${String(d.format)}"; a roster file says "${JSON_FORMAT}"`);
	}
	if (d.version !== undefined && d.version !== JSON_VERSION) {
		return fatalResult('json', 1, `This is format version ${String(d.version)}; only version ${JSON_VERSION} can be read`);
	}
	if (!Array.isArray(d.units)) {
		return fatalResult('json', 1, 'The roster has no "units" list');
	}
	const offsets = unitOffsets(text);
	const head = rosterSchema.pick({ name: true, force: true }).partial().safeParse({ name: d.name, force: d.force });
	const errors: RowError[] = [];
	if (!head.success) {
		for (const issue of head.error.issues) errors.push({ line: 1, field: issue.path.join('.'), message: issue.message });
	}

	const units: Unit[] = [];
	let good = 0;
	d.units.forEach((raw, index) => {
		const line = offsets[index] !== undefined ? lineAt(text, offsets[index]) : 1;
		const label = typeof raw === 'object' && raw && typeof (raw as { name?: unknown }).name === 'string' ? (raw as { name: string }).name.trim() : undefined;
		const rowErrors: RowError[] = [];
		const parsed = unitSchema.safeParse(raw);
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				rowErrors.push({ line, unit: label, field: `units[${index}]${issue.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('')}`, message: issue.message });
			}
		} else {
			const earlier = units.find((u) => u.name.toLowerCase() === parsed.data.name.toLowerCase());
			if (earlier) rowErrors.push({ line, unit: label, field: `units[${index}].name`, message: `Another unit is already called "${parsed.data.name}"` });
			else if (units.length >= ROSTER_LIMITS.units) rowErrors.push({ line, unit: label, message: `A roster may have at most ${ROSTER_LIMITS.units} units` });
			else {
				units.push(parsed.data);
				good++;
			}
		}
		errors.push(...rowErrors);
	});

	return {
		format: 'json',
		name: head.success ? head.data.name || undefined : undefined,
		force: head.success ? head.data.force || undefined : undefined,
		units,
		errors,
		rows: d.units.length,
		goodRows: good,
		fatal: false
	};
}
