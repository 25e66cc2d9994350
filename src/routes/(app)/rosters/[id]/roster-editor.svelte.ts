// The roster editor's state, one instance per page: drafts that may be half-typed, turned
// into a candidate roster that the shared schema checks on every keystroke.
import { footprintSchema, OVAL_BASES_MM, rosterSchema, ROUND_BASES_MM, type PieceClass, type Profile, type Unit } from '$lib/schemas/roster';
import { footprintExtentMm, formatHullPoints, parseHullPoints, type Footprint } from '$lib/rosters/footprint';

export interface DraftFootprint {
	/** "round:32", "round:other", "oval:75x42", "oval:other" or "hull". */
	choice: string;
	diameterMm: number | null;
	lengthMm: number | null;
	widthMm: number | null;
	hullText: string;
}

export interface DraftProfile {
	name: string;
	class: PieceClass;
	flies: boolean;
	allowanceIn: number | null;
	footprint: DraftFootprint;
	pieces: number | null;
	value: number | null;
	ringOn: boolean;
	ringRadiusIn: number | null;
	ringLabel: string;
	points: number | null;
}

export interface DraftUnit extends DraftProfile {
	key: number;
	leader: DraftProfile | null;
}

export const roundChoice = (d: number) => ((ROUND_BASES_MM as readonly number[]).includes(d) ? `round:${d}` : 'round:other');
export const ovalChoice = (l: number, w: number) => (OVAL_BASES_MM.some(([a, b]) => a === l && b === w) ? `oval:${l}x${w}` : 'oval:other');

export function draftFootprint(f: Footprint): DraftFootprint {
	const blank = { diameterMm: null, lengthMm: null, widthMm: null, hullText: '' };
	if (f.shape === 'round') return { ...blank, choice: roundChoice(f.diameterMm), diameterMm: f.diameterMm };
	if (f.shape === 'oval') return { ...blank, choice: ovalChoice(f.lengthMm, f.widthMm), lengthMm: f.lengthMm, widthMm: f.widthMm };
	return { ...blank, choice: 'hull', hullText: formatHullPoints(f.points) };
}

export function draftProfile(p: Profile): DraftProfile {
	return {
		name: p.name,
		class: p.class,
		flies: p.flies,
		allowanceIn: p.allowanceIn,
		footprint: draftFootprint(p.footprint),
		pieces: p.pieces,
		value: p.value,
		ringOn: !!p.ring,
		ringRadiusIn: p.ring?.radiusIn ?? 6,
		ringLabel: p.ring?.label ?? '',
		points: p.points
	};
}

export const NEW_FOOTPRINTS: Record<'round' | 'oval' | 'hull', Footprint> = {
	round: { shape: 'round', diameterMm: 32 },
	oval: { shape: 'oval', lengthMm: 60, widthMm: 35 },
	hull: { shape: 'hull', points: [[-2.5, -1.5], [2.5, -1.5], [2.5, 1.5], [-2.5, 1.5]] }
};

export function newProfile(name: string, shape: 'round' | 'oval' | 'hull' = 'round'): DraftProfile {
	return draftProfile({ name, class: shape === 'hull' ? 'vehicle' : 'foot', flies: false, allowanceIn: 6, footprint: NEW_FOOTPRINTS[shape], pieces: shape === 'hull' ? 1 : 5, value: shape === 'hull' ? 0 : 1, points: 0 });
}

const num = (v: number | null | undefined) => (v === null || v === undefined || Number.isNaN(v) ? undefined : v);

/** The footprint the draft describes, and the hull text's own problem if it cannot be read. */
export function candidateFootprint(f: DraftFootprint): { value: unknown; hullError?: string } {
	if (f.choice.startsWith('round')) return { value: { shape: 'round', diameterMm: num(f.diameterMm) } };
	if (f.choice.startsWith('oval')) return { value: { shape: 'oval', lengthMm: num(f.lengthMm), widthMm: num(f.widthMm) } };
	const parsed = parseHullPoints(f.hullText);
	return parsed.ok ? { value: { shape: 'hull', points: parsed.points } } : { value: { shape: 'hull', points: [] }, hullError: parsed.message };
}

