import { PACKED_ENCODING, type PackedSeries } from '../../schemas/series';
import type { DiscretizeResponse, MethodName } from '../../schemas/discretize';

/**
 * Writing the long series of a compute answer packed (schemas/series.ts): the doubles as
 * IEEE 754 binary64 little-endian bytes in base64. Every bit is kept.
 */

const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

export function packSeries(values: ArrayLike<number>): PackedSeries {
  const n = values.length;
  const f = new Float64Array(n);
  if (LITTLE_ENDIAN) {
    for (let i = 0; i < n; i++) f[i] = values[i];
  } else {
    const view = new DataView(f.buffer);
    for (let i = 0; i < n; i++) view.setFloat64(8 * i, values[i], true);
  }
  return { encoding: PACKED_ENCODING, count: n, data: Buffer.from(f.buffer, f.byteOffset, f.byteLength).toString('base64') };
}

/**
 * The answer with every series — the frequency grid, the Bode curves and the step
 * responses — replaced by `leaf(series)`; everything else as it is.
 */
function mapSeries<S>(res: DiscretizeResponse, leaf: (v: number[]) => S) {
  const step = <T extends { timeSec: number[]; output: number[] }>(s: T) => ({ ...s, timeSec: leaf(s.timeSec), output: leaf(s.output) });
  const response = (r: { magnitudeDb: number[]; phaseDeg: number[] }) => ({ magnitudeDb: leaf(r.magnitudeDb), phaseDeg: leaf(r.phaseDeg) });
  const methods: Record<string, unknown> = {};
  for (const name of Object.keys(res.methods) as MethodName[]) {
    const m = res.methods[name]!;
    methods[name] = { ...m, response: response(m.response), ...(m.loop ? { loop: { ...m.loop, step: step(m.loop.step) } } : {}) };
  }
  return {
    ...res,
    frequencyHz: leaf(res.frequencyHz),
    continuous: { ...res.continuous, response: response(res.continuous.response) },
    methods,
    ...(res.continuousLoop ? { continuousLoop: { ...res.continuousLoop, step: step(res.continuousLoop.step) } } : {}),
  };
}

/**
 * The UTF-8 JSON body of the answer with every series packed. The answer is serialised with
 * a short marker in place of each series, and the body is then assembled in one buffer from
 * the pieces between the markers and each series' JSON text, so neither JSON.stringify nor
 * the UTF-8 encoder ever scans the ~100 KB of base64 (which needs no escaping and is ASCII).
 */
export function packedAnswerBody(res: DiscretizeResponse): Buffer {
  const texts: string[] = [];
  const skeleton = JSON.stringify(
    mapSeries(res, (v) => {
      const p = packSeries(v);
      texts.push(`{"encoding":"${p.encoding}","count":${p.count},"data":"${p.data}"}`);
      // U+0002 never occurs in an answer; JSON.stringify writes it as the escape \u0002
      return `\u0002${texts.length - 1}`;
    }),
  );
  // pieces[0], texts[i0], pieces[1], texts[i1], … (split with a capture group keeps the indices)
  const pieces = skeleton.split(/"\\u0002(\d+)"/);
  let bytes = 0;
  for (let i = 0; i < pieces.length; i++) bytes += i % 2 === 0 ? Buffer.byteLength(pieces[i]!, 'utf8') : texts[Number(pieces[i])]!.length;
  const body = Buffer.allocUnsafe(bytes);
  let at = 0;
  for (let i = 0; i < pieces.length; i++) {
    at += i % 2 === 0 ? body.write(pieces[i]!, at, 'utf8') : body.write(texts[Number(pieces[i])]!, at, 'latin1');
  }
  return body;
}
