import { apiErrorSchema } from '../../schemas/error';
import type { z } from 'zod';

/**
 * The one way the client talks to the API: JSON in and out, the session cookie
 * (`credentials: 'include'`) and, on every non-GET request, the CSRF token of the
 * current session as `X-CSRF-Token`. Every failure becomes an `ApiRequestError`.
 *
 * Example:
 *   const { members } = await apiFetch(`/api/v1/workspaces/${id}/members`, { schema: memberListSchema });
 *   await apiFetch(`/api/v1/workspaces/${id}/members/${userId}`, { method: 'DELETE' });
 */

/** Same origin on the web (Express serves the web build and the API on one port). */
export const API_BASE_URL: string = process.env.EXPO_PUBLIC_API_URL ?? '';

export interface ApiIssue {
  /** dotted field path, e.g. "email" or "compensator.poles.0" */
  path: string;
  message: string;
}

export class ApiRequestError extends Error {
  override readonly name = 'ApiRequestError';
  constructor(
    /** HTTP status; 0 when the server could not be reached or answered something unreadable */
    readonly status: number,
    message: string,
    readonly issues: ApiIssue[] = [],
  ) {
    super(message);
  }

  /** The message of the issue at exactly this dotted path, if any. */
  issueAt(path: string): string | undefined {
    return this.issues.find((issue) => issue.path === path)?.message;
  }
}

export function isApiRequestError(error: unknown, status?: number): error is ApiRequestError {
  return error instanceof ApiRequestError && (status === undefined || error.status === status);
}

let csrfToken: string | null = null;

/** Called by the session layer whenever login or /auth/me hands out a token; null on sign-out. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

export function getCsrfToken(): string | null {
  return csrfToken;
}

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface ApiFetchOptions<S extends z.ZodType | undefined> {
  method?: HttpMethod;
  /** serialised as JSON */
  body?: unknown;
  /** when given, the answer is parsed with it and typed by it */
  schema?: S;
  signal?: AbortSignal;
}

type Answer<S> = S extends z.ZodType ? z.infer<S> : unknown;

const FALLBACK_MESSAGES: Record<number, string> = {
  400: 'The request was not accepted.',
  401: 'Please sign in.',
  403: 'You do not have permission to do that.',
  404: 'Not found in this workspace.',
  409: 'That change conflicts with the current state.',
  413: 'The request is too large.',
  429: 'Too many attempts. Wait a minute and try again.',
};

async function errorFromResponse(response: Response): Promise<ApiRequestError> {
  let payload: unknown = null;
  try {
    payload = await response.json();
  } catch {
    // not JSON: fall through to the generic message
  }
  const parsed = apiErrorSchema.safeParse(payload);
  if (parsed.success) {
    return new ApiRequestError(response.status, parsed.data.error.message, parsed.data.error.issues ?? []);
  }
  const fallback = FALLBACK_MESSAGES[response.status] ?? `The server answered ${response.status}.`;
  return new ApiRequestError(response.status, fallback);
}

export async function apiFetch<S extends z.ZodType | undefined = undefined>(
  path: string,
  options: ApiFetchOptions<S> = {},
): Promise<Answer<S>> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;

  let response: Response;
  try {
    response = await fetch(`${API_BASE_URL}${path}`, {
      method,
      headers,
      credentials: 'include',
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof Error && cause.name === 'AbortError') throw cause;
    throw new ApiRequestError(0, 'The server could not be reached. Check the connection and try again.');
  }

  if (!response.ok) throw await errorFromResponse(response);
  if (response.status === 204) return undefined as Answer<S>;

  let payload: unknown;
  try {
    payload = await response.json();
  } catch {
    throw new ApiRequestError(0, 'The server sent an answer that could not be read.');
  }
  if (!options.schema) return payload as Answer<S>;
  const parsed = options.schema.safeParse(payload);
  if (!parsed.success) {
    throw new ApiRequestError(0, 'The server sent an answer in an unexpected shape.');
  }
  return parsed.data as Answer<S>;
}
