import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

export const ROOT = path.resolve(__dirname, '..');
const SOURCES = ['app', 'components', 'schemas', 'assets', 'app.json', 'package.json', 'babel.config.js', 'server/dsp/types.ts'];

function newestMtime(p: string): number {
  let st: fs.Stats;
  try {
    st = fs.statSync(p);
  } catch {
    return 0;
  }
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const e of fs.readdirSync(p)) max = Math.max(max, newestMtime(path.join(p, e)));
  return max;
}

/** True when the exported web build is missing or older than any client source. */
export function webBuildIsStale(outDir: string): boolean {
  const index = path.join(outDir, 'index.html');
  if (!fs.existsSync(index)) return true;
  const built = fs.statSync(index).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(ROOT, s)) > built);
}

/** Runs `expo export --platform web` into outDir when stale (about 45 s). */
export function ensureWebBuild(outDir: string, log: (l: string) => void = console.log): void {
  if (!webBuildIsStale(outDir)) return;
  log(`Building the web app into ${path.relative(ROOT, outDir) || outDir} (expo export, about a minute)…`);
  const tmp = `${outDir}.tmp-${process.pid}`;
  fs.rmSync(tmp, { recursive: true, force: true });
  const r = spawnSync(
    process.execPath,
    [require.resolve('expo/bin/cli', { paths: [ROOT] }), 'export', '--platform', 'web', '--output-dir', tmp],
    { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'], env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1' } },
  );
  if (r.status !== 0) {
    fs.rmSync(tmp, { recursive: true, force: true });
    throw new Error('expo export failed');
  }
  // swap in the new build in one step so a running server never sees half a build
  const old = `${outDir}.old-${process.pid}`;
  if (fs.existsSync(outDir)) fs.renameSync(outDir, old);
  fs.renameSync(tmp, outDir);
  fs.rmSync(old, { recursive: true, force: true });
}
