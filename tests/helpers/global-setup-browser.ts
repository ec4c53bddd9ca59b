/** The browser project also needs the exported web build (built once, when stale). */
import path from 'node:path';
import dbSetup from './global-setup';
import { ensureWebBuild, ROOT } from '../../server/web-build';

export default async function globalSetup(): Promise<void> {
  await dbSetup();
  ensureWebBuild(path.join(ROOT, 'dist'));
}
