/**
 * Rules every text input shares. PostgreSQL cannot store NUL in text (it answered 500), and the
 * other control characters have no business in names, titles or notes: they are refused with a
 * message naming the field, in the schema, so forms, endpoints and the OpenAPI document agree.
 */

/** One line: no control characters at all (Unicode category Cc: C0, DEL, C1). */
export const ONE_LINE = /^[^\p{Cc}]*$/u;
/** Several lines: tab, line feed and carriage return allowed, other control characters not. */
export const MULTI_LINE = /^(?:[\t\n\r]|\P{Cc})*$/u;

/** Arguments for zod's `.regex()`: `z.string().regex(...noControlCharacters('The title'))`. */
export const noControlCharacters = (field: string, { multiline = false } = {}) =>
  [
    multiline ? MULTI_LINE : ONE_LINE,
    { error: `${field} contains a control character (such as NUL) that cannot be stored. Remove it and try again.` },
  ] as const;

/** The largest value of a PostgreSQL `integer` (int4) column. */
export const INT4_MAX = 2_147_483_647;
