import { existsSync } from 'node:fs';
import type { Page } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import { sumMoney } from '../../calc/economics/money.js';
import { startJobs, stopJobs } from '../../server/jobs/index.js';
import { connectDatabase } from '../../server/lib/database.js';
import type { JobOutput, ScreeningResult } from '../../server/shared/screening.js';
import { baseUrl, field, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

// The e2e server runs no job runner; this process plays a second app instance that takes the
// screening job from the shared PostgreSQL queue (as DESIGN.md's several instances would).
let sequelize: Sequelize;
beforeAll(async () => {
  sequelize = connectDatabase(inject('e2eDatabaseUrl'), { poolMax: 4 });
  await startJobs({ pollMs: 300 });
});
afterAll(async () => {
  await stopJobs();
  await sequelize.close();
});

let browser: Browser;
beforeEach(async () => {
  browser = await launchBrowser({ width: 1280, height: 900 });
});
afterEach(async () => browser.close());

async function apiGet<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (url) => (await fetch(url, { headers: { Accept: 'application/json' } })).json(), path) as Promise<T>;
}

describe('Site screening', () => {
  it('an engineer screens the dairy under a budget, watches the progress reach 100 %, reads the totals and creates proposals', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('overview-total-motors').waitFor();
    const sites = await apiGet<{ items: { id: number; name: string }[] }>(page, '/api/sites');
    const dairy = sites.items.find((site) => site.name.includes('Dairy'))!;
    expect(dairy).toBeDefined();

    await page.goto(`${baseUrl()}/screening?siteId=${dairy.id}`);
    await field(page, 'screening-budget').fill('20000');
    await page.getByTestId('screening-start').click();
    await page.getByTestId('screening-progress').waitFor();
    await page.waitForURL(/jobId=\d+/);
    const jobId = Number(new URL(page.url()).searchParams.get('jobId'));
    await expect.poll(() => page.getByTestId('screening-progress-value').innerText(), { timeout: 120_000 }).toBe('100 %');
    await page.getByTestId('screening-totals').waitFor();

    const job = await apiGet<JobOutput>(page, `/api/jobs/${jobId}`);
    expect(job.status).toBe('done');
    const result = job.result as ScreeningResult;
    expect(result.budget).toBe(20000);
    const selected = result.rows.filter((row) => row.selected);
    expect(selected.length).toBeGreaterThan(0);
    expect(sumMoney(selected.map((row) => row.capex))).toBeLessThanOrEqual(20000);
    // The page's totals are those of the budget's selection, as the server added them.
    const total = async (key: string) => Number(await page.getByTestId(`screening-total-${key}`).getAttribute('data-value'));
    expect(await total('capex')).toBe(result.totals.capex);
    expect(await total('npv')).toBe(result.totals.npv);
    expect(await total('cost')).toBe(result.totals.costSaved);
    expect(await total('energy')).toBeCloseTo(result.totals.annualKwhSaved, 0);
    expect(await page.getByTestId('screening-table').locator('td[data-selected="yes"]').count()).toBe(Math.min(selected.length, 25));

    // A reload keeps the job (its id is in the URL).
    await page.reload();
    await page.getByTestId('screening-totals').waitFor();
    expect(await total('capex')).toBe(result.totals.capex);

    const proposals = page.waitForResponse((response) => response.url().endsWith(`/api/screenings/${jobId}/proposals`));
    await page.getByTestId('screening-propose').click();
    const answer = await proposals;
    expect(answer.status()).toBe(201);
    const created = (await answer.json()) as { created: number; alreadyProposed: number };
    expect(created.created + created.alreadyProposed).toBe(selected.filter((row) => row.optionCode !== null).length);
    await expect.poll(() => page.locator('.q-notification').innerText(), { timeout: 20_000 }).toContain('retrofit proposal');

    const path = await screenshot(page, 'screening-dairy-budget');
    expect(existsSync(path)).toBe(true);
    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  }, 240_000);
});
