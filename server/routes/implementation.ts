import { Router, type Request } from 'express';
import {
  bundleFilesSchema, bundleResponseSchema, implementRequestSchema, implementResponseSchema,
} from '../../schemas/implementation-api';
import type { DesignSpec } from '../../schemas/design';
import type { AppContext } from '../context';
import { ANY_MEMBER, WRITERS, requireRole, requireUser } from '../auth/roles';
import { notFound, parseOr400 } from '../http/errors';
import { idParam } from '../http/params';
import { analyzeImplementation } from '../fixed-point';
import { buildBundle, GENERATOR_VERSION } from '../codegen';
import { bundleOfVersion as buildVersionBundle, discreteOf } from '../codegen/from-spec';
import { bundleFiles, bundleOfVersion, bundleZip, recordDownload, storeBundle, versionRow } from '../data/bundles';
import { audit } from '../data/users';

const VERSION = '/api/v1/workspaces/:workspaceId/designs/:designId/versions/:number';

export function implementationRoutes(ctx: AppContext): Router {
  const { db, registry } = ctx;
  const r = Router();
  const tag = 'implementation';

  registry.add({ method: 'post', path: '/api/v1/implement', tag, auth: 'session-or-token', body: implementRequestSchema,
    response: implementResponseSchema,
    summary: 'Preview a fixed-point (or float32) implementation: coefficients, quantized roots, warnings, advice, and the C files' });
  r.post('/implement', requireUser, async (req, res) => {
    const body = parseOr400(implementRequestSchema, req.body);
    // settings were parsed by the request schema; input the schema cannot see (e.g. a
    // tf-form root beyond Nyquist) is a DspInputError, answered 400 by the error middleware
    const discrete = discreteOf(body);
    const analysis = analyzeImplementation(discrete, body.settings, body.tolerances ?? {});
    const bundle = await buildBundle({
      designName: '(preview)', versionNumber: 0, method: body.method, sampleRateHz: body.sampleRateHz,
      compensatorAsEntered: body.compensator, discrete, settings: body.settings,
    });
    res.json({ analysis, files: bundle.files });
  });

  const router = Router({ mergeParams: true });
  const read = requireRole(db, ...ANY_MEMBER);
  const write = requireRole(db, ...WRITERS);
  async function version(req: Request) {
    const v = await versionRow(db, req.workspace!.id, idParam(req.params.designId, 'design'), idParam(req.params.number, 'version'));
    if (!v) throw notFound('No such version');
    return v;
  }
  async function stored(req: Parameters<typeof version>[0]) {
    const v = await version(req);
    const b = await bundleOfVersion(db, v.id);
    if (!b) throw notFound('No bundle has been generated for this version yet');
    return b;
  }

  registry.add({ method: 'post', path: `${VERSION}/bundle`, tag, status: 201, response: bundleResponseSchema,
    summary: 'Generate and store the code bundle of a version (201), or answer the stored one (200): the same version always gives the same bytes' });
  router.post('/bundle', write, async (req, res) => {
    const v = await version(req);
    const existing = await bundleOfVersion(db, v.id);
    if (existing) return void res.status(200).json({ bundle: existing });
    const spec = (typeof v.spec === 'string' ? JSON.parse(v.spec) : v.spec) as DesignSpec;
    const b = await buildVersionBundle(v.designName, v.number, spec); // settings checked, 400 at spec.implementation
    const { bundle, created } = await storeBundle(db, v.id, req.user!.id, { ...b, generatorVersion: GENERATOR_VERSION });
    if (created) {
      await audit(db, { workspaceId: req.workspace!.id, userId: req.user!.id, action: 'bundle.generate', subject: b.fileName, detail: { sha256: b.sha256 } });
    }
    res.status(created ? 201 : 200).json({ bundle });
  });

  registry.add({ method: 'get', path: `${VERSION}/bundle`, tag, response: bundleResponseSchema, summary: 'The stored bundle of a version: file name, size, SHA-256' });
  router.get('/bundle', read, async (req, res) => {
    const { id: _id, ...bundle } = await stored(req);
    res.json({ bundle });
  });

  registry.add({ method: 'get', path: `${VERSION}/bundle/files`, tag, response: bundleFilesSchema, summary: 'The files of the stored bundle as text, without downloading' });
  router.get('/bundle/files', read, async (req, res) => {
    const b = await stored(req);
    res.json({ files: await bundleFiles(db, b.id) });
  });

  registry.add({ method: 'get', path: `${VERSION}/bundle.zip`, tag, produces: 'application/zip', summary: 'Download the stored bundle (a zip named <prefix>-v<N>.zip)' });
  router.get('/bundle.zip', read, async (req, res) => {
    const b = await stored(req);
    const zip = await bundleZip(db, b.id);
    await recordDownload(db, b.id, req.user!.id, String(req.headers['user-agent'] ?? ''));
    res.setHeader('Content-Type', 'application/zip');
    res.setHeader('Content-Disposition', `attachment; filename="${b.fileName}"`);
    res.setHeader('Digest', `sha-256=${Buffer.from(b.sha256, 'hex').toString('base64')}`);
    res.setHeader('X-Bundle-SHA256', b.sha256);
    res.send(zip);
  });

  r.use('/workspaces/:workspaceId/designs/:designId/versions/:number', router);
  return r;
}
