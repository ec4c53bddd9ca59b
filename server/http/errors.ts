import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError, type z } from 'zod';
import { DspInputError } from '../dsp/errors';

export interface FieldIssue {
  path: string;
  message: string;
}

/** An error with an HTTP status and the JSON error shape of DESIGN.md. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues?: FieldIssue[],
  ) {
    super(message);
  }
}

export const badRequest = (message: string, issues?: FieldIssue[]) => new HttpError(400, message, issues);
export const unauthorized = (message = 'Sign in first') => new HttpError(401, message);
export const forbidden = (message = 'Your role does not allow this') => new HttpError(403, message);
export const notFound = (message = 'Not found') => new HttpError(404, message);
export const conflict = (message: string) => new HttpError(409, message);

export function zodIssues(error: ZodError, prefix: (string | number)[] = []): FieldIssue[] {
  return error.issues.map((i) => ({
    path: [...prefix, ...i.path].map(String).join('.') || '(body)',
    message: i.message,
  }));
}

/** Parse with a schema or throw a 400 naming every bad field. */
export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, what = 'request body'): z.output<S> {
  const r = schema.safeParse(value);
  if (!r.success) throw badRequest(`Invalid ${what}`, zodIssues(r.error));
  return r.data;
}

export const notFoundApi: RequestHandler = (req, _res, next) => {
  next(notFound(`No such API route: ${req.method} ${req.path}`));
};

/** The one error middleware: every failure leaves as {"error": {"message", "issues"?}}. */
export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    let status = 500;
    let message = 'Internal error';
    let issues: FieldIssue[] | undefined;
    if (err instanceof HttpError) {
      ({ status, message, issues } = err);
    } else if (err instanceof DspInputError) {
      // bad input found by the computation itself (roots beyond Nyquist in tf form, an
      // infeasible placement, missing implementation settings...)
      status = 400;
      message = err.message;
      issues = err.issues;
      // a refusal naming no field may hide a numerical failure of ours: keep a trace of it
      if (issues.some((i) => i.path === '')) log('computation refused a request naming no field', issues);
    } else if (err instanceof ZodError) {
      status = 400;
      message = 'Invalid request';
      issues = zodIssues(err);
    } else if (err && typeof err === 'object' && 'type' in err && typeof err.type === 'string') {
      // body-parser errors carry a type and a status
      const e = err as { type: string; status?: number; limit?: number };
      if (e.type === 'entity.parse.failed') {
        status = 400;
        message = 'Malformed JSON body';
      } else if (e.type === 'entity.too.large') {
        status = 413;
        message = `Request body larger than the limit of ${e.limit ?? '?'} bytes`;
      } else if (e.type === 'encoding.unsupported' || e.type === 'charset.unsupported') {
        status = 415;
        message = 'Unsupported body encoding';
      } else if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
        status = e.status;
        message = 'Bad request';
      }
    } else if (err && typeof err === 'object' && 'code' in err && err.code === 'EBADCSRFTOKEN') {
      status = 403;
      message = 'Missing or invalid CSRF token: send the X-CSRF-Token header from the sign-in answer';
    }
    if (status >= 500) log('unhandled error', err);
    if (res.headersSent) return;
    res.status(status).json({ error: issues ? { message, issues } : { message } });
  };
}
