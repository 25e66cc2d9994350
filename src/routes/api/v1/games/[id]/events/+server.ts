// Server-sent events for a game's players: `event: seq` with the new seq after every log
// append (fed by LISTEN/NOTIFY, so from any app server). Each event carries `id: <seq>`, so a
// reconnecting EventSource sends Last-Event-ID and is told at once if it missed anything.
import { guard } from '$lib/server/http';
import { gameActions } from '$lib/server/db/game-actions';
import { games } from '$lib/server/db/games';
import { live } from '$lib/server/live';
import { gameId, notYours } from '../../route-helpers';
import type { RequestHandler } from './$types';

/** A comment line now and then keeps proxies and tablets from dropping a quiet stream. */
const HEARTBEAT_MS = 15_000;

export const GET: RequestHandler = async ({ locals, params, request, url }) => {
	const user = guard(locals);
	if (user instanceof Response) return user;
	const id = gameId(params);
	if (id instanceof Response) return id;
	if (!(await gameActions.viewFor(id, user.id))) return notYours(id);

	const seenRaw = request.headers.get('last-event-id') ?? url.searchParams.get('since');
	const seen = seenRaw !== null && /^\d+$/.test(seenRaw) ? Number(seenRaw) : -1;
	const enc = new TextEncoder();
	let close = () => {};

	const stream = new ReadableStream<Uint8Array>({
		async start(controller) {
			let open = true;
			let last = seen;
			let heartbeat: ReturnType<typeof setInterval> | undefined;
			let unsubscribe: (() => void) | undefined;
			let untrack: (() => void) | undefined;
			const send = (text: string) => {
				if (!open) return;
				try {
					controller.enqueue(enc.encode(text));
				} catch {
					close();
				}
			};
			const sendSeq = (seq: number) => {
				// Notifications may arrive out of order with the catch-up read; never go backwards.
				if (seq <= last) return;
				last = seq;
				send(`id: ${seq}\nevent: seq\ndata: ${JSON.stringify({ seq })}\n\n`);
			};
			close = () => {
				if (!open) return;
				open = false;
				clearInterval(heartbeat);
				unsubscribe?.();
				untrack?.();
				try {
					controller.close();
				} catch {
					/* already closed by the client */
				}
			};
			request.signal.addEventListener('abort', () => close());
			send('retry: 2000\n\n');
			// Subscribe before reading the current seq, so no append can fall between the two.
			const off = await live.subscribe(id, sendSeq);
			if (!open) return off(); // the client left while we subscribed
			unsubscribe = off;
			untrack = live.trackStream(() => close());
			const game = await games.find(id);
			if (!open) return; // ended meanwhile: the client left, or the server shuts down
			if (game) sendSeq(game.seq);
			send(': connected\n\n');
			heartbeat = setInterval(() => send(': keep-alive\n\n'), HEARTBEAT_MS);
		},
		cancel() {
			close();
		}
	});

	return new Response(stream, {
		headers: {
			'content-type': 'text/event-stream; charset=utf-8',
			'cache-control': 'no-cache, no-transform',
			connection: 'keep-alive',
			'x-accel-buffering': 'no'
		}
	});
};
