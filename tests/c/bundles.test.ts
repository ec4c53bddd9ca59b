/**
 * Generated C: for every test design and implementation variant, build the bundle, unzip it
 * into a temp dir and run `make test` (gcc, and clang when on PATH). When arm-none-eabi-gcc is
 * on PATH, cross-compile the controller for a Cortex-M4 and print its size.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { buildBundle } from '../../server/codegen';
import { DESIGNS, VARIANTS, discreteOf, settingsFor } from '../unit/fixed-point/designs';

const onPath = (cmd: string) => spawnSync('sh', ['-c', `command -v ${cmd}`]).status === 0;
const HAS_UNZIP = onPath('unzip');
const COMPILERS = ['gcc', ...(onPath('clang') ? ['clang'] : [])];
const HAS_ARM = onPath('arm-none-eabi-gcc');
const root = fs.mkdtempSync(path.join(os.tmpdir(), 'samplewright-c-'));
afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

async function unpack(label: string, variant: (typeof VARIANTS)[number], design: (typeof DESIGNS)[number]) {
  const prefix = `${design.name}_ctl`;
  const b = await buildBundle({
    designName: `Test ${design.name}`, versionNumber: 1, method: 'tustin', sampleRateHz: design.sampleRateHz,
    compensatorAsEntered: design.entered, discrete: discreteOf(design), settings: settingsFor(variant, prefix),
  });
  const dir = path.join(root, label);
  fs.mkdirSync(dir, { recursive: true });
  if (HAS_UNZIP) {
    fs.writeFileSync(path.join(dir, b.fileName), b.zip);
    execFileSync('unzip', ['-q', b.fileName], { cwd: dir });
  } else {
    for (const f of b.files) {
      const p = path.join(dir, `${prefix}-v1`, f.path);
      fs.mkdirSync(path.dirname(p), { recursive: true });
      fs.writeFileSync(p, f.content);
    }
  }
  return { bundleDir: path.join(dir, `${prefix}-v1`), prefix };
}

const make = (cwd: string, cc: string) => spawnSync('make', ['test', `CC=${cc}`], { cwd, encoding: 'utf8' });

describe.each(DESIGNS)('$name', (design) => {
  it.each(VARIANTS)('make test passes ($label)', async (variant) => {
    const { bundleDir, prefix } = await unpack(`${design.name}-${variant.label}`, variant, design);
    for (const cc of COMPILERS) {
      spawnSync('make', ['clean'], { cwd: bundleDir });
      const r = make(bundleDir, cc);
      if (r.status !== 0) throw new Error(`${cc}: make test failed\n${r.stdout}\n${r.stderr}`);
      expect(r.stdout).toMatch(/samples match the model exactly/);
    }
    if (HAS_ARM) {
      const fpu = variant.wordLength === 'float32' ? ['-mfloat-abi=hard', '-mfpu=fpv4-sp-d16'] : [];
      const obj = path.join(bundleDir, `${prefix}-m4.o`);
      execFileSync('arm-none-eabi-gcc', ['-std=c99', '-Wall', '-Wextra', '-Wpedantic', '-Wconversion', '-Werror', '-O2', '-ffp-contract=off',
        '-mcpu=cortex-m4', '-mthumb', ...fpu, '-Iinclude', '-c', `src/${prefix}.c`, '-o', obj], { cwd: bundleDir });
      console.log(`${design.name} ${variant.label} Cortex-M4:\n${execFileSync('arm-none-eabi-size', [obj], { encoding: 'utf8' })}`);
    }
  }, 60000);
});

describe('the host test can fail', () => {
  it('exits non-zero on the first mismatching sample', async () => {
    const { bundleDir, prefix } = await unpack('tampered', VARIANTS[0], DESIGNS[0]);
    const testFile = path.join(bundleDir, 'test', `test_${prefix}.c`);
    const src = fs.readFileSync(testFile, 'utf8');
    // Change the first expected output that is not the last value of its line.
    const yStart = src.indexOf('k_y[SAMPLES] = {');
    const m = /(-?\d+),/.exec(src.slice(yStart + 16))!;
    const at = yStart + 16 + m.index;
    fs.writeFileSync(testFile, src.slice(0, at) + String(Number(m[1]) + 1) + src.slice(at + m[1].length));
    const r = make(bundleDir, 'gcc');
    expect(r.status).not.toBe(0);
    expect(r.stdout).toMatch(/mismatch at n = 0/);
  }, 60000);
});
