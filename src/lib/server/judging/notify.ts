// The desk's e-mails through mail.send (SMTP; locally the fake server): to the judges when a
// request opens — the event's judges, or the site judges when the game has no event or the
// event names none — and to both players when it is ruled. Mail goes out after the commit:
// a failed send never undoes a request or a ruling, and an unsent opening mail is retried.
import { db } from '$lib/server/db';
import { rulingRequests } from '$lib/server/db/ruling-requests';
import { rulings, type Recipient } from '$lib/server/db/rulings';
import { mail } from '$lib/server/mail';
import type { RulingPayload, RulingRequestView } from '$lib/schemas/ruling';

function origin(): string {
	return (process.env.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

const where = (r: RulingRequestView) =>
	r.event ? `${r.event.name}, round ${r.event.round}${r.event.table !== null ? `, table ${r.event.table}` : ''}` : `the game "${r.gameTitle}"`;

export async function judgesFor(r: RulingRequestView): Promise<Recipient[]> {
	const ofEvent = r.event ? await rulings.eventJudgeRecipients(r.event.id) : [];
	return ofEvent.length ? ofEvent : rulings.siteJudgeRecipients();
}

export function openedMail(r: RulingRequestView): { subject: string; text: string } {
	return {
		subject: `Ruling requested: ${where(r)}`,
		text:
			`${r.requestedBy.name} asks for a ruling on entry #${r.moveSeq} of ${where(r)}.\n\n` +
			`The entry: ${r.entry.kind}${r.entry.unit ? ` of ${r.entry.unit}` : ''} — ${r.entry.finding}\n` +
			`The note: ${r.note}\n` +
			(r.photos.length ? `Photos: ${r.photos.length}\n` : '') +
			`\nTake it at the judge desk:\n\n${origin()}/judge/${r.id}\n`
	};
}

const OUTCOME_WORDS: Record<RulingPayload['outcome'], string> = {
	uphold: 'upheld: the entry stands as recorded',
	overturn: 'overturned',
	adjust: 'adjusted: pieces placed where the judge ruled'
};

export function ruledMail(r: RulingRequestView, ruling: RulingPayload, seq: number): { subject: string; text: string } {
	const moved = ruling.changes.length
		? `\nPieces moved by the ruling:\n${ruling.changes.map((c) => `  ${c.piece} to (${c.to.x.toFixed(2)}, ${c.to.y.toFixed(2)}) in`).join('\n')}\n`
		: '';
	return {
		subject: `Ruling given: ${where(r)}, entry #${r.moveSeq} ${ruling.outcome === 'uphold' ? 'upheld' : ruling.outcome === 'overturn' ? 'overturned' : 'adjusted'}`,
		text:
			`${ruling.judge.name} ruled on entry #${r.moveSeq} of ${where(r)} at ${ruling.signedAt}.\n\n` +
			`Outcome: ${OUTCOME_WORDS[ruling.outcome]}${ruling.allowIllegal ? ' (allowed although the engine finds it illegal)' : ''}\n` +
			`Reason: ${ruling.reason}\n` +
			moved +
			`\nThe ruling is entry #${seq} of the move log:\n\n${origin()}/games/${r.gameId}/replay?seq=${seq}\n`
	};
}

/** Sends every opening mail not yet sent; each request is claimed so two senders never double up. */
export async function sendOpened(): Promise<number> {
	let sent = 0;
	await db.transaction(async (trx) => {
		for (const { id } of await rulingRequests.claimUnnotified(trx)) {
			const r = await rulingRequests.find(id, trx);
			if (!r) continue;
			const to = await judgesFor(r);
			const m = openedMail(r);
			try {
				for (const j of to) await mail.send({ to: j.email, ...m });
				await rulingRequests.markNotified(id, trx);
				sent += 1;
			} catch (e) {
				// Left unmarked: the next request or queue visit tries again.
				console.error(`ruling request ${id}: the judges could not be e-mailed`, e);
			}
		}
	});
	return sent;
}

export async function sendRuled(requestId: number, ruling: RulingPayload, seq: number): Promise<void> {
	const r = await rulingRequests.find(requestId);
	if (!r) return;
	const m = ruledMail(r, ruling, seq);
	try {
		for (const p of await rulings.playerRecipients(r.gameId)) await mail.send({ to: p.email, ...m });
	} catch (e) {
		console.error(`ruling on request ${requestId}: the players could not be e-mailed`, e);
	}
}

export const notify = { sendOpened, sendRuled, judgesFor, openedMail, ruledMail };
