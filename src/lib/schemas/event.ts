// Event forms (create an event, register, pair, swap, report and confirm results, refunds),
// shared by the event pages and the server. Money is kept in cents; forms take "12.50".
import { z } from 'zod';
import { PG_INT_MAX } from './limits';

export const EVENT_KINDS = ['one-day', 'league'] as const;
export const eventKindSchema = z.enum(EVENT_KINDS);
export type EventKind = z.output<typeof eventKindSchema>;
export type EventStatus = 'open' | 'closed' | 'finished';
export type EntryStatus = 'awaiting-payment' | 'entered' | 'withdrawn';
export type PaymentStatus = 'open' | 'paid' | 'refund-requested' | 'refunded';

/** Currencies the entry-fee form offers (ISO 4217, as the payment provider names them). */
export const CURRENCIES = ['eur', 'gbp', 'usd'] as const;

/** Profiles an event may be played under; "Table Standard" is the engine's defaults. */
export const EVENT_PROFILES = ['Table Standard'] as const;

/** The most an event may charge, in cents: a typo guard, not a business rule. */
export const MAX_FEE_CENTS = 100_000;

const money = z
	.string()
	.trim()
	.default('0')
	.transform((v) => (v === '' ? '0' : v))
	.pipe(z.string().regex(/^\d{1,4}(\.\d{1,2})?$/, 'Give the fee as an amount like 12.50'))
	.transform((v) => Math.round(Number(v) * 100))
	.pipe(z.number().int().min(0).max(MAX_FEE_CENTS, 'At most 1000.00'));

/** Numbers from form fields (strings) and from JSON alike. */
const intField = (min: number, max: number, what: string) =>
	z.coerce.number({ error: `Give ${what} as a whole number` }).int(`Give ${what} as a whole number`).min(min, `${what} is at least ${min}`).max(max, `${what} is at most ${max}`);

const idList = z
	.union([z.array(z.coerce.number().int().positive().lte(PG_INT_MAX)), z.string()])
	.transform((v) => (Array.isArray(v) ? v : v.split(',').map((s) => s.trim()).filter(Boolean).map(Number)))
	.pipe(z.array(z.number().int().positive().lte(PG_INT_MAX)).max(50));

export const createEventSchema = z
	.object({
		clubId: intField(1, 2_147_483_647, 'the club'),
		name: z.string({ error: 'Give the event a name' }).trim().min(2, 'Give the event a name of 2 characters or more').max(120),
		kind: eventKindSchema.default('one-day'),
		startsOn: z.iso.date({ error: 'Give the first day as a date' }),
		endsOn: z.iso.date({ error: 'Give the last day as a date' }).optional().or(z.literal('').transform(() => undefined)),
		venue: z.string().trim().max(200).default(''),
		profileName: z.enum(EVENT_PROFILES).default('Table Standard'),
		rounds: intField(1, 20, 'the number of rounds'),
		capacity: intField(2, 512, 'the capacity'),
		entryFee: money,
		currency: z.enum(CURRENCIES).default('eur'),
		layoutIds: idList.default([]),
		judgeIds: z.union([z.array(z.string().min(1).max(100)), z.string()]).transform((v) => (Array.isArray(v) ? v : v ? [v] : [])).pipe(z.array(z.string().min(1).max(100)).max(50)).default([])
	})
	.transform((e) => ({ ...e, endsOn: e.endsOn ?? e.startsOn }))
	.refine((e) => e.endsOn >= e.startsOn, { path: ['endsOn'], message: 'The last day cannot be before the first' })
	.refine((e) => e.kind === 'league' || e.endsOn === e.startsOn, { path: ['endsOn'], message: 'A one-day event starts and ends on the same day' });
export type CreateEvent = z.output<typeof createEventSchema>;

export const registerSchema = z.object({
	rosterId: z.coerce.number({ error: 'Choose one of your rosters' }).int().positive('Choose one of your rosters').lte(PG_INT_MAX)
});

export const entryIdSchema = z.object({ entryId: z.coerce.number().int().positive().lte(PG_INT_MAX) });

export const swapSchema = z
	.object({ first: z.string().min(1).max(100), second: z.string().min(1).max(100) })
	.refine((s) => s.first !== s.second, { message: 'Choose two different players' });

export const OUTCOMES = ['a', 'b', 'draw'] as const;
export const resultSchema = z.object({
	pairingId: z.coerce.number().int().positive().lte(PG_INT_MAX),
	outcome: z.enum(OUTCOMES, { error: 'Choose who won, or a draw' }),
	valueA: intField(0, 1000, 'the objective value'),
	valueB: intField(0, 1000, 'the objective value')
});
export type ResultInput = z.output<typeof resultSchema>;

export const pairingIdSchema = z.object({ pairingId: z.coerce.number().int().positive().lte(PG_INT_MAX) });

/** "12.50 EUR" from cents, for every place a fee is shown. */
export function formatMoney(cents: number, currency: string): string {
	return `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`;
}
