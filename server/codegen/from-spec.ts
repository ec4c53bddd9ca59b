/**
 * From a saved design spec (or a preview request) to the discrete controller and its bundle,
 * with the same prewarp rule as the compute API (prewarpHz, else DESIGN.md's default ω₀).
 * Plain module: no HTTP, no database.
 */
import type { CompensatorInput } from '../../schemas/compensator';
import { defaultPrewarpRadPerSec, type MethodName } from '../../schemas/discretize';
import { implementationSettingsSchema, type ImplementationSettings } from '../../schemas/implementation';
import type { DesignSpec } from '../../schemas/design';
import { discretizeZpk, inputToZpk, DspInputError } from '../dsp';
import { buildBundle, type Bundle } from './index';

export interface DiscreteSource {
  compensator: CompensatorInput;
  method: MethodName;
  sampleRateHz: number;
  /** Hz; when absent the default ω₀ = √(|z₁|·|p₁|) applies where the method needs one */
  prewarpHz?: number;
}

export function discreteOf(src: DiscreteSource) {
  const w0 = src.prewarpHz !== undefined ? 2 * Math.PI * src.prewarpHz : defaultPrewarpRadPerSec(src.compensator);
  return discretizeZpk(inputToZpk(src.compensator), src.method, src.sampleRateHz, w0 !== null ? { prewarpRadPerSec: w0 } : {});
}

/** The implementation settings of a saved spec, or a DspInputError naming `spec.implementation`. */
export function settingsOfSpec(spec: DesignSpec): ImplementationSettings {
  if (spec.implementation === undefined) {
    throw new DspInputError('This version has no implementation settings: save word length, scaling, limits and C prefix first', [
      { path: 'spec.implementation', message: 'missing: choose the implementation settings and save the design' },
    ]);
  }
  const r = implementationSettingsSchema.safeParse(spec.implementation);
  if (!r.success) {
    throw new DspInputError('The implementation settings of this version are invalid',
      r.error.issues.map((i) => ({ path: ['spec', 'implementation', ...i.path].join('.'), message: i.message })));
  }
  return r.data;
}

export async function bundleOfVersion(designName: string, versionNumber: number, spec: DesignSpec): Promise<Bundle> {
  const settings = settingsOfSpec(spec);
  return buildBundle({
    designName, versionNumber, method: spec.method, sampleRateHz: spec.sampleRateHz,
    compensatorAsEntered: spec.compensator, discrete: discreteOf(spec), settings,
  });
}
