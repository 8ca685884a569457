import { existsSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { assess, type AssessResult } from '../../calc/assess/assess.js';
import { assessInputSchema, type AssessInput } from '../../calc/assess/schema.js';
import { baseUrl, field, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

let browser: Browser;
beforeEach(async () => {
  browser = await launchBrowser({ width: 1280, height: 900 });
});
afterEach(async (context) => {
  // A failing run keeps a picture of where it stood.
  if (context.task.result?.state === 'fail') await screenshot(browser.page, `failed-${context.task.name.slice(0, 40).replace(/\W+/g, '-')}`).catch(() => {});
  await browser.close();
});

/** GET an API path with the page's session. */
async function apiGet<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (url) => (await fetch(url, { headers: { Accept: 'application/json' } })).json(), path) as Promise<T>;
}

/** Every option row on the page equals calc's figures for the same input (the cells carry calc's numbers). */
async function expectTableEquals(page: Page, expected: AssessResult): Promise<void> {
  const table = page.getByTestId('study-options-table');
  await table.waitFor();
  const codes = await table.locator('tbody tr').evaluateAll((rows) => rows.map((row) => row.getAttribute('data-code')));
  expect(codes).toEqual(expected.options.map((option) => option.code));
  const shown = await table.locator('tbody tr').evaluateAll((rows) =>
    rows.map((row) =>
      Object.fromEntries([...row.querySelectorAll('td[data-field]')].map((cell) => [cell.getAttribute('data-field'), cell.getAttribute('data-value')])),
    ),
  );
  const fields = ['annualKwh', 'savingsKwh', 'savingsCost', 'co2SavedKg', 'lineCurrentA', 'kva', 'capex', 'simplePaybackYears', 'discountedPaybackYears', 'npv', 'irr'] as const;
  expected.options.forEach((option, index) => {
    for (const name of fields) {
      const value = option[name];
      expect(shown[index]![name], `${option.code}.${name}`).toBe(value === null ? '' : String(value));
    }
  });
  expect(await page.getByTestId('study-recommended').getAttribute('data-code')).toBe(expected.recommended.code);
  expect(await page.getByTestId('study-recommended').innerText()).toContain(expected.recommended.reason);
}

/** Each chart draws its series (ApexCharts renders one `.apexcharts-series` group per series). */
async function expectChartSeries(page: Page, testId: string, count: number): Promise<void> {
  const series = page.getByTestId(testId).locator('.apexcharts-series');
  await expect.poll(() => series.count(), { timeout: 30_000 }).toBe(count);
  // A drawn line or bar path in each series.
  const paths = await series.evaluateAll((groups) => groups.map((group) => group.querySelectorAll('path').length));
  for (const drawn of paths) expect(drawn).toBeGreaterThan(0);
}

describe('Quick study', () => {
  it('an engineer opens a demo fan with an outlet damper: the page shows calc’s figures, draws its charts, and saves the study', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    const motors = await apiGet<{ items: { id: number; tag: string }[] }>(page, '/api/motors?application=fan&controlMethod=outlet-damper&pageSize=5');
    expect(motors.items.length).toBeGreaterThan(0);
    const motor = motors.items[0]!;

    const preview = page.waitForResponse((response) => response.url().includes(`/api/studies/from-motor/${motor.id}`));
    await page.goto(`${baseUrl()}/quick-study?motorId=${motor.id}`);
    const body = (await (await preview).json()) as { input: AssessInput };
    const input = assessInputSchema.parse(body.input);
    expect(input.motor.controlMethod).toBe('outlet-damper');
    const expected = assess(input.motor, input.site, input.priceBook, input.assumptions);

    await expect.poll(() => page.getByTestId('study-source').innerText(), { timeout: 30_000 }).toContain(motor.tag);
    await expectTableEquals(page, expected);
    expect(await page.getByTestId('study-assumptions').innerText()).toContain(expected.assumptions[0]!.what);
    expect(await page.getByTestId('study-cautions').innerText()).toContain('permanent-magnet rotor is hazardous');

    // Efficiency and input power: one series per motor option family; cost: energy and demand; cash flow: the chosen options.
    await page.getByTestId('study-chart-cost').scrollIntoViewIfNeeded();
    await expectChartSeries(page, 'study-chart-efficiency', 6);
    await expectChartSeries(page, 'study-chart-input-power', 6);
    await expectChartSeries(page, 'study-chart-cost', 2);
    const nonKeep = expected.options.filter((option) => option.code !== 'keep').length;
    await expectChartSeries(page, 'study-chart-cashflow', Math.min(3, nonKeep));
    expect(await page.getByTestId('study-chart-cashflow').locator('.apexcharts-point-annotations circle, .apexcharts-point-annotations path').count()).toBeGreaterThan(0);

    // Save: the server recomputes and stores; the page then shows the stored result, equal to the live one.
    const saved = page.waitForResponse((response) => response.url().endsWith('/api/studies') && response.request().method() === 'POST');
    await page.getByTestId('study-save').click();
    await field(page, 'study-name').fill(`E2E ${motor.tag}`);
    await page.getByTestId('study-save-confirm').click();
    const stored = (await (await saved).json()) as AssessResult & { id: number };
    expect(stored.options).toEqual(expected.options);
    await page.waitForURL(/studyId=\d+/);
    await expect.poll(() => page.getByTestId('study-stored-check').innerText(), { timeout: 30_000 }).toContain('equals the live computation');
    await expectTableEquals(page, expected);
    expect(await page.getByTestId('study-saved-list').innerText()).toContain(`E2E ${motor.tag}`);

    const path = await screenshot(page, 'quick-study-register-fan');
    expect(existsSync(path)).toBe(true);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  }, 240_000);

  it('an engineer enters a fan from scratch and the figures follow calc live', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    const settings = await apiGet<{ priceBook: { stored: AssessInput['priceBook'] | null }; assumptions: { stored: AssessInput['assumptions'] | null } }>(page, '/api/settings');
    await page.goto(`${baseUrl()}/quick-study`);
    await field(page, 'study-input-ratedPowerKw').waitFor();
    await field(page, 'study-input-ratedPowerKw').fill('15');
    await field(page, 'study-input-hoursPerYear').fill('7000');

    // The blank study's own defaults (a 4-pole IE1 fan on an outlet damper, flat tariff) plus what was typed.
    const input = assessInputSchema.parse({
      motor: { ratedPowerKw: 15, poles: 4, efficiencyClass: 'IE1', rewinds: 0, application: 'fan', controlMethod: 'outlet-damper', hoursPerYear: 7000, loadFactor: 0.75 },
      site: { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, demandChargePerKwMonth: 0, currency: 'EUR', co2KgPerKwh: 0.4 },
      ...(settings.priceBook.stored ? { priceBook: settings.priceBook.stored } : {}),
      ...(settings.assumptions.stored ? { assumptions: settings.assumptions.stored } : {}),
    });
    const expected = assess(input.motor, input.site, input.priceBook, input.assumptions);
    await expect.poll(async () => page.getByTestId('study-options-table').locator('tr[data-code="keep"] td[data-field="annualKwh"]').getAttribute('data-value'), { timeout: 30_000 }).toBe(String(expected.baseline.annualKwh));
    await expectTableEquals(page, expected);
    await screenshot(page, 'quick-study-scratch');
  }, 240_000);
});
