import fs from 'node:fs';

export default async function globalTeardown(): Promise<void> {
  const t = globalThis.__samplewrightTestDb;
  if (!t) return;
  globalThis.__samplewrightTestDb = undefined;
  await t.db.stop();
  fs.rmSync(t.dir, { recursive: true, force: true });
}
