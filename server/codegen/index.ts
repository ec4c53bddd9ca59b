/**
 * The reproducible code bundle of one design version (DESIGN.md "The code bundle"):
 *   <prefix>-v<N>/README.md, manifest.json, include/<prefix>.h, src/<prefix>.c,
 *   test/test_<prefix>.c, test/vectors.csv, Makefile
 * zipped with fixed timestamps, modes and entry order, so the same input gives the same bytes.
 * Plain module: no HTTP, no database.
 *
 * Example:
 *   const b = await buildBundle({ designName: 'Pitch lead', versionNumber: 3, method: 'tustin',
 *     sampleRateHz: 1000, compensatorAsEntered: { form: 'zpk', zeros: [-3], poles: [-18], gain: 25 },
 *     discrete: discretizeZpk(zpk, 'tustin', 1000), settings });
 *   b.fileName // "pitch_lead-v3.zip"; b.sha256 // hex SHA-256 of b.zip
 */
import { createHash } from 'node:crypto';
import { Writable } from 'node:stream';
import { ZipArchive } from 'archiver';
import type { MethodName } from '../dsp/types';
import { implementationSettingsSchema, type ImplementationSettings } from '../../schemas/implementation';
import { buildImplementation, generateVectors, type DiscreteDesign } from '../fixed-point';
import type { Implementation } from '../fixed-point';
import { GENERATOR_VERSION, renderFiles } from './render';

export { GENERATOR_VERSION } from './render';

export interface BundleInput {
  designName: string;
  versionNumber: number;
  method: MethodName;
  sampleRateHz: number;
  /** The compensator exactly as the user entered it (recorded in the manifest as is). */
  compensatorAsEntered: unknown;
  discrete: DiscreteDesign;
  /** Parsed again with implementationSettingsSchema (throws a ZodError on bad settings). */
  settings: ImplementationSettings;
}

export interface BundleFile { path: string; content: string }

export interface Bundle {
  zip: Buffer;
  /** Lower-case hex SHA-256 of `zip`. */
  sha256: string;
  /** "<prefix>-v<N>.zip" */
  fileName: string;
  /** Every file of the bundle, paths inside the top folder, in zip order. */
  files: BundleFile[];
}

/** Fixed timestamp of every zip entry (UTC; DOS time has 2-second resolution). */
export const ZIP_DATE = new Date('2020-01-01T00:00:00Z');

const sha256 = (s: string | Buffer) => createHash('sha256').update(s).digest('hex');

function implementationJson(impl: Implementation, settings: ImplementationSettings) {
  const common = {
    wordLength: impl.wordLength,
    accumulatorBits: impl.kind === 'fixed' ? 2 * impl.wordLength : null,
    structure: impl.structure,
    inputScale: settings.inputScale,
    outputScale: settings.outputScale,
    outputLimits: { min: impl.outputMin, max: impl.outputMax },
  };
  if (impl.kind === 'fixed') {
    return {
      ...common,
      outputShift: impl.outputShift,
      rounding: 'coefficients: to nearest, ties away from zero; shifts: floor(v / 2^s + 1/2)',
      sections: impl.sections.map((s, k) => ({
        index: k + 1,
        order: s.order,
        poles: s.poles,
        zeros: s.zeros,
        exact: { b: s.b, a: s.a },
        nominalFeedback: s.nominal,
        groups: s.groups.map((g) => ({
          shift: g.shift,
          terms: g.terms.map((t) => ({ name: t.name, exact: t.exact, integer: t.coef, signal: t.signal, subtract: t.subtract })),
        })),
      })),
    };
  }
  return {
    ...common,
    outputShift: null,
    sections: impl.sections.map((s, k) => ({
      index: k + 1, order: s.order, poles: s.poles, zeros: s.zeros,
      exact: { b: s.b, a: s.a }, float32: { b: s.bf, a: s.af },
    })),
  };
}

/** Collects a readable stream into one Buffer. */
function collect(archive: ZipArchive): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    const sink = new Writable({ write(chunk, _enc, cb) { chunks.push(Buffer.from(chunk)); cb(); } });
    sink.on('finish', () => resolve(Buffer.concat(chunks)));
    sink.on('error', reject);
    archive.on('error', reject);
    archive.on('warning', reject);
    archive.pipe(sink);
  });
}

export async function buildBundle(input: BundleInput): Promise<Bundle> {
  const settings = implementationSettingsSchema.parse(input.settings);
  const built = buildImplementation(input.discrete, settings);
  const vectors = generateVectors(input.discrete, settings, built);
  const p = settings.prefix;
  const r = renderFiles(
    {
      designName: input.designName, versionNumber: input.versionNumber, method: input.method, sampleRateHz: input.sampleRateHz,
      prefix: p, inputScale: settings.inputScale, outputScale: settings.outputScale, gainFold: built.gainFold,
    },
    built.impl,
    vectors,
  );
  const others: BundleFile[] = [
    { path: 'README.md', content: r.readme },
    { path: `include/${p}.h`, content: r.header },
    { path: `src/${p}.c`, content: r.source },
    { path: `test/test_${p}.c`, content: r.test },
    { path: 'test/vectors.csv', content: r.csv },
    { path: 'Makefile', content: r.makefile },
  ];
  const manifest = {
    generator: { name: 'Samplewright', version: GENERATOR_VERSION },
    design: { name: input.designName, version: input.versionNumber },
    method: input.method,
    sampleRateHz: input.sampleRateHz,
    compensator: input.compensatorAsEntered ?? null,
    discrete: { num: input.discrete.tf.num, den: input.discrete.tf.den, zpk: input.discrete.zpk },
    implementation: implementationJson(built.impl, settings),
    vectors: {
      file: 'test/vectors.csv',
      samples: vectors.rows.length,
      segments: vectors.segments,
      limitsReached: vectors.limitsReached,
      bound: {
        value: vectors.bound,
        units: built.impl.kind === 'fixed' ? 'output counts' : 'real output units',
        meaning: '|y_raw - ideal| for an ideal double-precision run of the exact discrete num/den (times input scale / output scale) on u_raw, wherever the ideal output lies inside the limits, before the limit segment',
        derivation: '|| h_q - h ||_1 * max|u| + sum over sections of || g_k ||_1 * max|e_k| (+ 1/2 count for the output shift), sums over the vector length; h_q: quantized coefficients, g_k: from section k\'s output node to the output, e_k: rounding of one sample',
      },
    },
    files: Object.fromEntries(others.map((f) => [f.path, sha256(f.content)])),
  };
  const files: BundleFile[] = [
    others[0],
    { path: 'manifest.json', content: JSON.stringify(manifest, null, 2) + '\n' },
    ...others.slice(1),
  ];
  const top = `${p}-v${input.versionNumber}`;
  const archive = new ZipArchive({ zlib: { level: 6 } });
  const done = collect(archive);
  for (const f of files) archive.append(Buffer.from(f.content, 'utf8'), { name: `${top}/${f.path}`, date: ZIP_DATE, mode: 0o644 });
  await archive.finalize();
  const zip = await done;
  return { zip, sha256: sha256(zip), fileName: `${top}.zip`, files };
}
