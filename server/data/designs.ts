import type { Db } from '../db/knex';
import type { DesignDetail, DesignSpec, DesignSummary, VersionStatus, VersionSummary } from '../../schemas/design';
import { canonicalJson, sha256Hex } from './canonical';
import { audit } from './users';

interface DesignRow {
  id: number;
  workspace_id: number;
  name: string;
  archived: number | boolean;
  updated_at: Date;
}

const iso = (d: Date | string) => new Date(d).toISOString();
const parseJson = <T>(v: unknown): T => (typeof v === 'string' ? JSON.parse(v) : v) as T;

export const specHash = (spec: DesignSpec) => sha256Hex(canonicalJson(spec));

export async function listDesigns(db: Db, workspaceId: number, archived: boolean): Promise<DesignSummary[]> {
  const rows = await db('designs as d')
    .join('design_versions as v', function () {
      this.on('v.design_id', 'd.id').andOn(
        'v.number',
        db.raw('(SELECT MAX(number) FROM design_versions WHERE design_id = d.id)'),
      );
    })
    .leftJoin('users as u', 'u.id', 'v.author_id')
    .where({ 'd.workspace_id': workspaceId, 'd.archived': archived })
    .orderBy('d.updated_at', 'desc')
    .select('d.id', 'd.name', 'd.archived', 'd.updated_at', 'v.number', 'v.status', 'v.created_at', 'u.name as author');
  return rows.map((r) => ({
    id: r.id, name: r.name, archived: Boolean(r.archived), updatedAt: iso(r.updated_at),
    latestVersion: { number: r.number, status: r.status, createdAt: iso(r.created_at), authorName: r.author ?? '(removed user)' },
  }));
}

async function findDesign(db: Db, workspaceId: number, designId: number): Promise<DesignRow | undefined> {
  return db<DesignRow>('designs').where({ id: designId, workspace_id: workspaceId }).first();
}

async function versionsOf(db: Db, designId: number): Promise<VersionSummary[]> {
  const rows = await db('design_versions as v')
    .leftJoin('users as u', 'u.id', 'v.author_id')
    .where('v.design_id', designId)
    .orderBy('v.number', 'desc')
    .select('v.number', 'v.status', 'v.spec_hash', 'v.created_at', 'u.name as author');
  return rows.map((r) => ({
    number: r.number, status: r.status, specHash: r.spec_hash, createdAt: iso(r.created_at), authorName: r.author ?? '(removed user)',
  }));
}

export async function getDesignDetail(db: Db, workspaceId: number, designId: number): Promise<DesignDetail | undefined> {
  const d = await findDesign(db, workspaceId, designId);
  if (!d) return undefined;
  const versions = await versionsOf(db, d.id);
  const latest = await db('design_versions').where({ design_id: d.id }).orderBy('number', 'desc').first();
  return {
    design: { id: d.id, name: d.name, archived: Boolean(d.archived), updatedAt: iso(d.updated_at) },
    versions,
    latest: { number: latest.number, status: latest.status, spec: parseJson<DesignSpec>(latest.spec) },
  };
}

export async function getVersion(db: Db, workspaceId: number, designId: number, number: number) {
  const d = await findDesign(db, workspaceId, designId);
  if (!d) return undefined;
  const r = await db('design_versions as v')
    .leftJoin('users as u', 'u.id', 'v.author_id')
    .where({ 'v.design_id': d.id, 'v.number': number })
    .first('v.number', 'v.status', 'v.spec', 'v.spec_hash', 'v.created_at', 'u.name as author');
  if (!r) return undefined;
  return {
    number: r.number as number, status: r.status as VersionStatus, spec: parseJson<DesignSpec>(r.spec), specHash: r.spec_hash as string,
    createdAt: iso(r.created_at), authorName: (r.author as string | null) ?? '(removed user)',
  };
}

export async function createDesign(db: Db, workspaceId: number, userId: number, name: string, spec: DesignSpec): Promise<number> {
  return db.transaction(async (trx) => {
    const [id] = await trx('designs').insert({ workspace_id: workspaceId, name, created_by: userId });
    await trx('design_versions').insert({
      design_id: id, number: 1, spec: canonicalJson(spec), spec_hash: specHash(spec), author_id: userId,
    });
    await audit(trx, { workspaceId, userId, action: 'design.create', subject: String(id), detail: { name } });
    return Number(id);
  });
}

/** Saves a spec: a new draft version when it differs from the latest one, else nothing. */
export async function saveSpec(
  db: Db, workspaceId: number, designId: number, userId: number, spec: DesignSpec,
): Promise<{ created: boolean; version: { number: number; status: VersionStatus } } | undefined> {
  return db.transaction(async (trx) => {
    const d = await trx('designs').where({ id: designId, workspace_id: workspaceId }).forUpdate().first();
    if (!d) return undefined;
    const latest = await trx('design_versions').where({ design_id: designId }).orderBy('number', 'desc').first();
    const hash = specHash(spec);
    if (latest && latest.spec_hash === hash) {
      return { created: false, version: { number: latest.number, status: latest.status } };
    }
    const number = (latest?.number ?? 0) + 1;
    await trx('design_versions').insert({ design_id: designId, number, spec: canonicalJson(spec), spec_hash: hash, author_id: userId });
    await trx('designs').where({ id: designId }).update({ updated_at: trx.fn.now(3) });
    await audit(trx, { workspaceId, userId, action: 'design.version', subject: String(designId), detail: { number } });
    return { created: true, version: { number, status: 'draft' as const } };
  });
}

export async function updateDesign(
  db: Db, workspaceId: number, designId: number, userId: number, patch: { name?: string; archived?: boolean },
): Promise<boolean> {
  const changes: Record<string, unknown> = { updated_at: db.fn.now(3) };
  if (patch.name !== undefined) changes.name = patch.name;
  if (patch.archived !== undefined) changes.archived = patch.archived;
  const n = await db('designs').where({ id: designId, workspace_id: workspaceId }).update(changes);
  if (n) await audit(db, { workspaceId, userId, action: 'design.update', subject: String(designId), detail: patch });
  return n > 0;
}
