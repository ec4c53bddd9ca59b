/**
 * Signs in through the real UI of the exported web build, served by the real server on a
 * fresh demo-seeded database, in Debian's Chromium at a phone and a desktop width.
 */
import type { Page } from 'playwright-core';
import { loginRequestSchema } from '../../schemas/auth';
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from '../../server/seed';
import { launchBrowser, screenshot, VIEWPORTS, type TestBrowser } from '../helpers/browser';
import { startTestServer } from '../helpers/test-server';

jest.setTimeout(120_000);

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: TestBrowser;

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});

// each test starts signed out
beforeEach(async () => {
  await browser.context.clearCookies();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const ROLE_LABEL: Record<string, string> = { owner: 'Owner', engineer: 'Engineer', reviewer: 'Reviewer', viewer: 'Viewer' };

function pathOf(page: Page): string {
  const url = new URL(page.url());
  return url.pathname + url.search;
}

async function fillSignIn(page: Page, email: string, password: string): Promise<void> {
  await page.getByTestId('signin-email').fill(email);
  await page.getByTestId('signin-password').fill(password);
  await page.getByTestId('signin-submit').click();
}

async function signedInAs(page: Page, role: string): Promise<void> {
  const badge = page.getByTestId('current-role');
  await badge.waitFor();
  expect(await badge.innerText()).toBe(ROLE_LABEL[role]);
}

async function visible(page: Page, testId: string): Promise<boolean> {
  return page.getByTestId(testId).isVisible();
}

test('an empty form shows the shared schema messages under the fields, without asking the server', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  let loginCalls = 0;
  page.on('request', (r) => {
    if (r.url().endsWith('/api/v1/auth/login')) loginCalls += 1;
  });
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByTestId('signin-submit').click();

  const parsed = loginRequestSchema.safeParse({ email: '', password: '' });
  if (parsed.success) throw new Error('the schema accepted an empty form');
  const messageOf = (field: string) => parsed.error.issues.find((i) => i.path[0] === field)!.message;
  expect(await page.getByTestId('signin-email-error').innerText()).toBe(messageOf('email'));
  expect(await page.getByTestId('signin-password-error').innerText()).toBe(messageOf('password'));
  expect(loginCalls).toBe(0);
  expect(errors).toEqual([]);
  await page.close();
});

test('a wrong password shows the server’s message and stays on the sign-in page', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  await page.goto(`${server.baseUrl}/sign-in`);
  const answer = page.waitForResponse((r) => r.url().endsWith('/api/v1/auth/login'));
  await fillSignIn(page, 'owner@example.com', 'not-the-password');
  const response = await answer;
  expect(response.status()).toBe(401);
  const body = (await response.json()) as { error: { message: string } };

  const banner = page.getByTestId('signin-error');
  await banner.waitFor();
  expect(await banner.innerText()).toBe(body.error.message);
  expect(new URL(page.url()).pathname).toBe('/sign-in');
  expect(await visible(page, 'current-role')).toBe(false);
  await screenshot(page, 'signin-wrong-password-390');
  expect(errors).toEqual([]);
  await page.close();
});

test('at 390 px: a deep link asks for sign-in, comes back to the page, survives a reload, and sign-out ends the session', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  await page.goto(`${server.baseUrl}/members`);
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(new URL(page.url()).searchParams.get('next')).toBe('/members');
  await screenshot(page, 'signin-390');

  await fillSignIn(page, 'engineer@example.com', DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname === '/members');
  await signedInAs(page, 'engineer');

  // phone layout: header and bottom bar, no side column
  expect(await visible(page, 'bottom-nav')).toBe(true);
  expect(await visible(page, 'side-nav')).toBe(false);
  expect(await page.getByTestId('workspace-switcher').innerText()).toContain(DEMO_WORKSPACE.name);

  // an engineer reads the member list but cannot change it
  for (const user of DEMO_USERS) await page.getByTestId(`member-row-${user.email}`).waitFor();
  expect(await visible(page, 'members-read-only')).toBe(true);
  expect(await visible(page, 'member-add-email')).toBe(false);
  expect(await page.getByTestId('member-role-owner@example.com').innerText()).toBe('Owner');
  await screenshot(page, 'members-engineer-390');

  // the server falls back to index.html, so reloading a deep route keeps the page and the session
  await page.reload();
  await signedInAs(page, 'engineer');
  await page.getByTestId('member-row-viewer@example.com').waitFor();
  expect(new URL(page.url()).pathname).toBe('/members');
  expect(await page.title()).toBe('Members · Samplewright');

  await page.getByTestId('nav-overview').click();
  await page.waitForURL((url) => url.pathname === '/');
  await page.getByTestId('overview-screen').waitFor();
  await page.getByTestId('caution-line').waitFor();
  await screenshot(page, 'overview-engineer-390');

  await page.getByTestId('account-menu').click();
  await page.getByTestId('sign-out').click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(pathOf(page)).toBe('/sign-in');
  await page.getByTestId('signin-email').waitFor();

  // the cookie no longer opens the app
  const me = await page.evaluate(async () => (await fetch('/api/v1/auth/me', { credentials: 'include' })).status);
  expect(me).toBe(401);
  await page.goto(`${server.baseUrl}/`);
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(errors).toEqual([]);
  await page.close();
});

