/**
 * The implementation screen end to end, in Debian's Chromium against the real server on a
 * fresh demo-seeded database: an engineer enters fixed-point settings, saves them (a new
 * version), generates the bundle, downloads the zip, and the SHA-256 of the downloaded bytes
 * equals the one shown and the one the API reports; a viewer then sees and downloads the same
 * bundle but can neither save nor generate.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { implementationSettingsSchema } from '../../schemas/implementation';
import { bundleResponseSchema } from '../../schemas/implementation-api';
import { DEMO_DESIGNS, DEMO_PASSWORD } from '../../server/seed';
import { launchBrowser, screenshot, VIEWPORTS, type TestBrowser } from '../helpers/browser';
import { startTestServer } from '../helpers/test-server';

jest.setTimeout(180_000);

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: TestBrowser;

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const DESIGN_NAME = DEMO_DESIGNS[0].name;
const PREFIX = 'tilt_lead';

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByTestId('signin-email').fill(email);
  await page.getByTestId('signin-password').fill(DEMO_PASSWORD);
  await page.getByTestId('signin-submit').click();
  await page.getByTestId('current-role').waitFor();
}

/** JSON of an API call made from the page, with its session cookie (and CSRF token when not a GET). */
async function api(page: Page, method: string, path: string): Promise<{ status: number; body: any }> {
  return page.evaluate(
    async ({ method, path }) => {
      const me = await (await fetch('/api/v1/auth/me', { credentials: 'include' })).json();
      const res = await fetch(path, { method, credentials: 'include', headers: method === 'GET' ? {} : { 'X-CSRF-Token': me.csrfToken } });
      const text = await res.text();
      return { status: res.status, body: text ? JSON.parse(text) : null };
    },
    { method, path },
  );
}

async function findDesign(page: Page): Promise<{ workspaceId: number; designId: number; latest: number }> {
  const me = await api(page, 'GET', '/api/v1/auth/me');
  const workspaceId = me.body.memberships[0].workspace.id as number;
  const list = await api(page, 'GET', `/api/v1/workspaces/${workspaceId}/designs`);
  const design = (list.body.designs as { id: number; name: string; latestVersion: { number: number } }[]).find((d) => d.name === DESIGN_NAME);
  if (!design) throw new Error(`the demo seed has no design named ${DESIGN_NAME}`);
  return { workspaceId, designId: design.id, latest: design.latestVersion.number };
}

const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

let saved: { workspaceId: number; designId: number; version: number; sha: string } | null = null;

