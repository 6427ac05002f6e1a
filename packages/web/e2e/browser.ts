/**
 * Debian's Chromium driven by playwright-core, with the flags this closed network needs
 * and a fresh profile each launch. `npm test` sets BASE_URL to the server it started.
 */
import { mkdirSync, mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from 'playwright-core';
import type { Browser, BrowserContext, Page } from 'playwright-core';

export const baseUrl = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:4420';
export const screenshotDir = process.env.SCREENSHOT_DIR ?? path.resolve('test-output/screenshots');

export interface Session {
  browser: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

/** Launches Chromium headless with a new empty profile and opens one page. */
export async function openBrowser(): Promise<Session> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'rolloff-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return { browser: context, page, close: () => context.close() };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshotDir, { recursive: true });
  const file = path.join(screenshotDir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

export type { Browser };
