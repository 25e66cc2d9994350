// Entry of the rules engine: checkMove(request) → report, pure and synchronous (referee-api.md).
import type { CheckReport, CheckRequest } from '../schemas/check';

export type { CheckReport, CheckRequest, Finding } from '../schemas/check';

export function checkMove(request: CheckRequest): CheckReport {
	void request;
	throw new Error('checkMove: not implemented yet');
}
