// Requests that keep the abort signal they are given, instead of a follower tied to it by a
// finalizer.
//
// Node's global Request (undici 6) does not keep the signal in its init: it makes an
// AbortController of its own, adds an 'abort' listener to the given signal, and registers the
// new controller with a FinalizationRegistry whose callback takes that listener off again once
// the request has been collected. SvelteKit's Node adapter builds every incoming request that
// way (a fresh AbortController per request, so the request can see the client go away). The
// registered controllers outlive young-generation collections, so their callbacks all run after
// the next full collection, in one task: under the load bench that was up to 200 ms of the
// event loop after a single full collection (tens of thousands of requests' callbacks), with
// every request that fell due meanwhile waiting (docs/reliability.md §6, fourth session).
//
// `installRequestSignals` replaces the global Request with a subclass whose `signal` is the
// given signal itself: it aborts exactly when the caller's does (SvelteKit's, when the client
// goes away), there is no listener to take off and nothing for a finalizer to do. Requests
// made without a signal, and undici's own (clones, fetch), are unchanged; `instanceof Request`
// holds for both kinds.

const given = new WeakMap<Request, AbortSignal>();

/** The signal-keeping subclass of `Native` (exported for the tests). */
export function makeRequestClass(Native: typeof Request): typeof Request {
	class SignalRequest extends Native {
		constructor(input: RequestInfo | URL, init?: RequestInit) {
			const signal = init?.signal ?? (input instanceof Native ? given.get(input) : undefined);
			if (signal && !signal.aborted) {
				super(input, { ...init, signal: undefined });
				given.set(this, signal);
			} else {
				// No signal, or one aborted already: the native class handles both as it does.
				super(input, init);
			}
		}

		get signal(): AbortSignal {
			return given.get(this) ?? super.signal;
		}

		clone(): Request {
			// The native clone (its body teed) with this request's signal handed on.
			const signal = given.get(this);
			return signal ? new SignalRequest(super.clone(), { signal }) : super.clone();
		}

		// Native requests (clones, those made before the swap) are Requests too.
		static [Symbol.hasInstance](value: unknown): boolean {
			return value instanceof Native;
		}
	}
	return SignalRequest;
}

const installed = Symbol.for('inchwarden.requestSignals');

/** Swap the global Request for the signal-keeping subclass; once per process. */
export function installRequestSignals(scope: { Request: typeof Request } = globalThis): void {
	const target = scope as { Request: typeof Request; [installed]?: true };
	if (target[installed]) return;
	target.Request = makeRequestClass(target.Request);
	target[installed] = true;
}
