/**
 * The Nyquist point of the frequency grids. The grid ends at fs/2, and ωT = 2π·(fs/2)·(1/fs)
 * rounds a hair above π for about one sample rate in seven (13 Hz, 26 Hz, …): e^{jωT} then
 * lies below the real axis, past z = −1, where a zero at z = −1 (Tustin's image of a zero at
 * infinity) turns its angle from +90° to −90°.
 *
 * Reference: the bilinear map itself. With c = 2/T, Tustin's model satisfies
 * H_d(e^{jθ}) = H(jω′) with ω′ = c·tan(θ/2) (s = c(z − 1)/(z + 1) sends e^{jθ} to jω′), so its
 * plotted phase at grid frequency ω is ∠H(jω′), and as θ → π (ω′ → ∞) it tends to
 * ∠H(j∞) = ∠K − 90°·(np − nz); for a first-order lead the image of z = −1 is H(∞) = K, real.
 * ∠H(jω) of real left-half-plane roots is the closed form ∠K + Σ atan2(ω, −zᵢ) − Σ atan2(ω, −pᵢ).
 */
import { discretizeRequestSchema, type DiscretizeRequestBody } from '../../../schemas/discretize';
import { runDiscretize } from '../../../server/dsp/run';

type Design = { name: string; zeros: number[]; poles: number[]; gain: number };
/** Designs with roots scaled to Nyquist ωN = π·fs (so that every sample rate accepts them). */
const designs = (wN: number): Design[] => [
  { name: 'lead', zeros: [-0.02 * wN], poles: [-0.2 * wN], gain: 3 },
  { name: 'lead with a roll-off pole (one zero at z = −1)', zeros: [-0.02 * wN], poles: [-0.2 * wN, -0.5 * wN], gain: 3 },
  { name: 'two poles (two zeros at z = −1)', zeros: [], poles: [-0.1 * wN, -0.3 * wN], gain: -2 },
  { name: 'lag with a roll-off pole (one zero at z = −1, phase rising to −90°)', zeros: [-0.3 * wN], poles: [-0.01 * wN, -0.02 * wN], gain: 1 },
];

/** ∠H(jω) in degrees in closed form (real roots in the left half-plane); ω = ∞ gives the limit. */
function contPhaseDeg(d: Design, w: number): number {
  const at = (r: number) => (w === Infinity ? 90 : (Math.atan2(w, -r) * 180) / Math.PI);
  let ph = d.gain < 0 ? 180 : 0;
  for (const z of d.zeros) ph += at(z);
  for (const p of d.poles) ph -= at(p);
  return ph;
}

const rates = [...Array.from({ length: 2000 }, (_, i) => i + 1), 0.37, 2.5, 13.7, 99.9, 1234.56, 12345.678, 44100, 48000, 96000, 1e6 + 0.5, 3.3e6];

describe('the Nyquist point of the grids is z = −1 (ωT ≤ π)', () => {
  it('Tustin phase at Nyquist: the limit ∠K − 90°·(np − nz) with no step, and band errors up to bandHz = fs/2, for every integer rate 1…2000 Hz and some others', () => {
    const missed: string[] = [];
    for (const fs of rates) {
      const T = 1 / fs;
      const c = 2 / T;
      for (const d of designs(Math.PI * fs)) {
        const body: DiscretizeRequestBody = { compensator: { form: 'zpk', zeros: d.zeros, poles: d.poles, gain: d.gain }, sampleRateHz: fs, methods: ['tustin'], bandHz: fs / 2, responsePoints: 50 };
        const res = runDiscretize(discretizeRequestSchema.parse(body));
        const f = res.frequencyHz;
        const n = f.length;
        const p = res.methods.tustin!.response.phaseDeg;
        const cp = res.continuous.response.phaseDeg;
        // the limit of the bilinear identity, on the plotted branch (the discrete phase starts beside the continuous one)
        const limit = contPhaseDeg(d, Infinity);
        const turns = Math.round((p[n - 1] - limit) / 360);
        if (!(Math.abs(p[n - 1] - limit - 360 * turns) <= 1e-9)) missed.push(`${fs} Hz ${d.name}: last ${p[n - 1]}, limit ${limit} (mod 360)`);
        // no step: ∠H(jω′) at the previous grid point (ω′ ≈ 3·ωN there) lies within 20° of the limit
        if (!(Math.abs(p[n - 1] - p[n - 2]) < 20)) missed.push(`${fs} Hz ${d.name}: step ${p[n - 2]} → ${p[n - 1]}`);
        // plotted phase error at every grid point, and the largest in the band [0, fs/2], from the identity
        let expected = 0;
        for (let i = 0; i < n; i++) {
          const w = 2 * Math.PI * f[i];
          const wWarped = i === n - 1 ? Infinity : c * Math.tan((w * T) / 2);
          const e = contPhaseDeg(d, wWarped) - contPhaseDeg(d, w);
          expected = Math.max(expected, Math.abs(e));
          if (!(Math.abs(p[i] - cp[i] - e) <= 1e-9)) {
            missed.push(`${fs} Hz ${d.name}: point ${i} error ${p[i] - cp[i]}, identity ${e}`);
            break;
          }
        }
        if (!(Math.abs(res.methods.tustin!.maxPhaseErrorDeg - expected) <= 1e-9)) missed.push(`${fs} Hz ${d.name}: band error ${res.methods.tustin!.maxPhaseErrorDeg}, identity ${expected}`);
      }
    }
    expect(missed).toEqual([]);
  });

  it('the crossover grid ends at z = −1 too: no phase crossover of a loop whose phase stays above −180°, for every integer rate 1…500 Hz and the others', () => {
    // L = C with a unit static plant, C the lag with a roll-off pole. By the identity,
    // ∠L_d(e^{jθ}) = ∠C(jω′) = atan2(ω′, −z) − atan2(ω′, −p₁) − atan2(ω′, −p₂) lies in (−180°, 90°)
    // for θ < π (each root angle in (0°, 90°)) and rises to −90° at Nyquist, so the −180° line
    // is never reached: no gain margin. (Past π the zero at −1 stepped the last point to −270°,
    // a crossing of −180° in the last grid interval.)
    const missed: string[] = [];
    // (a loop costs more to analyse: 1…500 Hz holds 70 rates whose crossover grid ended past π,
    // 25 of them with the spurious crossing)
    for (const fs of rates.filter((r) => r <= 500 || !Number.isInteger(r))) {
      const d = designs(Math.PI * fs)[3];
      const res = runDiscretize(discretizeRequestSchema.parse({
        compensator: { form: 'zpk', zeros: d.zeros, poles: d.poles, gain: d.gain },
        plant: { form: 'tf', num: [1], den: [1] },
        sampleRateHz: fs,
        methods: ['tustin'],
      }));
      const m = res.methods.tustin!.loop!.margins;
      if (m.gainMarginDb !== null || m.phaseCrossoverHz !== null) missed.push(`${fs} Hz: gain margin ${m.gainMarginDb} dB at ${m.phaseCrossoverHz} Hz`);
    }
    expect(missed).toEqual([]);
  });
});
