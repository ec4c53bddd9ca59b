/**
 * Packed series (schemas/series.ts, server/http/packed-series.ts): IEEE 754 binary64,
 * little-endian, in base64 (RFC 4648). The reference bytes are IEEE 754's encodings,
 * checked with Python's struct.pack('<d', …) and base64.b64encode.
 */
import { packedAnswerBody, packSeries } from '../../../server/http/packed-series';
import { runDiscretize } from '../../../server/dsp';
import { discretizeRequestSchema, discretizeResponseSchema } from '../../../schemas/discretize';
import { packedSeriesSchema, seriesSchema, unpackSeries } from '../../../schemas/series';

describe('packed series', () => {
  it('writes IEEE 754 little-endian bytes in base64: [1, −0.5] (0x3FF0…, 0xBFE0…)', () => {
    // python3 -c "import struct,base64; print(base64.b64encode(struct.pack('<2d', 1, -0.5)).decode())"
    expect(packSeries([1, -0.5])).toEqual({ encoding: 'float64le-base64', count: 2, data: 'AAAAAAAA8D8AAAAAAADgvw==' });
  });

  it('keeps every bit: signed zero, subnormals, extremes, values with 17 significant digits', () => {
    const values = [0, -0, 5e-324, -2.2250738585072014e-308, 1.7976931348623157e308, -1.7976931348623157e308, 1 / 3, Math.PI, -400, 0.1 + 0.2];
    const back = unpackSeries(packSeries(values));
    expect(back).toHaveLength(values.length);
    values.forEach((v, i) => expect(Object.is(back[i], v)).toBe(true));
  });

  it('keeps a long random series bit for bit (Float64Array in, numbers out)', () => {
    const f = new Float64Array(2000);
    const bytes = new Uint8Array(f.buffer);
    let s = 0x2f6b1d3;
    for (let i = 0; i < bytes.length; i++) {
      s = (s * 1103515245 + 12345) >>> 0;
      bytes[i] = s >>> 24;
    }
    // drop NaN patterns (a JSON answer never holds them)
    for (let i = 0; i < f.length; i++) if (Number.isNaN(f[i])) f[i] = i;
    const back = unpackSeries(packSeries(f));
    for (let i = 0; i < f.length; i++) expect(Object.is(back[i], f[i])).toBe(true);
  });

  it('parses either form to numbers through the shared schema', () => {
    expect(seriesSchema.parse([1, 2.5])).toEqual([1, 2.5]);
    expect(seriesSchema.parse(packSeries([1, 2.5]))).toEqual([1, 2.5]);
    expect(seriesSchema.parse(packSeries([]))).toEqual([]);
  });

  it('refuses a packed series whose bytes do not hold exactly `count` doubles', () => {
    const p = packSeries([1, 2, 3]);
    expect(seriesSchema.safeParse({ ...p, count: 4 }).success).toBe(false);
    expect(seriesSchema.safeParse({ ...p, data: p.data.slice(0, 20) }).success).toBe(false);
    expect(packedSeriesSchema.safeParse({ ...p, encoding: 'float32le-base64' }).success).toBe(false);
  });
});

describe('the packed answer body', () => {
  // runDiscretize answers of a spread of designs (with and without a plant, every method)
  const requests = [
    { compensator: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 }, sampleRateHz: 250, prewarpHz: 1.2, plant: { form: 'tf', num: [8], den: [1, 5, 0] } },
    { compensator: { form: 'zpk', zeros: [-0.6, -5], poles: [-0.15, -40], gain: 22 }, sampleRateHz: 400, prewarpHz: 2.2, responsePoints: 400, plant: { form: 'tf', num: [30], den: [1, 4.5, 0] }, delaySamples: 1 },
    { compensator: { form: 'tf', num: [2, 6], den: [1, 5, 0] }, sampleRateHz: 100, prewarpHz: 3 },
    { compensator: { form: 'zpk', zeros: [{ re: -2, im: 5 }, { re: -2, im: -5 }], poles: [-30, -40], gain: -4 }, sampleRateHz: 1000 },
  ];
  // the wire form read back with Node's own decoder (Buffer: base64, readDoubleLE), not ours
  const unpackedByNode = (v: unknown, found: { n: number }): unknown => {
    if (Array.isArray(v)) return v.map((x) => unpackedByNode(x, found));
    if (v === null || typeof v !== 'object') return v;
    const o = v as Record<string, unknown>;
    if (o.encoding === 'float64le-base64') {
      found.n++;
      const b = Buffer.from(o.data as string, 'base64');
      return Array.from({ length: o.count as number }, (_, i) => b.readDoubleLE(8 * i));
    }
    return Object.fromEntries(Object.entries(o).map(([k, x]) => [k, unpackedByNode(x, found)]));
  };
  it.each(requests.map((r, i) => [i, r] as const))('is the plain answer with every series packed, nothing else changed (request %i)', (_i, body) => {
    const answer = runDiscretize(discretizeRequestSchema.parse(body));
    const wire = JSON.parse(packedAnswerBody(answer).toString('utf8'));
    const found = { n: 0 };
    // same keys in the same order, same numbers to the bit (JSON text of doubles round-trips)
    expect(JSON.stringify(unpackedByNode(wire, found))).toBe(JSON.stringify(answer));
    const methods = Object.keys(answer.methods).length;
    const steps = answer.continuousLoop ? 1 + methods : 0;
    expect(found.n).toBe(1 + 2 * (1 + methods) + 2 * steps);
    // and the shared schema reads it as the client reads the plain answer (JSON writes −0 as 0 outside series)
    expect(discretizeResponseSchema.parse(wire)).toEqual(discretizeResponseSchema.parse(JSON.parse(JSON.stringify(answer))));
  });
});
