// Typed fetch helpers for the game API (/api/v1/games/**), used by the play screen. Every
// answer comes back as a value (status + body), so the screen shows refusals in words.
import type { CheckReport, Waypoint } from '../../schemas/check';
import type { GameView, MoveLogEntry, Pose, Side } from '../../schemas/game';
import type { MoveKind } from '../../schemas/check';
import type { RulingRequestView } from '../../schemas/ruling';

export interface ApiError {
	message: string;
	issues?: { path: string[]; message: string }[];
}

export interface ChangeAnswer {
	status: number;
	ok: boolean;
	seq?: number;
	game?: GameView;
	report?: CheckReport | null;
	error?: ApiError;
}

async function send(path: string, method: string, body?: unknown): Promise<ChangeAnswer> {
	let res: Response;
	try {
		res = await fetch(path, {
			method,
			headers: body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
	} catch {
		return { status: 0, ok: false, error: { message: 'The server cannot be reached: check the connection and try again' } };
	}
	let json: Record<string, unknown> = {};
	try {
		json = await res.json();
	} catch {
		/* an empty or non-JSON answer: the status says enough */
	}
	return { status: res.status, ok: res.ok, ...(json as object) } as ChangeAnswer;
}

export function gameApi(id: number) {
	const base = `/api/v1/games/${id}`;
	return {
		get: () => send(base, 'GET'),
		log: async (after = 0): Promise<{ seq: number; entries: MoveLogEntry[] } | null> => {
			const r = (await send(`${base}/log?after=${after}`, 'GET')) as unknown as { ok: boolean; seq: number; entries: MoveLogEntry[] };
			return r.ok ? { seq: r.seq, entries: r.entries } : null;
		},
		roster: (seq: number, side: Side, rosterId: number) => send(`${base}/roster`, 'POST', { seq, side, rosterId }),
		deploy: (seq: number, side: Side, placements: { piece: string; at: Pose }[]) => send(`${base}/deploy`, 'POST', { seq, side, placements }),
		roll: (seq: number, unit: string) => send(`${base}/roll`, 'POST', { seq, unit }),
		move: (seq: number, unit: string, kind: MoveKind, paths?: Record<string, Waypoint[]>) => send(`${base}/moves`, 'POST', { seq, unit, kind, paths }),
		accept: (seq: number) => send(`${base}/accept`, 'POST', { seq }),
		takeBack: (seq: number) => send(`${base}/take-back`, 'POST', { seq }),
		rulingRequest: (seq: number, note: string) => send(`${base}/ruling-request`, 'POST', { seq, note }),
		endTurn: (seq: number) => send(`${base}/end-turn`, 'POST', { seq }),
		/** the game's ruling requests (the judge desk's route) */
		requests: async (): Promise<RulingRequestView[] | null> => {
			const r = (await send(`/api/v1/rulings?game=${id}`, 'GET')) as unknown as { ok: boolean; requests?: RulingRequestView[] };
			return r.ok && r.requests ? r.requests : null;
		},
		eventsUrl: base + '/events'
	};
}

export type GameApi = ReturnType<typeof gameApi>;
