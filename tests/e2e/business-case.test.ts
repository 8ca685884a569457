/**
 * End to end in chromium: an engineer generates the dairy site's business case, reads it (figures
 * and every chart's series), downloads its exports and sends it to the approvers; the Outbox shows
 * the e-mail with its PDF; the approver approves it with a comment and the status says so.
 */
import { existsSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, field, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => browser.close());

/** Where the generated case lives (`/cases/:id`), shared by the steps below. */
let caseUrl = '';

async function signOut(page: Page): Promise<void> {
  await page.getByTestId('user-menu').click();
  await page.getByTestId('menu-sign-out').click();
  await page.getByTestId('signin-email').waitFor();
}

const CHARTS = ['case-chart-tornado', 'case-chart-cashflow', 'case-chart-by-site', 'case-chart-by-application', 'case-chart-by-option', 'case-chart-energy'];

describe('business case: generate, view, send, approve', () => {
  it('an engineer generates the dairy site’s case and reads its figures and charts', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    await page.getByTestId('nav-cases').click();
    await page.getByTestId('cases-table').waitFor();
    await page.getByTestId('cases-new').click();
    await page.getByTestId('case-new-scope').click();
    await page.locator('[data-testid^="case-new-scope-option-"]', { hasText: 'Dairy' }).first().click();
    await page.getByTestId('case-generate').click();
    await page.getByTestId('case-headline-energy').waitFor({ timeout: 120_000 });
    caseUrl = page.url();
    expect(caseUrl).toMatch(/\/cases\/\d+$/);

    expect(await page.getByTestId('case-title').innerText()).toContain('Dairy');
    expect(await page.getByTestId('case-status').innerText()).toContain('Draft');
    expect(await page.getByTestId('case-headline-energy').innerText()).toMatch(/MWh\/yr → .*MWh\/yr/);
    expect(await page.getByTestId('case-headline-cost').innerText()).toMatch(/€[\d,]+/);
    expect(await page.getByTestId('case-headline-payback').innerText()).toMatch(/\d+\.\d yr/);
    expect(await page.getByTestId('case-headline-npv').innerText()).toMatch(/€[\d,]+/);
    expect(await page.getByTestId('case-sites-table').innerText()).toContain('Dairy');
    expect(await page.getByTestId('case-items-table').locator('tbody tr').count()).toBeGreaterThan(0);
    for (const chart of CHARTS) {
      // ApexCharts draws one <g class="apexcharts-series"> per series once the lazy chunk has loaded.
      await expect
        .poll(async () => page.locator(`[data-testid="${chart}"] .apexcharts-series`).count(), { timeout: 20_000 })
        .toBeGreaterThan(0);
    }
    expect(await page.locator('[data-testid="case-chart-tornado"] .apexcharts-series').count()).toBe(2);
    expect(await page.locator('[data-testid="case-chart-cashflow"] .apexcharts-series').count()).toBe(2);
    await page.waitForTimeout(500);
    expect(existsSync(await screenshot(page, 'business-case-report'))).toBe(true);
  });

  it('downloads the .xlsx and the PDF', async () => {
    const { page } = browser;
    for (const [testId, ending] of [
      ['case-export-xlsx', '.xlsx'],
      ['case-export-pdf', '.pdf'],
    ] as const) {
      const download = page.waitForEvent('download');
      await page.getByTestId(testId).click();
      expect((await download).suggestedFilename()).toMatch(new RegExp(`\\${ending}$`));
    }
  });

  it('sends it to the approvers; the Outbox shows the e-mail with its PDF', async () => {
    const { page } = browser;
    await page.getByTestId('case-send').click();
    await field(page, 'case-send-to').fill('finance@kestrel.example');
    await page.getByTestId('case-send-submit').click();
    await expect.poll(async () => page.getByTestId('case-status').innerText(), { timeout: 30_000 }).toContain('Awaiting decision');
    expect(await page.getByTestId('case-sends').innerText()).toContain('finance@kestrel.example');

    await page.getByTestId('nav-outbox').click();
    await page.getByTestId('outbox-table').waitFor();
    const row = page.locator('[data-testid="outbox-table"] tbody tr', { hasText: 'Dairy' }).first();
    await row.waitFor({ timeout: 20_000 });
    await row.click();
    await page.getByTestId('outbox-message').waitFor();
    const attachment = page.locator('[data-testid^="outbox-attachment-"]').first();
    expect(await attachment.innerText()).toMatch(/\.pdf/);
    expect(await page.getByTestId('outbox-message').innerText()).toContain('approver@kestrel.example');
    expect(existsSync(await screenshot(page, 'business-case-outbox'))).toBe(true);
  });

  it('the approver approves it with a comment, and the status shows approved', async () => {
    const { page } = browser;
    await signOut(page);
    await field(page, 'signin-email').fill('approver@kestrel.example');
    await field(page, 'signin-password').fill('statorline-demo');
    await page.getByTestId('signin-submit').click();
    await page.getByTestId('overview-total-motors').waitFor();
    await page.goto(caseUrl);
    await page.getByTestId('case-approve').click();
    // The comment is required: submitting without one records nothing.
    await page.getByTestId('case-decision-submit').click();
    await expect.poll(async () => page.locator('.q-dialog').innerText()).toContain('A comment is required');
    await field(page, 'case-decision-comment').fill('Approved for the spring shutdown; order the pumps first.');
    await page.getByTestId('case-decision-submit').click();
    await expect.poll(async () => page.getByTestId('case-status').innerText(), { timeout: 30_000 }).toContain('Approved');
    expect(await page.getByTestId('case-decision').innerText()).toMatch(/by .+ on /);
    expect(await page.getByTestId('case-decision-comment-shown').innerText()).toContain('spring shutdown');
    expect(await page.getByTestId('case-approve').count()).toBe(0);
    expect(existsSync(await screenshot(page, 'business-case-approved'))).toBe(true);

    // The Overview lists it among the latest cases, approved.
    await page.getByTestId('nav-overview').click();
    await page.getByTestId('overview-latest-cases').waitFor();
    expect(await page.getByTestId('overview-latest-cases').innerText()).toContain('Approved');
    await page.getByTestId('overview-pipeline').waitFor();
    expect(existsSync(await screenshot(page, 'business-case-overview'))).toBe(true);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  });
});
