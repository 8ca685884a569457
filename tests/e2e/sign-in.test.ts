import { existsSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

let browser: Browser;
beforeEach(async () => {
  browser = await launchBrowser();
});
afterEach(async () => browser.close());

const DEMO_ROLES = ['admin', 'engineer', 'approver', 'viewer'] as const;

describe('signing in', () => {
  it.each(DEMO_ROLES)('the demo %s signs in and sees the Overview with real counts', async (role) => {
    const { page } = browser;
    await signInThroughPage(page, `${role}@kestrel.example`);
    await page.getByTestId('overview-total-motors').waitFor();
    expect(await page.getByTestId('overview-total-sites').innerText()).toContain('3');
    const motors = Number((await page.getByTestId('overview-total-motors').innerText()).replace(/\D/g, ''));
    expect(motors).toBeGreaterThanOrEqual(140);
    expect(await page.locator('header').innerText()).toContain('Kestrel Valley Foods');
    // Team is an admin's screen only.
    expect(await page.getByTestId('nav-team').count()).toBe(role === 'admin' ? 1 : 0);
    const path = await screenshot(page, `overview-${role}`);
    expect(existsSync(path)).toBe(true);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  });

  it('shows a clear message for a wrong password', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'viewer@kestrel.example', 'not the password');
    await expect.poll(async () => page.locator('body').innerText()).toContain('The e-mail or the password is wrong.');
  });

  it('sends an anonymous visitor of a deep link to sign-in', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/sites`);
    await page.getByTestId('signin-email').waitFor();
    expect(page.url()).toContain('/sign-in');
  });
});
