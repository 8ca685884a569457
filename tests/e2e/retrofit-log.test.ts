/**
 * End to end in chromium: an engineer proposes a retrofit from a motor's page, the approver approves
 * it, the engineer records the order, uploads a broken and then a good baseline meter file, records
 * the installation (nameplate, installer, a photo), uploads the reporting period, reads the realised
 * savings on the retrofit and on the Overview, and confirms them as verified. The demo seeds five
 * retrofits, none on a wastewater pump of 7.5–45 kW, so the test makes its own on one of those.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { projectRoot } from '../../server/lib/config.js';
import { baseUrl, field, launchBrowser, signInThroughPage, type Browser } from '../support/browser.js';

const SHOTS = join(projectRoot, '.artifacts/retrofit-log');
const TABLET = { width: 800, height: 1100 };
const DESKTOP = { width: 1280, height: 800 };

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser(DESKTOP);
  mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => browser.close());

/** Full-page screenshots at 1280 px and at a tablet width, into .artifacts/retrofit-log/. */
async function shoot(page: Page, name: string): Promise<void> {
  await page.waitForTimeout(600);
  await page.screenshot({ path: join(SHOTS, `e2e-${name}-1280.png`), fullPage: true });
  await page.setViewportSize(TABLET);
  await page.waitForTimeout(600);
  await page.screenshot({ path: join(SHOTS, `e2e-${name}-tablet.png`), fullPage: true });
  await page.setViewportSize(DESKTOP);
  expect(existsSync(join(SHOTS, `e2e-${name}-tablet.png`))).toBe(true);
}

async function signOut(page: Page): Promise<void> {
  await page.getByTestId('user-menu').click();
  await page.getByTestId('menu-sign-out').click();
  await page.getByTestId('signin-email').waitFor();
}

async function signInAs(page: Page, email: string): Promise<void> {
  await signInThroughPage(page, email);
  await page.getByTestId('overview-total-motors').waitFor();
}

/** The file input of a QFile, whether the test id sits on the input or on its wrapper. */
const fileInput = (page: Page, testId: string) => page.locator(`input[type=file][data-testid="${testId}"], [data-testid="${testId}"] input[type=file]`).first();

const DAY_MS = 86_400_000;
const pad = (value: number) => String(value).padStart(2, '0');
const isoDay = (ms: number) => {
  const date = new Date(ms);
  return `${date.getUTCFullYear()}-${pad(date.getUTCMonth() + 1)}-${pad(date.getUTCDate())}`;
};
/** Midnight (UTC) of `days` days before today. */
const daysAgo = (days: number) => Date.parse(`${isoDay(Date.now())}T00:00:00Z`) - days * DAY_MS;

/**
 * Hourly mean power, semicolon-separated with decimal commas (as a European meter exports it): on
 * each day the motor runs `runHours[d]` hours from midnight at about `runningKw` (a small, repeatable
 * ripple, so the daily regression is not perfect), then stands at 0.1 kW.
 */
function meterCsv(firstDayMs: number, runHours: number[], runningKw: number): string {
  const lines = ['timestamp;Power [kW]'];
  runHours.forEach((hours, day) => {
    for (let hour = 0; hour < 24; hour += 1) {
      const date = new Date(firstDayMs + (day * 24 + hour) * 3_600_000);
      const stamp = `${isoDay(date.getTime())} ${pad(date.getUTCHours())}:00`;
      const kw = hour < hours ? runningKw * (1 + 0.02 * Math.sin(day * 24 + hour)) : 0.1;
      lines.push(`${stamp};${kw.toFixed(3).replace('.', ',')}`);
    }
  });
  return lines.join('\n');
}

const BASELINE_HOURS = [20, 22, 18, 24, 16, 20, 21, 19, 23, 17, 20, 22, 18, 21];
const REPORTING_HOURS = [21, 19, 23, 20, 18, 22, 20, 24, 17, 21, 19, 20, 22, 18];
// A 1×1 PNG: the server recognises images from their bytes.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

interface MotorRow {
  id: number;
  tag: string;
  ratedPowerKw: number;
  hoursPerYear: number | null;
  application: string;
  siteName: string;
}

let retrofitUrl = '';
let motor: MotorRow;

