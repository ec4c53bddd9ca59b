/** Debian's Chromium driven by playwright-core, launched as STACK.md prescribes. */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The two widths the shell is laid out for: a phone first, and a desktop with the side navigation. */
export const VIEWPORTS = {
  phone: { width: 390, height: 844 },
  wide: { width: 1440, height: 900 },
} as const;
/** For `describe.each`: every test at both widths, labelled. */
export const AT_BOTH_WIDTHS = [['phone', VIEWPORTS.phone], ['wide', VIEWPORTS.wide]] as const;

export const SCREENSHOT_DIR = path.resolve(__dirname, '..', '..', '.test-data', 'screenshots');

export interface TestBrowser {
  context: BrowserContext;
  /** a fresh page at this viewport; uncaught page errors are collected in `errors` */
  newPage(viewport: { width: number; height: number }): Promise<{ page: Page; errors: string[] }>;
  close(): Promise<void>;
}

export async function launchBrowser(): Promise<TestBrowser> {
  if (!fs.existsSync(CHROMIUM_PATH)) {
    throw new Error(`${CHROMIUM_PATH} is missing: apt-get install -y chromium`);
  }
  const userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'sw-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
  });
  context.setDefaultTimeout(15_000);
  return {
    context,
    async newPage(viewport) {
      const page = await context.newPage();
      await page.setViewportSize(viewport);
      const errors: string[] = [];
      page.on('pageerror', (error) => errors.push(error.message));
      return { page, errors };
    },
    async close() {
      await context.close();
      fs.rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}

/** Saves a full-page PNG under .test-data/screenshots/ (git-ignored) and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * The usual frame of a browser test file: the real app on a fresh demo-seeded database and
 * one Chromium, started before the file's tests, signed out before each, stopped after.
 */
export function useAppInBrowser(): {
  readonly server: { baseUrl: string; db: import('../../server/db/knex').Db; stop(): Promise<void> };
  readonly browser: TestBrowser;
  /** signs in through the sign-in screen and waits for the shell */
  signIn(page: Page, email: string, password?: string): Promise<void>;
  /** waits until the element's text matches (up to 10 s) */
  expectText(page: Page, testId: string, re: RegExp): Promise<void>;
  /** signs in and opens the editor on a new design (the lead form showing) */
  openNewDesign(page: Page, email: string): Promise<void>;
} {
  let server: Awaited<ReturnType<typeof import('./test-server').startTestServer>> | undefined;
  let browser: TestBrowser | undefined;
  beforeAll(async () => {
    const { startTestServer } = await import('./test-server');
    server = await startTestServer();
    browser = await launchBrowser();
  });
  beforeEach(async () => {
    await browser?.context.clearCookies();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  return {
    get server() {
      return server!;
    },
    get browser() {
      return browser!;
    },
    async signIn(page, email, password) {
      const { DEMO_PASSWORD } = await import('../../server/seed');
      await page.goto(`${server!.baseUrl}/sign-in`);
      await page.getByTestId('signin-email').fill(email);
      await page.getByTestId('signin-password').fill(password ?? DEMO_PASSWORD);
      await page.getByTestId('signin-submit').click();
      await page.getByTestId('current-role').waitFor();
    },
    async expectText(page, testId, re) {
      const deadline = Date.now() + 10_000;
      let last = '';
      while (Date.now() < deadline) {
        last = await page.getByTestId(testId).innerText();
        if (re.test(last)) return;
        await page.waitForTimeout(100);
      }
      throw new Error(`${testId} never matched ${re}: "${last}"`);
    },
    async openNewDesign(page, email) {
      await this.signIn(page, email);
      await page.goto(`${server!.baseUrl}/designs`);
      await page.getByTestId('design-new').click();
      await page.getByTestId('lead-gain').waitFor();
    },
  };
}
