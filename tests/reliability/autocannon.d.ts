// The small part of autocannon 8 (which ships no types) that the load bench uses.
declare module 'autocannon' {
	namespace autocannon {
		interface Request {
			method?: string;
			path?: string;
			headers?: Record<string, string>;
			body?: string;
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			setupRequest?: (req: any, context: any) => any;
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			onResponse?: (status: number, body: string, context: any, headers?: Record<string, string>) => void;
		}
		interface Options {
			url: string;
			method?: string;
			headers?: Record<string, string>;
			body?: string;
			connections?: number;
			duration?: number;
			overallRate?: number;
			pipelining?: number;
			requests?: Request[];
		}
		interface Histogram {
			average: number;
			mean: number;
			p50: number;
			p90: number;
			p99: number;
			max: number;
			total: number;
		}
		interface Result {
			requests: Histogram;
			latency: Histogram;
			throughput: Histogram;
			errors: number;
			timeouts: number;
			non2xx: number;
			duration: number;
		}
	}
	function autocannon(opts: autocannon.Options, cb: (err: Error | null, result: autocannon.Result) => void): { stop: () => void };
	export default autocannon;
}
