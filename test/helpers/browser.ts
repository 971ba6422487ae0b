import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/**
 * Headless Chromium for end-to-end tests: the machine's Debian package (never
 * a downloaded browser), a fresh profile per launch.
 */

export const CHROMIUM_PATH = '/usr/bin/chromium';

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export interface TestBrowser {
  context: BrowserContext;
  /** A new tab that records console errors and uncaught page errors. */
  newPage(): Promise<{ page: Page; errors: string[] }>;
  close(): Promise<void>;
}

export interface LaunchOptions {
  viewport?: { width: number; height: number };
  /** The browser's time zone (IANA name); the system's when unset. */
  timezoneId?: string;
}

export async function launchChromium(options: LaunchOptions = {}): Promise<TestBrowser> {
  if (!existsSync(CHROMIUM_PATH)) throw new Error('Chromium is missing: run `apt-get install -y chromium`');
  const userDataDir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-chromium-'));
  let context: BrowserContext;
  try {
    context = await chromium.launchPersistentContext(userDataDir, {
      executablePath: CHROMIUM_PATH,
      args: CHROMIUM_ARGS,
      headless: true,
      viewport: options.viewport ?? { width: 1280, height: 800 },
      timezoneId: options.timezoneId,
      locale: 'en-GB',
    });
  } catch (error) {
    rmSync(userDataDir, { recursive: true, force: true });
    throw error;
  }
  return {
    context,
    async newPage() {
      const page = await context.newPage();
      const errors: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error') errors.push(`console: ${m.text()}`);
      });
      page.on('pageerror', (e) => errors.push(`page error: ${e.message}`));
      return { page, errors };
    },
    async close() {
      await context.close().catch(() => {});
      rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}