test('an engineer saves settings, generates the bundle and downloads a zip whose SHA-256 is the one shown', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.wide);
  await signIn(page, 'engineer@example.com');
  const { workspaceId, designId, latest } = await findDesign(page);

  await page.goto(`${server.baseUrl}/implement/${designId}`);
  await page.getByTestId('impl-word-length').waitFor();

  // field errors come from the shared schema, under the fields
  await page.getByTestId('impl-prefix').fill('int');
  await page.getByTestId('impl-output-scale').fill('0');
  const bad = implementationSettingsSchema.safeParse({ wordLength: 16, inputScale: 1, outputScale: 0, outputLimits: { min: -1, max: 1 }, prefix: 'int' });
  if (bad.success) throw new Error('the schema accepted a keyword prefix and a zero scale');
  const messageAt = (path: string) => bad.error.issues.find((i) => i.path.join('.') === path)!.message;
  expect(await page.getByTestId('impl-prefix-error').innerText()).toBe(messageAt('prefix'));
  expect(await page.getByTestId('impl-output-scale-error').innerText()).toBe(messageAt('outputScale'));

  // valid settings: 16-bit direct form I, an ADC in volts per count, a PWM in duty per count
  const preview = page.waitForResponse((r) => r.url().endsWith('/api/v1/implement') && r.request().method() === 'POST' && r.request().postDataJSON()?.settings?.prefix === PREFIX);
  await page.getByTestId('impl-word-length-16').click();
  await page.getByTestId('impl-input-scale').fill('3.3/4096');
  await page.getByTestId('impl-output-scale').fill('1/1000');
  await page.getByTestId('impl-limit-min').fill('-1000');
  await page.getByTestId('impl-limit-max').fill('1000');
  await page.getByTestId('impl-prefix').fill(PREFIX);
  await page.getByTestId('impl-structure-direct-form-1').click();
  expect(await page.getByTestId('impl-prefix-error').count()).toBe(0);

  // the live preview: coefficients, advice and the generated files with this prefix
  expect((await preview).status()).toBe(200);
  await page.getByTestId('impl-coefficients').waitFor();
  await page.getByTestId('impl-coef-1-b0').waitFor();
  await page.getByTestId('impl-advice').waitFor();
  await page.getByTestId('impl-code').waitFor();
  await page.waitForFunction((p) => document.querySelector('[data-testid="impl-code-text"]')?.textContent?.includes(p), PREFIX);

  // save: a new version with these settings
  const put = page.waitForResponse((r) => r.url().endsWith(`/designs/${designId}/spec`) && r.request().method() === 'PUT');
  await page.getByTestId('impl-save').click();
  const putAnswer = await put;
  expect(putAnswer.status()).toBe(200);
  const version = latest + 1;
  expect(((await putAnswer.json()) as { version: { number: number } }).version.number).toBe(version);
  await page.waitForURL((url) => url.pathname === `/implement/${designId}` && url.searchParams.get('version') === String(version));
  await page.getByTestId('impl-bundle-none').waitFor();

  // generate the bundle of the saved version
  const post = page.waitForResponse((r) => r.url().endsWith(`/versions/${version}/bundle`) && r.request().method() === 'POST');
  await page.getByTestId('impl-generate').click();
  const postAnswer = await post;
  expect(postAnswer.status()).toBe(201);
  const { bundle } = bundleResponseSchema.parse(await postAnswer.json());
  expect(bundle.versionNumber).toBe(version);
  expect(bundle.fileName).toBe(`${PREFIX}-v${version}.zip`);

  const shown = (await page.getByTestId('impl-sha256').innerText()).trim();
  expect(shown).toBe(bundle.sha256);
  expect(await page.getByTestId('impl-download').innerText()).toContain(bundle.fileName);
  await page.getByTestId('design-cautions').waitFor();
  await screenshot(page, 'implement-engineer-1440');

  // the download is a plain link: the browser saves the zip itself
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('impl-download').click()]);
  expect(download.suggestedFilename()).toBe(bundle.fileName);
  const file = await download.path();
  const bytes = fs.readFileSync(file);
  expect(bytes.length).toBe(bundle.sizeBytes);
  expect(bytes.subarray(0, 4).toString('latin1')).toBe('PK\u0003\u0004');
  expect(bytes.includes(Buffer.from(`${PREFIX}-v${version}/`))).toBe(true);
  expect(sha256(bytes)).toBe(shown);

  // generating again is idempotent: 200, the same bundle
  const again = await api(page, 'POST', `/api/v1/workspaces/${workspaceId}/designs/${designId}/versions/${version}/bundle`);
  expect(again.status).toBe(200);
  expect(again.body.bundle.sha256).toBe(bundle.sha256);

  // once stored, the code view shows the stored files
  await page.reload();
  await page.getByTestId('impl-sha256').waitFor();
  await page.waitForFunction((p) => document.querySelector('[data-testid="impl-code-text"]')?.textContent?.includes(p), `${PREFIX}`);
  expect(await page.getByTestId('impl-generate').count()).toBe(0);

  await api(page, 'POST', '/api/v1/auth/logout');
  saved = { workspaceId, designId, version, sha: bundle.sha256 };
  expect(errors).toEqual([]);
  await page.close();
});

test('at 390 px a viewer sees and downloads the same bundle but cannot save or generate', async () => {
  if (!saved) throw new Error('the engineer test did not get as far as a stored bundle');
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  await signIn(page, 'viewer@example.com');
  await page.goto(`${server.baseUrl}/implement/${saved.designId}?version=${saved.version}`);
  await page.getByTestId('impl-sha256').waitFor();
  expect((await page.getByTestId('impl-sha256').innerText()).trim()).toBe(saved.sha);
  expect(await page.getByTestId('impl-read-only').isVisible()).toBe(true);
  expect(await page.getByTestId('impl-save').count()).toBe(0);
  expect(await page.getByTestId('impl-generate').count()).toBe(0);
  await page.getByTestId('impl-coefficients').waitFor();

  // no sideways scroll of the page itself at 390 px (wide tables scroll inside their box)
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(0);
  await screenshot(page, 'implement-viewer-390');

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('impl-download').click()]);
  expect(sha256(fs.readFileSync(await download.path()))).toBe(saved.sha);

  // the server refuses a viewer's generate as well
  const refused = await api(page, 'POST', `/api/v1/workspaces/${saved.workspaceId}/designs/${saved.designId}/versions/${saved.version}/bundle`);
  expect(refused.status).toBe(403);
  await api(page, 'POST', '/api/v1/auth/logout');
  expect(errors).toEqual([]);
  await page.close();
});
