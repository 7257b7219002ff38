import type { z } from 'zod';
import { AppError } from '../errors';
import { fieldErrors } from './api';

export type FormResult<T> = { ok: true; data: T } | { ok: false; message: string; fields: Record<string, string> };

/** Parses posted form fields with the same zod schema the API uses. */
export function parseForm<S extends z.ZodType>(form: FormData, schema: S): FormResult<z.infer<S>> {
  return parseFields(Object.fromEntries(form), schema);
}

/** Parses already-prepared form values (e.g. comma lists split into arrays). */
export function parseFields<S extends z.ZodType>(values: Record<string, unknown>, schema: S): FormResult<z.infer<S>> {
  const parsed = schema.safeParse(values);
  if (!parsed.success) return { ok: false, message: 'Some fields need another look.', fields: fieldErrors(parsed.error) };
  return { ok: true, data: parsed.data };
}

/** Turns a service's AppError into field errors for a page form; rethrows anything else. */
export function formError(err: unknown): { message: string; fields: Record<string, string> } {
  if (err instanceof AppError) return { message: err.message, fields: err.fields ?? {} };
  throw err;
}
