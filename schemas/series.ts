import { z } from 'zod';

/**
 * Long series of numbers in an answer (frequency grids, Bode curves, step responses) travel
 * either as JSON arrays of numbers (`"numbers"`, the default) or packed (`"packed"`): the
 * IEEE 754 binary64 values, little-endian, back to back, in base64. Packing keeps every bit
 * of every value (it is not a rounding), makes the answer about 30 % smaller and costs the
 * server almost nothing to write, where printing thousands of doubles as decimal text is the
 * largest single cost of a compute answer. Our web client asks for packed series.
 *
 * Example: [1, -0.5] packed is
 *   {"encoding": "float64le-base64", "count": 2, "data": "AAAAAAAA8D8AAAAAAADgvw=="}
 *
 * Shared by client and server, so it imports only zod; decoding uses the standard `atob`
 * (browsers, React Native's Hermes and Node.js all have it).
 */

export const SERIES_FORMATS = ['numbers', 'packed'] as const;
export const seriesFormatSchema = z
  .enum(SERIES_FORMATS, { error: `seriesFormat must be one of ${SERIES_FORMATS.join(', ')}` })
  .describe('how long number series (frequency grid, responses, steps) are written: JSON numbers, or packed float64 little-endian in base64');
export type SeriesFormat = z.infer<typeof seriesFormatSchema>;

export const PACKED_ENCODING = 'float64le-base64';

/** A packed series as it is on the wire. */
export const packedSeriesSchema = z
  .strictObject({
    encoding: z.literal(PACKED_ENCODING),
    count: z.number().int().min(0).describe('number of values'),
    data: z.string().describe('base64 of count IEEE 754 binary64 values, little-endian'),
  })
  .describe('a series packed as float64 little-endian bytes in base64');
export type PackedSeries = z.infer<typeof packedSeriesSchema>;

/** The values of a packed series; throws when the bytes do not hold exactly `count` doubles. */
export function unpackSeries(p: PackedSeries): number[] {
  const bin = atob(p.data);
  if (bin.length !== 8 * p.count) throw new Error(`a packed series of ${p.count} values needs ${8 * p.count} bytes, not ${bin.length}`);
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  const view = new DataView(bytes.buffer);
  const out = new Array<number>(p.count);
  for (let i = 0; i < p.count; i++) out[i] = view.getFloat64(8 * i, true);
  return out;
}

/**
 * A series field of an answer: a JSON array of numbers, or a packed series. Parsing always
 * gives the numbers, so code reading a parsed answer never sees the difference.
 */
export const seriesSchema = z.union([
  z.array(z.number()),
  packedSeriesSchema.transform((p, ctx) => {
    try {
      return unpackSeries(p);
    } catch (e) {
      ctx.addIssue({ code: 'custom', message: e instanceof Error ? e.message : 'unreadable packed series' });
      return z.NEVER;
    }
  }),
]);