describe('Retrofit log: propose, approve, order, install, meter, verify', () => {
  it('an engineer proposes a retrofit from a motor’s page', async () => {
    const { page } = browser;
    await signInAs(page, 'engineer@kestrel.example');
    // A wastewater pump without any retrofit yet (other e2e files may have made some elsewhere).
    motor = await page.evaluate(async () => {
      const motors = (await (await fetch('/api/motors?pageSize=500&sort=tag')).json()).items as MotorRow[];
      for (const candidate of motors.filter((row) => /Wastewater/.test(row.siteName) && row.application === 'pump' && row.ratedPowerKw >= 7.5 && row.ratedPowerKw <= 45)) {
        const existing = (await (await fetch(`/api/retrofits?motorId=${candidate.id}`)).json()).items as unknown[];
        if (existing.length === 0) return candidate;
      }
      throw new Error('no wastewater pump without a retrofit');
    });
    await page.goto(`${baseUrl()}/motors/${motor.id}`);
    await page.getByTestId('motor-retrofits').waitFor();
    expect(await page.getByTestId('motor-retrofits').innerText()).toContain('No retrofit of this motor yet');
    await page.getByTestId('motor-propose').click();
    await page.getByTestId('motor-propose-options').waitFor({ timeout: 30_000 });
    // A new IE4 motor: no drive, no magnets.
    await page.getByTestId('motor-propose-option-ie4').click();
    expect(await page.getByTestId('motor-propose-option-ie4').innerText()).toMatch(/[\d,]+ kWh\/yr/);
    expect(await page.getByTestId('retrofit-cautions').innerText()).toContain('local codes');
    await field(page, 'motor-propose-comment').fill('Old IE1 lift pump running most of the year.');
    await page.getByTestId('motor-propose-submit').click();
    await page.waitForURL(/\/retrofits\/\d+$/);
    retrofitUrl = page.url();
    await page.getByTestId('retrofit-title').waitFor();
    expect(await page.getByTestId('retrofit-title').innerText()).toContain(`${motor.tag} · New IE4 motor`);
    expect(await page.getByTestId('retrofit-status').innerText()).toBe('Proposed');
    expect(await page.getByTestId('retrofit-waiting').innerText()).toContain('An approver of the organisation approves or rejects it');
    expect(await page.getByTestId('retrofit-transition-approved').count()).toBe(0);
  });

  it('the approver approves it', async () => {
    const { page } = browser;
    await signOut(page);
    await signInAs(page, 'approver@kestrel.example');
    await page.goto(retrofitUrl);
    await page.getByTestId('retrofit-transition-approved').click();
    await field(page, 'retrofit-comment').fill('Approved for the next shutdown.');
    await page.getByTestId('retrofit-transition-confirm').click();
    await expect.poll(() => page.getByTestId('retrofit-status').innerText(), { timeout: 20_000 }).toBe('Approved');
    expect(await page.getByTestId('retrofit-history').innerText()).toContain('Approved for the next shutdown.');
    // An approver records no field work.
    expect(await page.getByTestId('retrofit-transition-ordered').count()).toBe(0);
  });

  it('the engineer records the order and loads the baseline, after a refused file that names its bad rows', async () => {
    const { page } = browser;
    await signOut(page);
    await signInAs(page, 'engineer@kestrel.example');
    await page.goto(retrofitUrl);
    await page.getByTestId('retrofit-transition-ordered').click();
    await field(page, 'retrofit-order-date').fill(isoDay(daysAgo(50)));
    await field(page, 'retrofit-due-date').fill(isoDay(daysAgo(15)));
    await page.getByTestId('retrofit-transition-confirm').click();
    await expect.poll(() => page.getByTestId('retrofit-status').innerText(), { timeout: 20_000 }).toBe('Ordered');
    expect(await page.getByTestId('retrofit-step-ordered').getAttribute('data-state')).toBe('current');
    // Its installation was due 15 days ago: flagged overdue, here and in the list.
    expect(await page.getByTestId('retrofit-overdue-banner').innerText()).toContain(`installation was due on ${isoDay(daysAgo(15))}`);

    const broken = ['timestamp,Power [kW]', '2026-10-01 00:00,12.1', '2026-10-01 00:00,12.2', '01/10/2026 02:00,12.0', '2026-10-01 03:00,abc'].join('\n');
    await fileInput(page, 'retrofit-meter-baseline-file').setInputFiles({ name: 'broken.csv', mimeType: 'text/csv', buffer: Buffer.from(broken) });
    await page.getByTestId('retrofit-meter-baseline-preview').waitFor();
    await page.getByTestId('retrofit-meter-baseline-upload').click();
    const errors = page.getByTestId('retrofit-meter-baseline-errors');
    await errors.waitFor();
    expect(await errors.innerText()).toContain('Nothing was saved');
    const rows = await errors.locator('tbody tr').allInnerTexts();
    // Every bad row with its line in the file (the header is row 1), whatever order the parser found them in.
    expect(rows).toHaveLength(3);
    expect(rows.some((row) => /^3\s+timestamp.*duplicated timestamp/.test(row))).toBe(true);
    expect(rows.some((row) => /^4\s+timestamp.*day\/month order/.test(row))).toBe(true);
    expect(rows.some((row) => /^5\s+value\s+abc/.test(row))).toBe(true);
    await page.getByTestId('retrofit-meter').screenshot({ path: join(SHOTS, 'e2e-meter-refused-1280.png') });

    const baseline = meterCsv(daysAgo(45), BASELINE_HOURS, motor.ratedPowerKw * 0.8);
    await fileInput(page, 'retrofit-meter-baseline-file').setInputFiles({ name: 'pump-before.csv', mimeType: 'text/csv', buffer: Buffer.from(baseline) });
    await page.getByTestId('retrofit-meter-baseline-preview').waitFor();
    expect(await page.getByTestId('retrofit-meter-baseline-preview').innerText()).toContain('336 readings');
    await page.getByTestId('retrofit-meter-baseline-upload').click();
    await page.getByTestId('retrofit-meter-baseline-stored').waitFor();
    expect(await page.getByTestId('retrofit-meter-baseline-stored').innerText()).toContain('336 every 60 min');
    expect(await page.getByTestId('retrofit-meter-reporting').innerText()).toContain('record it first');
  });

  it('the engineer records the installation with the nameplate, the installer and a photo', async () => {
    const { page } = browser;
    await page.getByTestId('retrofit-transition-installed').click();
    await page.getByTestId('retrofit-transition-dialog').waitFor();
    expect(await page.getByTestId('retrofit-transition-dialog').innerText()).toContain('Installation is electrical work');
    await field(page, 'retrofit-installation-date').fill(isoDay(daysAgo(20)));
    await field(page, 'retrofit-installed-by').fill('Ridgeway Electrical');
    await field(page, 'retrofit-motor-type').fill('IE4 induction');
    await field(page, 'retrofit-motor-kw').fill(String(motor.ratedPowerKw));
    await field(page, 'retrofit-motor-efficiency').fill('194.5');
    await page.getByTestId('retrofit-transition-confirm').click();
    await expect.poll(() => page.getByTestId('retrofit-transition-dialog').innerText()).toContain('Motor efficiency must be at most 100 %');
    await field(page, 'retrofit-motor-efficiency').fill('94.5');
    await fileInput(page, 'retrofit-installation-files').setInputFiles({ name: 'nameplate.png', mimeType: 'image/png', buffer: PNG });
    await page.screenshot({ path: join(SHOTS, 'e2e-installation-dialog-1280.png') });
    await page.getByTestId('retrofit-transition-confirm').click();
    await expect.poll(() => page.getByTestId('retrofit-status').innerText(), { timeout: 20_000 }).toBe('Installed');
    await page.locator('[data-testid^="retrofit-photo-"]').first().waitFor({ timeout: 20_000 });
    expect(await page.getByTestId('retrofit-installed-by-shown').innerText()).toBe('Ridgeway Electrical');
    expect(await page.getByTestId('retrofit-new-motor').innerText()).toContain('IE4 induction');
    expect(await page.getByTestId('retrofit-new-motor').innerText()).toContain('94.5 %');
    expect(await page.getByTestId('retrofit-installed-on').innerText()).not.toBe('—');
  });

  it('uploads the reporting period and reads the realised savings against the prediction', async () => {
    const { page } = browser;
    const retrofitId = Number(retrofitUrl.split('/').pop());
    const stored = await page.evaluate(async (id) => (await fetch(`/api/retrofits/${id}`)).json(), retrofitId);
    const predicted = stored.predictedSavingsKwh as number;
    const hours = (stored.motor.hoursPerYear as number | null) ?? 8000;
    // Running power after the retrofit so that about 90 % of the predicted savings are realised.
    const runningAfter = motor.ratedPowerKw * 0.8 - (0.9 * predicted) / hours;
    const reporting = meterCsv(daysAgo(14), REPORTING_HOURS, runningAfter);
    await fileInput(page, 'retrofit-meter-reporting-file').setInputFiles({ name: 'pump-after.csv', mimeType: 'text/csv', buffer: Buffer.from(reporting) });
    await page.getByTestId('retrofit-meter-reporting-preview').waitFor();
    await page.getByTestId('retrofit-meter-reporting-upload').click();
    await page.getByTestId('retrofit-meter-reporting-stored').waitFor();
    await page.getByTestId('retrofit-verified-kwh').waitFor({ timeout: 20_000 });

    const verification = await page.evaluate(async (id) => (await fetch(`/api/retrofits/${id}/verification`)).json(), retrofitId);
    expect(verification.ready).toBe(true);
    expect(verification.method).toBe('B');
    expect(verification.realisedPct).toBeGreaterThan(80);
    expect(verification.realisedPct).toBeLessThan(100);
    const kwh = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 }).format(verification.annualSavingsKwh);
    expect(await page.getByTestId('retrofit-verified-kwh').innerText()).toBe(`${kwh} kWh/yr`);
    expect(await page.getByTestId('retrofit-realised').innerText()).toBe(`${Math.round(verification.realisedPct)} %`);
    expect(await page.getByTestId('retrofit-uncertainty').innerText()).toMatch(/^± [\d,]+ kWh\/yr at 90 % confidence$/);
    await expect
      .poll(async () => page.locator('[data-testid="retrofit-realised-chart"] .apexcharts-series').count(), { timeout: 20_000 })
      .toBeGreaterThan(0);
    await expect
      .poll(async () => page.locator('[data-testid="retrofit-meter-chart"] .apexcharts-series').count(), { timeout: 20_000 })
      .toBe(2);
    await shoot(page, 'detail-installed');
  });

  it('sees the realised savings on the Overview, then confirms them as verified', async () => {
    const { page } = browser;
    await page.getByTestId('nav-overview').click();
    await page.getByTestId('overview-realised-table').waitFor({ timeout: 20_000 });
    const summary = await page.evaluate(async () => (await fetch('/api/retrofits/verification-summary')).json());
    expect(summary.organization.verifiable).toBeGreaterThanOrEqual(1);
    expect(await page.getByTestId('overview-realised-pct').innerText()).toBe(`${Math.round(summary.organization.realisedPct)} %`);
    expect(await page.getByTestId('overview-realised-table').innerText()).toContain(motor.siteName);
    await shoot(page, 'overview');

    await page.goto(retrofitUrl);
    await page.getByTestId('retrofit-transition-verified').click();
    expect(await page.getByTestId('retrofit-verify-figures').innerText()).toContain('realised');
    await page.getByTestId('retrofit-transition-confirm').click();
    await expect.poll(() => page.getByTestId('retrofit-status').innerText(), { timeout: 20_000 }).toBe('Verified');
    expect(await page.getByTestId('retrofit-step-verified').getAttribute('data-state')).toBe('done');
    // Closed: no more uploads; the meter data are frozen.
    expect(await page.getByTestId('retrofit-meter-reporting').innerText()).toContain('frozen');
    await shoot(page, 'detail-verified');

    await page.getByTestId('nav-retrofits').click();
    await page.getByTestId('retrofits-table').waitFor();
    const row = page.locator('[data-testid="retrofits-table"] tbody tr', { hasText: motor.tag });
    expect(await row.innerText()).toContain('Verified');
    expect(await row.innerText()).toMatch(/[\d,]+ kWh\/yr/);
    await shoot(page, 'list');
    await page.getByTestId('retrofits-view').getByText('Board').click();
    await page.getByTestId('retrofits-board-verified').waitFor();
    expect(await page.getByTestId('retrofits-board-verified').innerText()).toContain(motor.tag);
    await shoot(page, 'board');

    await page.getByTestId('nav-overview').click();
    await page.getByTestId('overview-verified').waitFor();
    const overview = await page.evaluate(async () => (await fetch('/api/overview')).json());
    expect(overview.figures.verified.retrofits).toBeGreaterThanOrEqual(1);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  });
});
