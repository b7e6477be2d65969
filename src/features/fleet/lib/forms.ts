import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldValues, Path, Resolver, UseFormSetError } from 'react-hook-form';
import { z } from 'zod';
import { isApiError } from '@/lib/api';

/*
 * Fleet forms keep what the user typed as text (an empty box is not 0) and turn it into the API's
 * body just before validation, so the browser checks it with the very schema the server uses.
 */

/** A required number: empty stays undefined so the schema says "… must be a number". */
export function numberOrUndefined(value: string | number | null | undefined): number | undefined {
  if (value === null || value === undefined) return undefined;
  if (typeof value === 'number') return value;
  const text = value.trim().replace(/,/g, '');
  return text === '' ? undefined : Number(text);
}

/** An optional number: empty becomes null. */
export function numberOrNull(value: string | number | null | undefined): number | null {
  return numberOrUndefined(value) ?? null;
}

export function textOrNull(value: string | null | undefined): string | null {
  const text = value?.trim() ?? '';
  return text === '' ? null : text;
}

/** Shows a stored number in a text box: null becomes an empty box. */
export const asText = (value: number | string | null | undefined) => (value === null || value === undefined ? '' : String(value));

/**
 * A react-hook-form resolver that first maps the form's text values to the API body, then checks
 * that body with the shared zod schema. Messages land on the fields of the same name.
 */
export function sharedResolver<TForm extends FieldValues, TBody>(
  schema: z.ZodType<TBody>,
  toBody: (values: TForm) => unknown,
): Resolver<TForm, unknown, TBody> {
  const pipeline = z.preprocess((values) => toBody(values as TForm), schema);
  return zodResolver(pipeline as never) as unknown as Resolver<TForm, unknown, TBody>;
}

/** 409 "stale": someone saved this record after it was loaded here. */
export function isStale(error: unknown): boolean {
  return isApiError(error) && error.status === 409 && error.code === 'stale';
}

/**
 * Puts a 400's field messages on the form's fields (paths like "toolbars.0.lastRow" included).
 * Returns the messages that match no field, for the form-level alert.
 */
export function applyServerErrors<TForm extends FieldValues>(error: unknown, known: readonly string[], setError: UseFormSetError<TForm>): string[] {
  if (!isApiError(error)) return [];
  const unplaced: string[] = [];
  let first = true;
  for (const [path, message] of Object.entries(error.fields)) {
    if (known.includes(path.split('.')[0])) {
      setError(path as Path<TForm>, { type: 'server', message }, { shouldFocus: first });
      first = false;
    } else {
      unplaced.push(message);
    }
  }
  return unplaced;
}

/** The form-level message for a failed save: unplaced field messages, or the server's own words. */
export function formErrorMessage(error: unknown, unplaced: string[]): string | null {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'The change could not be saved. Try again.';
  if (unplaced.length) return unplaced.join(' ');
  if (error.status === 400 && Object.keys(error.fields).length > 0) return null;
  return error.message;
}
