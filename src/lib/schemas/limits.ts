// Bounds that the database imposes on what the schemas may accept.

/** PostgreSQL `integer` (ids, seqs, rounds) holds at most 2^31 − 1; a larger number must be a 400, not a 500. */
export const PG_INT_MAX = 2_147_483_647;
