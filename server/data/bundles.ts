import type { Db } from '../db/knex';
import type { BundleInfo } from '../../schemas/implementation-api';

export interface StoredBundle extends BundleInfo {
  id: number;
}

/** The design version row of a workspace's design, or undefined. */
export async function versionRow(db: Db, workspaceId: number, designId: number, number: number) {
  return db('design_versions as v')
    .join('designs as d', 'd.id', 'v.design_id')
    .where({ 'd.id': designId, 'd.workspace_id': workspaceId, 'v.number': number })
    .first('v.id', 'v.number', 'v.spec', 'v.status', 'd.name as designName');
}

function info(r: Record<string, unknown>): StoredBundle {
  return {
    id: Number(r.id), sha256: String(r.sha256), fileName: String(r.file_name), sizeBytes: Number(r.size_bytes),
    generatorVersion: String(r.generator_version), createdAt: new Date(r.created_at as string).toISOString(), versionNumber: Number(r.number),
  };
}

const COLUMNS = ['b.id', 'b.sha256', 'b.file_name', 'b.size_bytes', 'b.generator_version', 'b.created_at', 'v.number'];

export async function bundleOfVersion(db: Db, versionId: number): Promise<StoredBundle | undefined> {
  const r = await db('bundles as b').join('design_versions as v', 'v.id', 'b.design_version_id')
    .where('b.design_version_id', versionId).first(COLUMNS);
  return r ? info(r) : undefined;
}

export async function bundleZip(db: Db, bundleId: number): Promise<Buffer> {
  const r = await db('bundles').where({ id: bundleId }).first('zip');
  return Buffer.from(r.zip);
}

/** Stores a bundle once per version; a concurrent second insert finds the first (idempotent). */
export async function storeBundle(
  db: Db, versionId: number, userId: number, b: { zip: Buffer; sha256: string; fileName: string; generatorVersion: string; files: { path: string; content: string }[] },
): Promise<{ bundle: StoredBundle; created: boolean }> {
  try {
    await db('bundles').insert({
      design_version_id: versionId, sha256: b.sha256, file_name: b.fileName, size_bytes: b.zip.length, zip: b.zip, files: JSON.stringify(b.files),
      generator_version: b.generatorVersion, created_by: userId,
    });
    return { bundle: (await bundleOfVersion(db, versionId))!, created: true };
  } catch (e) {
    if ((e as { code?: string }).code !== 'ER_DUP_ENTRY') throw e;
    return { bundle: (await bundleOfVersion(db, versionId))!, created: false };
  }
}

export async function bundleFiles(db: Db, bundleId: number): Promise<{ path: string; content: string }[]> {
  const r = await db('bundles').where({ id: bundleId }).first('files');
  return JSON.parse(r.files);
}

export async function recordDownload(db: Db, bundleId: number, userId: number | null, client: string): Promise<void> {
  await db('downloads').insert({ bundle_id: bundleId, user_id: userId, client: client.slice(0, 64) });
}
