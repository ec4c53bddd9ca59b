/**
 * Test designs of our own invented scenario (a small gimbal and a heater loop), continuous
 * zpk in s (rad/s), discretized by server/dsp. Shared by the unit and the generated-C tests.
 */
import type { Zpk } from '../../../server/dsp/types';
import { discretizeZpk } from '../../../server/dsp/methods';
import type { ImplementationSettings } from '../../../schemas/implementation';

const r = (re: number) => ({ re, im: 0 });
const pair = (re: number, im: number) => [{ re, im }, { re, im: -im }];

export interface TestDesign { name: string; cont: Zpk; sampleRateHz: number; entered: unknown }

export const DESIGNS: TestDesign[] = [
  { name: 'lead', cont: { zeros: [r(-4)], poles: [r(-30)], gain: 12 }, sampleRateHz: 500, entered: { form: 'zpk', zeros: [-4], poles: [-30], gain: 12 } },
  { name: 'lag', cont: { zeros: [r(-0.6)], poles: [r(-0.06)], gain: 0.8 }, sampleRateHz: 1000, entered: { form: 'zpk', zeros: [-0.6], poles: [-0.06], gain: 0.8 } },
  { name: 'lead_lag', cont: { zeros: [r(-5), r(-0.4)], poles: [r(-40), r(-0.05)], gain: 20 }, sampleRateHz: 2000, entered: { form: 'zpk', zeros: [-5, -0.4], poles: [-40, -0.05], gain: 20 } },
  {
    name: 'double_lead',
    cont: { zeros: [r(-3), r(-3.5), ...pair(-4, 6)], poles: [r(-30), r(-35), ...pair(-20, 25)], gain: 40 },
    sampleRateHz: 1000,
    entered: { form: 'zpk', zeros: [-3, -3.5, { re: -4, im: 6 }, { re: -4, im: -6 }], poles: [-30, -35, { re: -20, im: 25 }, { re: -20, im: -25 }], gain: 40 },
  },
  { name: 'pi_lead', cont: { zeros: [r(-1.5), r(-6)], poles: [r(0), r(-45)], gain: 15 }, sampleRateHz: 800, entered: { form: 'zpk', zeros: [-1.5, -6], poles: [0, -45], gain: 15 } },
];

export const discreteOf = (d: TestDesign) => discretizeZpk(d.cont, 'tustin', d.sampleRateHz);

export type Variant = { label: string; wordLength: 16 | 32 | 'float32'; structure: ImplementationSettings['structure'] };
export const VARIANTS: Variant[] = [
  { label: '16-df1', wordLength: 16, structure: 'direct-form-1' },
  { label: '16-offset', wordLength: 16, structure: 'offset-form-1' },
  { label: '32-df1', wordLength: 32, structure: 'direct-form-1' },
  { label: '32-offset', wordLength: 32, structure: 'offset-form-1' },
  { label: 'float32', wordLength: 'float32', structure: 'transposed-direct-form-2' },
];

/** A 12-bit ADC in volts per count in, a PWM duty in percent per count out (fixed); real units for float. */
export function settingsFor(v: Variant, prefix: string): ImplementationSettings {
  const fixed = v.wordLength !== 'float32';
  return {
    wordLength: v.wordLength,
    structure: v.structure,
    inputScale: fixed ? 3.3 / 4096 : 1,
    outputScale: fixed ? 0.01 : 1,
    outputLimits: fixed ? { min: -10000, max: 10000 } : { min: -100, max: 100 },
    prefix,
  };
}
