import { defineAction, type ActionAPIContext } from 'astro:actions';
import { AppError, type ErrorCode } from '~/server/errors';
import { statusOf } from '~/server/http/error-status';

/**
 * What a form action answers: the use case's result, or the domain error in a shape the page
 * shows at the fields. Failures are data, not thrown ActionErrors, because an ActionError
 * carries no field messages; the page maps `code` to the response status.
 */
export type FormOutcome<T> =
  | { ok: true; data: T }
  | { ok: false; code: ErrorCode; message: string; fields: Record<string, string>; values: Record<string, string> };

// Never echoed back into a page.
const SECRET = /password/i;

/** The posted text fields (secrets left out), so a refused form keeps what the person typed. */
function echo(form: FormData): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [key, value] of form) if (typeof value === 'string' && !SECRET.test(key)) values[key] = value;
  return values;
}

/**
 * A form door: Astro Actions with `accept: 'form'` and no `input` schema, because Astro 5 builds
 * inputs from its own zod 3 while our schemas are zod 4 (docs/decisions/0001-form-doors.md). The
 * handler parses the FormData with the shared schema and calls one use case.
 */
export function formAction<T>(run: (form: FormData, ctx: ActionAPIContext) => Promise<T>) {
  return defineAction({
    accept: 'form',
    handler: async (form: FormData, ctx): Promise<FormOutcome<T>> => {
      try {
        return { ok: true, data: await run(form, ctx) };
      } catch (err) {
        if (!(err instanceof AppError)) throw err;
        return { ok: false, code: err.code, message: err.message, fields: err.fields ?? {}, values: echo(form) };
      }
    },
  });
}

/** The posted text fields as a plain object, for parsing with a shared schema. */
export function formValues(form: FormData): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [key, value] of form) if (typeof value === 'string') values[key] = value;
  return values;
}

type Refusal = Extract<FormOutcome<unknown>, { ok: false }>;

/**
 * How a page reads one form action's result: what it answered, or the refusal to show at the
 * fields, with the refusal's status set on the page's response.
 */
export function outcomeOf<T>(
  result: { data?: FormOutcome<T> } | undefined,
  response: { status?: number },
): { done: T | undefined; refused: Refusal | null } {
  const outcome = result?.data;
  if (!outcome) return { done: undefined, refused: null };
  if (outcome.ok) return { done: outcome.data, refused: null };
  response.status = statusOf(outcome.code);
  return { done: undefined, refused: outcome };
}
