/**
 * `npm run dev`: the API (private MariaDB, demo data) on :8080 plus Expo's Metro dev server
 * on :8081 with fast reload; the client calls the API across the two ports with the cookie.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';

const ROOT = path.resolve(__dirname, '..');
const apiPort = process.env.PORT ?? '8080';
const webPort = process.env.DEV_WEB_PORT ?? '8081';
const host = '127.0.0.1';

const api = spawn(process.execPath, ['--import', 'tsx', 'server/start.ts'], {
  cwd: ROOT, stdio: 'inherit',
  env: { ...process.env, NODE_ENV: 'development', BUILD_WEB: 'false', PORT: apiPort, DEV_WEB_ORIGIN: `http://${host}:${webPort}` },
});
const web = spawn(process.execPath, [require.resolve('expo/bin/cli', { paths: [ROOT] }), 'start', '--web', '--port', webPort, '--host', 'lan'], {
  cwd: ROOT, stdio: 'inherit',
  env: { ...process.env, EXPO_PUBLIC_API_URL: `http://${host}:${apiPort}`, EXPO_NO_TELEMETRY: '1', BROWSER: 'none' },
});
console.log(`\nSamplewright dev: open http://${host}:${webPort} (API on http://${host}:${apiPort})\n`);

let stopping = false;
let running = 2;
let exitCode = 0;
function stop(code: number) {
  exitCode ||= code;
  if (stopping) return;
  stopping = true;
  api.kill('SIGTERM'); // the API stops its MariaDB on SIGTERM
  web.kill('SIGTERM');
}
function exited(code: number | null) {
  running -= 1;
  stop(code ?? 0);
  if (running === 0) process.exit(exitCode);
}
api.on('exit', exited);
web.on('exit', exited);
process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));
