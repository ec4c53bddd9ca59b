import { notFound } from './errors';

/** A positive integer route parameter, else 404 (ids of others are simply not found). */
export function idParam(raw: unknown, what: string): number {
  const s = String(raw);
  const id = Number(s);
  if (!/^\d{1,10}$/.test(s) || !Number.isSafeInteger(id) || id < 1) throw notFound(`No such ${what}`);
  return id;
}
