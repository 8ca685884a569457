/**
 * Debian's chromium driven by playwright-core (never a browser download), with the flags that work
 * on these machines and a fresh profile per launch.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';
import { projectRoot } from '../../server/lib/config.js';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const SCREENSHOT_DIR = join(projectRoot, '.artifacts/screenshots');
export const DEMO_PASSWORD = 'statorline-demo';

export interface Browser {
  context: BrowserContext;
  page: Page;
  /** Console errors and CSP violations seen so far. */
  problems: string[];
  close(): Promise<void>;
}

export async function launchBrowser(viewport = { width: 1280, height: 800 }): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'statorline-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const problems: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') problems.push(message.text());
  });
  page.on('pageerror', (error) => problems.push(error.message));
  return {
    context,
    page,
    problems,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export function baseUrl(): string {
  return inject('baseUrl');
}

/** The native input of a Quasar field, whether the test id sits on the input or on its wrapper. */
export function field(page: Page, testId: string) {
  return page.locator(`input[data-testid="${testId}"], [data-testid="${testId}"] input, textarea[data-testid="${testId}"]`).first();
}

export async function signInThroughPage(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl()}/`);
  await field(page, 'signin-email').fill(email);
  await field(page, 'signin-password').fill(password);
  await page.getByTestId('signin-submit').click();
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const path = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}