test('every demo user sees their own role', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  for (const user of DEMO_USERS) {
    await page.goto(`${server.baseUrl}/sign-in`);
    await fillSignIn(page, user.email, DEMO_PASSWORD);
    await page.waitForURL((url) => url.pathname === '/');
    await signedInAs(page, user.role);
    await page.getByTestId('account-menu').click();
    await page.getByTestId('sign-out').click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
  }
  expect(errors).toEqual([]);
  await page.close();
});

test('at 1440 px: side navigation; an owner adds a member (one-time password shown once), cannot step down as the only owner, removes the member', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.wide);
  await page.goto(`${server.baseUrl}/`);
  await page.waitForURL((url) => url.pathname === '/sign-in');
  await screenshot(page, 'signin-1440');
  await fillSignIn(page, 'owner@example.com', DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname === '/');
  await signedInAs(page, 'owner');

  expect(await visible(page, 'side-nav')).toBe(true);
  expect(await visible(page, 'bottom-nav')).toBe(false);
  expect(await visible(page, 'sign-out')).toBe(true);
  await screenshot(page, 'overview-owner-1440');

  await page.getByTestId('nav-members').click();
  await page.waitForURL((url) => url.pathname === '/members');
  await page.getByTestId('member-row-owner@example.com').waitFor();

  const email = 'new.colleague@example.com';
  await page.getByTestId('member-add-email').fill(email);
  await page.getByTestId('member-add-role-reviewer').click();
  await page.getByTestId('member-add-submit').click();
  const password = page.getByTestId('member-initial-password');
  await password.waitFor();
  expect((await password.innerText()).length).toBeGreaterThanOrEqual(8);
  await page.getByTestId(`member-row-${email}`).waitFor();
  expect(await page.getByTestId(`member-role-${email}-reviewer`).getAttribute('aria-checked')).toBe('true');
  await screenshot(page, 'members-owner-1440');

  // shown once: after "Done" it is gone, and a reload does not bring it back
  await page.getByTestId('member-added-dismiss').click();
  expect(await password.count()).toBe(0);
  await page.reload();
  await page.getByTestId(`member-row-${email}`).waitFor();
  expect(await password.count()).toBe(0);

  // the only owner cannot step down: the server's 409 answer shows in the row, the role stays
  const patch = page.waitForResponse((r) => r.request().method() === 'PATCH');
  await page.getByTestId('member-role-owner@example.com-viewer').click();
  await page.getByTestId('member-confirm-owner@example.com').click();
  const conflict = await patch;
  expect(conflict.status()).toBe(409);
  const conflictBody = (await conflict.json()) as { error: { message: string } };
  const rowError = page.getByTestId('member-error-owner@example.com');
  await rowError.waitFor();
  expect(await rowError.innerText()).toBe(conflictBody.error.message);
  expect(await page.getByTestId('member-role-owner@example.com-owner').getAttribute('aria-checked')).toBe('true');
  await signedInAs(page, 'owner');

  // removing asks once more, then the row is gone
  await page.getByTestId(`member-remove-${email}`).click();
  await page.getByTestId(`member-confirm-${email}`).click();
  await page.getByTestId(`member-row-${email}`).waitFor({ state: 'detached' });

  await page.getByTestId('sign-out').click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(errors).toEqual([]);
  await page.close();
});

