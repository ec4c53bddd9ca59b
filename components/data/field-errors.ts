import type { z } from 'zod';
import type { ApiIssue } from './api';

/** A form's messages by field name; the first message of each field wins. */
export type FieldErrors<K extends string> = Partial<Record<K, string>>;

/** zod's issues with the server's dotted paths, e.g. ["poles", 0] → "poles.0". */
export function issuesOfZodError(error: z.ZodError): ApiIssue[] {
  return error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message }));
}

/**
 * The message for each of `fields` from client-side (issuesOfZodError) or server-side
 * (ApiRequestError.issues) issues; issues at other paths are left to the caller.
 * Example: fieldErrorsOf([{ path: 'email', message: 'Enter…' }], ['email', 'password']) → { email: 'Enter…' }
 */
export function fieldErrorsOf<K extends string>(issues: readonly ApiIssue[], fields: readonly K[]): FieldErrors<K> {
  const errors: FieldErrors<K> = {};
  for (const { path, message } of issues) {
    const field = fields.find((f) => f === path);
    if (field !== undefined && errors[field] === undefined) errors[field] = message;
  }
  return errors;
}
