// The signal-keeping Request (src/lib/server/request-signal.ts): the same abort behaviour as
// Node's own Request (WHATWG Fetch: a request's signal aborts when the signal it was made with
// does), without a listener left on the caller's signal for a finalizer to take off.
import { getEventListeners } from 'node:events';
import { describe, expect, it } from 'vitest';
import { installRequestSignals, makeRequestClass } from '../../../src/lib/server/request-signal';

const Native = globalThis.Request;
const SignalRequest = makeRequestClass(Native);

describe('the signal-keeping Request', () => {
	it('aborts when the signal it was made with aborts, like the native one', () => {
		for (const Req of [Native, SignalRequest]) {
			const controller = new AbortController();
			const request = new Req('http://127.0.0.1/api/v1/check', { method: 'POST', body: '{}', signal: controller.signal });
			expect(request.signal.aborted).toBe(false);
			const seen: unknown[] = [];
			request.signal.addEventListener('abort', () => seen.push(request.signal.reason));
			controller.abort(new Error('client went away'));
			expect(request.signal.aborted).toBe(true);
			expect(seen).toHaveLength(1);
			expect((seen[0] as Error).message).toBe('client went away');
		}
	});

	it('leaves no listener on the caller’s signal (the native one does: the finalizer’s work)', () => {
		const a = new AbortController();
		new Native('http://127.0.0.1/', { signal: a.signal });
		expect(getEventListeners(a.signal, 'abort')).toHaveLength(1);
		const b = new AbortController();
		const request = new SignalRequest('http://127.0.0.1/', { signal: b.signal });
		expect(getEventListeners(b.signal, 'abort')).toHaveLength(0);
		expect(request.signal).toBe(b.signal);
	});

	it('keeps everything else of the request: method, headers, body, url', async () => {
		const request = new SignalRequest('http://127.0.0.1/api/v1/check?x=1', {
			method: 'POST',
			headers: [['content-type', 'application/json']],
			body: '{"a":1}',
			signal: new AbortController().signal
		});
		expect(request.method).toBe('POST');
		expect(request.url).toBe('http://127.0.0.1/api/v1/check?x=1');
		expect(request.headers.get('content-type')).toBe('application/json');
		expect(await request.json()).toEqual({ a: 1 });
	});

	it('hands the signal on to a request made from it, and to clones (each with the body)', async () => {
		const controller = new AbortController();
		const first = new SignalRequest('http://127.0.0.1/', { method: 'POST', body: 'one', signal: controller.signal });
		const clone = first.clone();
		expect(await clone.text()).toBe('one');
		expect(await first.text()).toBe('one');
		const other = new AbortController();
		const second = new SignalRequest(new SignalRequest('http://127.0.0.1/', { signal: other.signal }));
		controller.abort();
		expect(clone.signal.aborted).toBe(true);
		expect(second.signal.aborted).toBe(false);
		other.abort();
		expect(second.signal.aborted).toBe(true);
	});

	it('without a signal, or with one aborted already, behaves as the native class', () => {
		expect(new SignalRequest('http://127.0.0.1/').signal.aborted).toBe(false);
		const done = AbortSignal.abort(new Error('gone'));
		const request = new SignalRequest('http://127.0.0.1/', { signal: done });
		expect(request.signal.aborted).toBe(true);
		expect((request.signal.reason as Error).message).toBe('gone');
	});

	it('native requests count as Requests, and the swap happens once', () => {
		const scope = { Request: Native };
		installRequestSignals(scope);
		const swapped = scope.Request;
		expect(swapped).not.toBe(Native);
		installRequestSignals(scope);
		expect(scope.Request).toBe(swapped);
		expect(new Native('http://127.0.0.1/') instanceof swapped).toBe(true);
		expect(new swapped('http://127.0.0.1/') instanceof Native).toBe(true);
		expect({} instanceof swapped).toBe(false);
	});
});
