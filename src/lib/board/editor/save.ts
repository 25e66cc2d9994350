// Typed fetch helpers for the board editor's saves (/api/v1/layouts): create, update with the
// version it was edited from, copy. Results are values (ok / conflict / refused), never throws.
import type { Layout, SavedLayout } from '$lib/schemas/layout';

export type SaveResult =
	| { kind: 'ok'; layout: SavedLayout }
	| { kind: 'conflict'; message: string; current: SavedLayout }
	| { kind: 'refused'; status: number; message: string; issues: { path: string[]; message: string }[] };

async function send(url: string, method: 'POST' | 'PUT', body: unknown, fetcher: typeof fetch): Promise<SaveResult> {
	let res: Response;
	try {
		res = await fetcher(url, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
	} catch {
		return { kind: 'refused', status: 0, message: 'The server could not be reached; your changes are still here — try again', issues: [] };
	}
	const data = (await res.json().catch(() => ({}))) as {
		layout?: SavedLayout;
		current?: SavedLayout;
		error?: { message?: string; issues?: { path: string[]; message: string }[] };
	};
	if (res.ok && data.layout) return { kind: 'ok', layout: data.layout };
	if (res.status === 409 && data.current) return { kind: 'conflict', message: data.error?.message ?? 'Saved elsewhere meanwhile', current: data.current };
	return { kind: 'refused', status: res.status, message: data.error?.message ?? `The server refused (${res.status})`, issues: data.error?.issues ?? [] };
}

export const createLayout = (doc: Layout, fetcher: typeof fetch = fetch) => send('/api/v1/layouts', 'POST', { doc }, fetcher);
export const updateLayout = (id: number, doc: Layout, version: number, fetcher: typeof fetch = fetch) =>
	send(`/api/v1/layouts/${id}`, 'PUT', { doc, version }, fetcher);
export const copyLayout = (copyOf: number, name?: string, fetcher: typeof fetch = fetch) =>
	send('/api/v1/layouts', 'POST', name ? { copyOf, name } : { copyOf }, fetcher);
