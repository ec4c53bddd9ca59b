import crypto from 'node:crypto';

/** JSON with object keys sorted at every level: equal values give equal text. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_k, v) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

export const sha256Hex = (data: string | Buffer) => crypto.createHash('sha256').update(data).digest('hex');
