import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { sizeBldc, type BldcInput } from '../../calc/bldc/index.js';
import { baseUrl, field, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

let browser: Browser;
beforeEach(async () => {
  browser = await launchBrowser({ width: 1280, height: 900 });
});
afterEach(async () => browser.close());

interface MotorRow {
  id: number;
  tag: string;
  ratedPowerKw: number;
  poles: number;
  frame: string | null;
}

/** An 11 kW 4-pole motor of the demo register (the API answers with the session's cookie). */
async function demoMotor(page: Page): Promise<MotorRow> {
  const response = await page.request.get(`${baseUrl()}/api/motors?minKw=11&maxKw=11&pageSize=200`);
  expect(response.ok()).toBe(true);
  const { items } = (await response.json()) as { items: MotorRow[] };
  const motor = items.find((m) => m.ratedPowerKw === 11 && m.poles === 4 && m.frame) ?? items.find((m) => m.ratedPowerKw === 11 && m.poles === 4);
  expect(motor, 'the demo register has an 11 kW 4-pole motor').toBeDefined();
  return motor as MotorRow;
}

async function valueOf(page: Page, key: string): Promise<number> {
  return Number(await page.getByTestId(`bldc-value-${key}`).getAttribute('data-value'));
}

/** Relative difference (the page keeps calc's doubles unrounded in data-value). */
const close = (actual: number, expected: number) => Math.abs(actual - expected) <= 1e-9 * Math.max(1, Math.abs(expected));

describe('BLDC sizing', () => {
  it('an engineer sizes a BLDC for an 11 kW 4-pole motor: figures equal calc, drawing, charts, simulation, sweep, use', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    const motor = await demoMotor(page);

    await page.goto(`${baseUrl()}/bldc-sizing?motorId=${motor.id}`);
    await expect.poll(() => field(page, 'bldc-input-ratedPowerKw').inputValue(), { timeout: 30_000 }).toBe('11');
    expect(await page.getByTestId('bldc-subtitle').innerText()).toContain(motor.tag);
    await page.getByTestId('bldc-design').click();
    await page.getByTestId('bldc-shown-badge').filter({ hasText: 'Saved design #' }).waitFor({ timeout: 60_000 });
    const designId = Number(new URL(page.url()).searchParams.get('designId'));
    expect(designId).toBeGreaterThan(0);

    // The same input as the server stored it (with its IE4 floor) through calc in this process.
    const stored = (await (await page.request.get(`${baseUrl()}/api/designs/${designId}`)).json()) as { input: BldcInput; motorId: number | null };
    expect(stored.motorId).toBe(motor.id);
    expect(stored.input).toMatchObject({ ratedPowerKw: 11, supplyType: 'ac' });
    const expected = sizeBldc(stored.input);
    expect(expected.feasible).toBe(true);
    expect(await page.getByTestId('bldc-feasibility-verdict').innerText()).toBe('Feasible design');
    expect(await page.getByTestId('bldc-feasibility-limiting').innerText()).toContain(expected.limitingConstraint);
    const figures: Array<[string, number | undefined]> = [
      ['statorOuterDiameterMm', expected.geometry?.statorOuterDiameterMm],
      ['stackLengthMm', expected.geometry?.stackLengthMm],
      ['magnetThicknessMm', expected.geometry?.magnetThicknessMm],
      ['turnsPerPhase', expected.turnsPerPhase],
      ['parallelPaths', expected.parallelPaths],
      ['phaseResistanceOhm', expected.phaseResistanceOhm],
      ['copperW', expected.losses?.copperW],
      ['ironW', expected.losses?.ironW],
      ['magnetW', expected.losses?.magnetW],
      ['mechanicalW', expected.losses?.mechanicalW],
      ['driveW', expected.losses?.driveW],
      ['efficiencyPct', expected.efficiencyPct],
      ['systemEfficiencyPct', expected.systemEfficiencyPct],
      ['massCopperKg', expected.massKg?.copper],
      ['massMagnetKg', expected.massKg?.magnet],
      ['massTotalKg', expected.massKg?.total],
      ['powerDensityKwPerKg', expected.powerDensityKwPerKg],
      ['torquePerRotorVolumeKnmPerM3', expected.torquePerRotorVolumeKnmPerM3],
      ['activeMaterialCost', expected.activeMaterialCost],
      ['demagnetisationMarginPct', expected.demagnetisationMarginPct],
    ];
    for (const [key, value] of figures) {
      expect(value, key).toBeDefined();
      const shown = await valueOf(page, key);
      expect(close(shown, value as number), `${key}: page ${shown}, calc ${value}`).toBe(true);
    }
    const fmt = (value: number, digits: number) => new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits }).format(value);
    expect(await page.getByTestId('bldc-key-system-efficiency').innerText()).toBe(`${fmt(expected.systemEfficiencyPct as number, 2)} %`);
    expect(await page.getByTestId('bldc-key-slots-poles').innerText()).toBe(`${expected.slots} / ${expected.poles}`);
    expect(await page.getByTestId('bldc-winding-factor').innerText()).toBe(fmt(expected.windingFactor as number, 4));

    // The drawing: one slot per stator slot, 2p magnets; the winding: one row per coil side.
    expect(await page.locator('[data-testid="bldc-cross-section"] [data-slot]').count()).toBe(expected.slots);
    expect(await page.locator('[data-testid="bldc-cross-section"] [data-magnet]').count()).toBe(expected.poles);
    expect(await page.getByTestId('bldc-winding-row').count()).toBe(expected.winding?.sides.length);
    await screenshot(page, 'bldc-sizing-design');

    // Charts: each renders its series.
    await page.getByTestId('bldc-tab-performance').click();
    const seriesIn = (testid: string) => page.locator(`[data-testid="${testid}"] .apexcharts-series`);
    await expect.poll(() => seriesIn('bldc-chart-airgap').count(), { timeout: 30_000 }).toBe(1 + 4);
    await expect.poll(() => seriesIn('bldc-chart-efficiency').count(), { timeout: 20_000 }).toBe(2);
    await expect.poll(() => page.locator('[data-testid="bldc-efficiency-map"] .apexcharts-heatmap-series, [data-testid="bldc-efficiency-map"] .apexcharts-heatmap .apexcharts-series').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(16);
    expect(await page.locator('[data-testid="bldc-chart-airgap"]').innerText()).toContain('Line A–B');
    await screenshot(page, 'bldc-sizing-performance');

    // The start-up simulation runs to completion in the browser's worker, with progress.
    await page.getByTestId('bldc-tab-startup').click();
    await field(page, 'bldc-sim-duration').fill('0.6');
    await page.getByTestId('bldc-simulate').click();
    await page.getByTestId('bldc-simulation-progress').waitFor({ timeout: 20_000 });
    await page.getByTestId('bldc-chart-simulation').waitFor({ timeout: 120_000 });
    await expect.poll(() => seriesIn('bldc-chart-simulation').count(), { timeout: 20_000 }).toBe(1 + 3 + 2);
    const finalSpeed = Number((await page.getByTestId('bldc-sim-final-speed').innerText()).replace(/[^\d.]/g, ''));
    const setSpeed = Number(await field(page, 'bldc-sim-set-speed').inputValue());
    expect(Math.abs(finalSpeed - setSpeed) / setSpeed).toBeLessThan(0.02);
    await screenshot(page, 'bldc-sizing-startup');

    // A second run can be cancelled.
    await field(page, 'bldc-sim-duration').fill('5');
    await page.getByTestId('bldc-simulate').click();
    await page.getByTestId('bldc-simulation-progress').waitFor();
    await page.getByTestId('bldc-simulate-cancel').click();
    await page.getByTestId('bldc-simulation-cancelled').waitFor({ timeout: 10_000 });

    // A sweep of the air-gap flux density: a row per value and a series per chosen figure.
    await page.getByTestId('bldc-tab-sweep').click();
    await page.getByTestId('bldc-sweep-run').click();
    await expect.poll(() => page.getByTestId('bldc-sweep-row').count(), { timeout: 60_000 }).toBe(9);
    await expect.poll(() => seriesIn('bldc-chart-sweep').count(), { timeout: 20_000 }).toBe(3);
    await screenshot(page, 'bldc-sizing-sweep');

    // Use this design for the motor.
    await page.getByTestId('bldc-use-design').click();
    await page.getByTestId('bldc-use-design-done').waitFor();
    expect(await page.getByTestId('bldc-use-design-done').innerText()).toContain(motor.tag);
    const linked = (await (await page.request.get(`${baseUrl()}/api/designs/${designId}`)).json()) as { linkedMotorIds: number[] };
    expect(linked.linkedMotorIds).toContain(motor.id);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  });

  it('a viewer opens a stored design read-only', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    const created = await page.request.post(`${baseUrl()}/api/designs`, {
      headers: { 'x-csrf-token': ((await (await page.request.get(`${baseUrl()}/api/auth/csrf`)).json()) as { token: string }).token },
      data: { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 18, poles: 12, name: 'Viewer check' },
    });
    expect(created.status()).toBe(201);
    const { id } = (await created.json()) as { id: number };
    await page.context().clearCookies();

    await signInThroughPage(page, 'viewer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    await page.goto(`${baseUrl()}/bldc-sizing?designId=${id}`);
    await page.getByTestId('bldc-shown-badge').filter({ hasText: `Saved design #${id}` }).waitFor();
    expect(await page.getByTestId('bldc-design').count()).toBe(0);
    expect(await page.getByTestId('bldc-use-design').count()).toBe(0);
    expect(await page.locator('[data-testid="bldc-cross-section"] [data-slot]').count()).toBe(18);
    await screenshot(page, 'bldc-sizing-viewer');
  });
});