test('the workspace switcher changes the role shown, and the choice survives a reload', async () => {
  const second = { slug: 'harbor-pumps', name: 'Harbor Pump Controls' };
  await server.db('workspaces').insert(second);
  const ws = await server.db('workspaces').where({ slug: second.slug }).first();
  const engineer = await server.db('users').where({ email: 'engineer@example.com' }).first();
  await server.db('memberships').insert({ workspace_id: ws.id, user_id: engineer.id, role: 'viewer' });

  const { page, errors } = await browser.newPage(VIEWPORTS.wide);
  await page.goto(`${server.baseUrl}/sign-in`);
  await fillSignIn(page, 'engineer@example.com', DEMO_PASSWORD);
  await page.getByTestId('workspace-switcher').click();
  await page.getByTestId(`workspace-option-${DEMO_WORKSPACE.slug}`).click();
  await signedInAs(page, 'engineer');

  await page.getByTestId('workspace-switcher').click();
  await page.getByTestId(`workspace-option-${second.slug}`).click();
  await signedInAs(page, 'viewer');
  expect(await page.getByTestId('workspace-switcher').innerText()).toContain(second.name);

  // the member list follows the workspace: only the engineer belongs to the second one
  await page.getByTestId('nav-members').click();
  await page.getByTestId('member-row-engineer@example.com').waitFor();
  expect(await page.getByTestId('member-row-owner@example.com').count()).toBe(0);

  await page.reload();
  await signedInAs(page, 'viewer');
  expect(await page.getByTestId('workspace-switcher').innerText()).toContain(second.name);

  await page.getByTestId('workspace-switcher').click();
  await page.getByTestId(`workspace-option-${DEMO_WORKSPACE.slug}`).click();
  await signedInAs(page, 'engineer');
  await page.getByTestId('member-row-owner@example.com').waitFor();
  await page.getByTestId('sign-out').click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(errors).toEqual([]);
  await page.close();
});

test('the cautions are reachable from the shell at both widths; an owner can edit roles on a phone', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  await page.goto(`${server.baseUrl}/sign-in?next=%2Fmembers`);
  await fillSignIn(page, 'owner@example.com', DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname === '/members');
  await signedInAs(page, 'owner');
  await page.getByTestId('member-role-viewer@example.com-viewer').waitFor();
  expect(await page.getByTestId('member-role-viewer@example.com-viewer').getAttribute('aria-checked')).toBe('true');
  await screenshot(page, 'members-owner-390');

  await page.getByTestId('account-menu').click();
  await page.getByTestId('account-about').click();
  await page.waitForURL((url) => url.pathname === '/about');
  await page.getByTestId('account-panel').waitFor({ state: 'hidden' });
  const cautions = await page.getByTestId('cautions').innerText();
  expect(cautions).toMatch(/current and travel limits/);
  expect(cautions).toMatch(/not certified for safety-related use/);
  expect(cautions).toMatch(/functional-safety standard/);
  await screenshot(page, 'about-390');

  // crossing the wide breakpoint swaps the frame but keeps the page mounted (a remount
  // would lose its state, and Expo Router would fall back to the overview)
  await page.getByTestId('about-screen').evaluate((el) => el.setAttribute('data-kept', 'yes'));
  await page.setViewportSize(VIEWPORTS.wide);
  await page.getByTestId('side-nav').waitFor();
  expect(await page.getByTestId('about-screen').getAttribute('data-kept')).toBe('yes');
  expect(new URL(page.url()).pathname).toBe('/about');
  expect(await visible(page, 'cautions')).toBe(true);
  expect(await visible(page, 'bottom-nav')).toBe(false);
  await page.getByTestId('nav-overview').click();
  await page.waitForURL((url) => url.pathname === '/');
  await page.getByTestId('nav-about').click();
  await page.waitForURL((url) => url.pathname === '/about');
  await page.getByTestId('cautions').waitFor();
  await page.getByTestId('sign-out').click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(errors).toEqual([]);
  await page.close();
});

test('a member replaces their password from the account screen; the new one signs in', async () => {
  const { page, errors } = await browser.newPage(VIEWPORTS.phone);
  await page.goto(`${server.baseUrl}/sign-in`);
  await fillSignIn(page, 'viewer@example.com', DEMO_PASSWORD);
  await signedInAs(page, 'viewer');
  await page.goto(`${server.baseUrl}/about`);
  await page.getByTestId('password-current').fill('not-my-password');
  await page.getByTestId('password-new').fill('short');
  await page.getByTestId('password-submit').click();
  // the shared schema refuses the short one before any request
  expect(await page.getByTestId('password-new-error').innerText()).toMatch(/12 characters/);
  await page.getByTestId('password-new').fill('a-much-longer-password');
  await page.getByTestId('password-submit').click();
  await page.getByTestId('password-current-error').waitFor();
  expect(await page.getByTestId('password-current-error').innerText()).toMatch(/not your current password/);
  await page.getByTestId('password-current').fill(DEMO_PASSWORD);
  await page.getByTestId('password-submit').click();
  await page.getByTestId('password-done').waitFor();
  await page.getByTestId('account-menu').click();
  await page.getByTestId('sign-out').click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
  await fillSignIn(page, 'viewer@example.com', 'a-much-longer-password');
  await signedInAs(page, 'viewer');
  expect(errors).toEqual([]);
  await page.close();
});