function candidateProfile(p: DraftProfile) {
	return {
		name: p.name,
		class: p.class,
		flies: p.flies,
		allowanceIn: num(p.allowanceIn),
		footprint: candidateFootprint(p.footprint).value,
		pieces: num(p.pieces),
		value: num(p.value),
		ring: p.ringOn ? { radiusIn: num(p.ringRadiusIn), label: p.ringLabel } : undefined,
		points: num(p.points)
	};
}

/** A footprint that passes the schema, for the preview; null while it is half-typed. */
export function validFootprint(f: DraftFootprint): Footprint | null {
	const r = footprintSchema.safeParse(candidateFootprint(f).value);
	return r.success ? r.data : null;
}

export class RosterEditor {
	name = $state('');
	force = $state('');
	units = $state<DraftUnit[]>([]);
	/** The last version the server accepted, to tell saved from unsaved. */
	savedJson = $state('');
	serverIssues = $state<{ path: string[]; message: string }[]>([]);
	#nextKey = 1;

	constructor(roster: { name: string; force: string; units: Unit[] }) {
		this.name = roster.name;
		this.force = roster.force;
		this.units = roster.units.map((u) => ({ ...draftProfile(u), key: this.#nextKey++, leader: u.leader ? draftProfile(u.leader) : null }));
		this.savedJson = JSON.stringify(this.candidate);
	}

	get candidate() {
		return {
			name: this.name,
			force: this.force,
			units: this.units.map((u) => ({ ...candidateProfile(u), ...(u.leader ? { leader: candidateProfile(u.leader) } : {}) }))
		};
	}

	check = $derived(rosterSchema.safeParse(this.candidate));

	/** Problems by path ("units.0.footprint.diameterMm"), the schema's and the hull text's. */
	errors = $derived.by(() => {
		const out: Record<string, string> = {};
		this.units.forEach((u, i) => {
			const own = candidateFootprint(u.footprint).hullError;
			if (own) out[`units.${i}.footprint.points`] = own;
			const lead = u.leader && candidateFootprint(u.leader.footprint).hullError;
			if (lead) out[`units.${i}.leader.footprint.points`] = lead;
		});
		const issues = this.check.success ? [] : this.check.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
		for (const i of [...issues, ...this.serverIssues]) out[i.path.join('.')] ??= i.message;
		return out;
	});

	problemCount = $derived(Object.keys(this.errors).length);
	dirty = $derived(JSON.stringify(this.candidate) !== this.savedJson);

	totalPoints = $derived(this.units.reduce((s, u) => s + (num(u.points) ?? 0) + (u.leader ? (num(u.leader.points) ?? 0) : 0), 0));
	totalPieces = $derived(this.units.reduce((s, u) => s + (num(u.pieces) ?? 0) + (u.leader ? (num(u.leader.pieces) ?? 0) : 0), 0));

	/**
	 * One scale for every preview on the page, so footprints compare at a glance: the biggest
	 * fits a 160 px box, capped at 3 px per mm so a lone small base is not drawn huge.
	 */
	pxPerMm = $derived.by(() => {
		let reachMm = 12.7; // never zoom past a 1 in box
		for (const p of this.units.flatMap((u) => (u.leader ? [u, u.leader] : [u]))) {
			const f = validFootprint(p.footprint);
			if (!f) continue;
			const e = footprintExtentMm(f);
			reachMm = Math.max(reachMm, -e.minX, -e.minY, e.maxX, e.maxY);
		}
		return Math.min(3, 160 / (2 * reachMm * 1.1));
	});

	addUnit(shape: 'round' | 'oval' | 'hull') {
		this.units.push({ ...newProfile(`New unit ${this.units.length + 1}`, shape), key: this.#nextKey++, leader: null });
	}
	removeUnit(index: number) {
		this.units.splice(index, 1);
	}
	moveUnit(index: number, by: -1 | 1) {
		const to = index + by;
		if (to < 0 || to >= this.units.length) return;
		const [u] = this.units.splice(index, 1);
		this.units.splice(to, 0, u);
	}
	addLeader(index: number) {
		const u = this.units[index];
		u.leader = { ...newProfile(`${u.name} leader`), pieces: 1, class: u.class };
	}
	removeLeader(index: number) {
		this.units[index].leader = null;
	}
	markSaved() {
		this.savedJson = JSON.stringify(this.candidate);
		this.serverIssues = [];
	}
}
