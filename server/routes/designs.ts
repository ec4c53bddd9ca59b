import { Router } from 'express';
import {
  createDesignRequestSchema, designDetailSchema, designListSchema, designVersionResponseSchema, listDesignsQuerySchema,
  saveSpecRequestSchema, saveSpecResponseSchema, updateDesignRequestSchema,
} from '../../schemas/design';
import type { AppContext } from '../context';
import { ANY_MEMBER, WRITERS, requireRole } from '../auth/roles';
import { createDesign, getDesignDetail, getVersion, listDesigns, saveSpec, updateDesign } from '../data/designs';
import { notFound, parseOr400 } from '../http/errors';
import { idParam } from '../http/params';

const BASE = '/api/v1/workspaces/:workspaceId/designs';

/** Designs and their numbered spec versions: owners and engineers write, every member reads. */
export function designRoutes(ctx: AppContext): Router {
  const { db, registry } = ctx;
  const r = Router({ mergeParams: true });
  const read = requireRole(db, ...ANY_MEMBER);
  const write = requireRole(db, ...WRITERS);
  const tag = 'designs';

  registry.add({ method: 'get', path: BASE, tag, query: listDesignsQuerySchema, response: designListSchema,
    summary: 'List the designs of a workspace (archived=true lists the archived ones)' });
  r.get('/', read, async (req, res) => {
    const q = parseOr400(listDesignsQuerySchema, req.query, 'query');
    res.json({ designs: await listDesigns(db, req.workspace!.id, q.archived === 'true') });
  });

  registry.add({ method: 'post', path: BASE, tag, status: 201, body: createDesignRequestSchema, response: designDetailSchema,
    summary: 'Create a design with its first draft version' });
  r.post('/', write, async (req, res) => {
    const body = parseOr400(createDesignRequestSchema, req.body);
    const id = await createDesign(db, req.workspace!.id, req.user!.id, body.name, body.spec);
    res.status(201).json(await getDesignDetail(db, req.workspace!.id, id));
  });

  registry.add({ method: 'get', path: `${BASE}/:designId`, tag, response: designDetailSchema,
    summary: 'A design with its versions (newest first) and the latest spec' });
  r.get('/:designId', read, async (req, res) => {
    const detail = await getDesignDetail(db, req.workspace!.id, idParam(req.params.designId, 'design'));
    if (!detail) throw notFound('No such design');
    res.json(detail);
  });

  registry.add({ method: 'patch', path: `${BASE}/:designId`, tag, body: updateDesignRequestSchema, response: designDetailSchema,
    summary: 'Rename, archive or unarchive a design' });
  r.patch('/:designId', write, async (req, res) => {
    const body = parseOr400(updateDesignRequestSchema, req.body);
    const id = idParam(req.params.designId, 'design');
    if (!(await updateDesign(db, req.workspace!.id, id, req.user!.id, body))) throw notFound('No such design');
    res.json(await getDesignDetail(db, req.workspace!.id, id));
  });

  registry.add({ method: 'put', path: `${BASE}/:designId/spec`, tag, body: saveSpecRequestSchema, response: saveSpecResponseSchema,
    summary: 'Save the spec: a new draft version when it changed, none when it equals the latest' });
  r.put('/:designId/spec', write, async (req, res) => {
    const body = parseOr400(saveSpecRequestSchema, req.body);
    const out = await saveSpec(db, req.workspace!.id, idParam(req.params.designId, 'design'), req.user!.id, body.spec);
    if (!out) throw notFound('No such design');
    res.json(out);
  });

  registry.add({ method: 'get', path: `${BASE}/:designId/versions/:number`, tag, response: designVersionResponseSchema,
    summary: 'One version of a design with its spec' });
  r.get('/:designId/versions/:number', read, async (req, res) => {
    const v = await getVersion(db, req.workspace!.id, idParam(req.params.designId, 'design'), idParam(req.params.number, 'version'));
    if (!v) throw notFound('No such version');
    res.json({ version: v });
  });

  return r;
}
