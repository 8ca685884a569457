import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { field, launchBrowser, screenshot, signInThroughPage, type Browser } from '../support/browser.js';

let browser: Browser;
let folder: string;
beforeEach(async () => {
  browser = await launchBrowser();
  folder = mkdtempSync(join(tmpdir(), 'statorline-intake-e2e-'));
});
afterEach(async () => {
  await browser.close();
  rmSync(folder, { recursive: true, force: true });
});

/**
 * A walk-down survey of a few invented motors for the demo dairy, as a plant engineer types it: a
 * title row above the headers, units in the cells, kW and hp mixed, one row with a bad power.
 */
function surveyWorkbook(path: string): void {
  const rows: (string | number)[][] = [
    ['Walk-down survey, boiler house and CIP — March'],
    ['Tag', 'Description', 'Area', 'Application', 'Rated power', 'Speed', 'Voltage', 'Eff. class', 'PF', 'Hours/yr', 'Control'],
    ['WD-F-301', 'Boiler forced-draught fan', 'Boiler house', 'fan', '7.5 kW', '1460 rpm', '400 V', 'IE2', 0.83, 6500, 'outlet damper'],
    ['WD-P-302', 'CIP supply pump', 'CIP', 'pump', '10 hp', '2900 rpm', '400 V', 'IE3', 0.86, '4000', 'throttling valve'],
    ['WD-P-303', 'CIP return pump', 'CIP', 'pump', '5,5 kW', 2880, 400, 'IE1', 0.84, 4000, 'VFD'],
    ['WD-C-304', 'Condensate conveyor', 'Boiler house', 'conveyor', 'large', 1450, 400, 'unknown', 0.8, 3000, 'DOL'],
  ];
  const workbook = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(rows), 'Survey');
  writeFileSync(path, XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx' }) as Buffer);
}

describe('intake', () => {
  it('an engineer imports a survey spreadsheet, commits it, and finds a motor in the register', async () => {
    const { page } = browser;
    const file = join(folder, 'walk-down-survey.xlsx');
    surveyWorkbook(file);

    await signInThroughPage(page, 'engineer@kestrel.example');
    await page.getByTestId('nav-intake').click();
    await page.getByTestId('intake-site').click();
    await page.getByRole('option', { name: 'Kestrel Valley Dairy' }).click();
    await page.locator('[data-testid="intake-file"] input[type=file], input[type=file][data-testid="intake-file"]').first().setInputFiles(file);
    await page.getByTestId('intake-upload').click();

    // Step 2: the suggested mapping lists every header of the file.
    const mapping = page.getByTestId('intake-mapping');
    await mapping.waitFor();
    for (const header of ['Tag', 'Rated power', 'Eff. class', 'Hours/yr', 'Control']) expect(await mapping.innerText()).toContain(header);
    expect(page.url()).toMatch(/[?&]batch=\d+/);
    await page.getByTestId('intake-apply-mapping').click();

    // Step 3: four rows, three valid; the bad power is named with its value.
    const preview = page.getByTestId('intake-preview');
    await preview.waitFor();
    expect(await page.getByTestId('intake-count-total').innerText()).toContain('4');
    expect(await page.getByTestId('intake-count-valid').innerText()).toContain('3');
    expect(await page.getByTestId('intake-count-invalid').innerText()).toContain('1');
    expect(await preview.innerText()).toContain('“large”');
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'intake-preview');

    // The page survives a reload: the batch is in the address.
    await page.reload();
    await page.getByTestId('intake-preview').waitFor();

    await page.getByTestId('intake-commit').click();
    await page.getByTestId('intake-result').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('intake-result-created').innerText()).toBe('3');
    expect(await page.getByTestId('intake-result-skipped').innerText()).toBe('1');
    expect(await page.getByTestId('intake-batches').innerText()).toContain('walk-down-survey.xlsx');

    // The register finds the motor by its tag; 10 hp arrived as 7.457 kW.
    await page.getByTestId('nav-motors').click();
    await page.getByTestId('motors-table').locator('tbody tr').first().waitFor();
    await field(page, 'motors-search').fill('WD-P-302');
    const row = page.getByTestId('motors-table').locator('tbody tr', { hasText: 'WD-P-302' });
    await row.waitFor();
    await expect.poll(async () => page.getByTestId('motors-table').locator('tbody tr').count()).toBe(1);
    expect(await row.innerText()).toContain('7.5 kW');
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'motor-register');

    await row.locator('td').nth(2).click();
    await page.getByTestId('motor-detail-tag').waitFor();
    expect(await page.getByTestId('motor-detail-tag').innerText()).toContain('WD-P-302');
    const nameplate = await page.getByTestId('motor-detail-nameplate').innerText();
    expect(nameplate).toContain('2,900 rpm');
    expect(nameplate).toContain('IE3');
    expect(await page.getByTestId('motor-history').innerText()).toContain('Added by an import');
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'motor-detail');

    expect(browser.problems.filter((problem) => /Content Security Policy|Refused to/.test(problem))).toEqual([]);
  });

  it('a viewer sees the register but neither Intake nor “New motor”', async () => {
    const { page } = browser;
    await signInThroughPage(page, 'viewer@kestrel.example');
    await page.getByTestId('nav-motors').click();
    await page.getByTestId('motors-table').locator('tbody tr').first().waitFor();
    expect(await page.getByTestId('nav-intake').count()).toBe(0);
    expect(await page.getByTestId('motors-new').count()).toBe(0);
  });
});
