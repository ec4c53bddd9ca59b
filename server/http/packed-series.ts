import { PACKED_ENCODING, type PackedSeries } from '../../schemas/series';
import type { DiscretizeResponse, DiscretizeResponseWire, LoopResult, MethodName, StepResponse } from '../../schemas/discretize';

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

type LoopWire = NonNullable<DiscretizeResponseWire['continuousLoop']>;

function packStep(s: StepResponse): LoopWire['step'] {
  return { ...s, timeSec: packSeries(s.timeSec), output: packSeries(s.output) };
}

function packLoop(l: LoopResult): LoopWire {
  return { ...l, step: packStep(l.step) };
}

/** The same answer with every series packed: the frequency grid, the Bode curves and the step responses. */
export function packAnswer(res: DiscretizeResponse): DiscretizeResponseWire {
  const methods: DiscretizeResponseWire['methods'] = {};
  for (const name of Object.keys(res.methods) as MethodName[]) {
    const m = res.methods[name]!;
    methods[name] = {
      ...m,
      response: { magnitudeDb: packSeries(m.response.magnitudeDb), phaseDeg: packSeries(m.response.phaseDeg) },
      ...(m.loop ? { loop: packLoop(m.loop) } : {}),
    };
  }
  return {
    ...res,
    frequencyHz: packSeries(res.frequencyHz),
    continuous: {
      ...res.continuous,
      response: { magnitudeDb: packSeries(res.continuous.response.magnitudeDb), phaseDeg: packSeries(res.continuous.response.phaseDeg) },
    },
    methods,
    ...(res.continuousLoop ? { continuousLoop: packLoop(res.continuousLoop) } : {}),
  };
}
