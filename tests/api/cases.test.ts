import { inflateSync } from 'node:zlib';
import { Decimal } from 'decimal.js';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { assess } from '../../calc/assess/assess.js';
import type { MotorInput, SiteInput } from '../../calc/assess/schema.js';
import { internalRateOfReturn, netPresentValue } from '../../calc/economics/cash-flows.js';
import { scaleEnergyPrice, scaleOperatingHours } from '../../server/cases/sensitivity.js';
import { Motor, OutboxAttachment, Retrofit, type Organization, type Site, type User } from '../../server/models/index.js';
import type { CaseOutput } from '../../server/shared/case.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, waitForMail, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;
let site: Site;
let engineer: User;
let approver: User;

/** The motors of the test site, as the test itself hands them to calc (independently of the server). */
const MOTORS = [
  { tag: 'AHU-F-01', area: 'Boiler house', application: 'fan', ratedPowerKw: 22, poles: 4, efficiencyClass: 'IE1', controlMethod: 'outlet-damper', hoursPerYear: 7000, loadFactor: 0.8 },
  { tag: 'CW-P-02', area: 'Boiler house', application: 'pump', ratedPowerKw: 37, poles: 2, efficiencyClass: 'IE2', controlMethod: 'throttle-valve', hoursPerYear: 8000, loadFactor: 0.75 },
  { tag: 'CV-03', area: 'Packing', application: 'conveyor', ratedPowerKw: 5.5, poles: 4, efficiencyClass: 'unknown', controlMethod: 'direct-on-line', hoursPerYear: 6000, loadFactor: 0.6 },
  { tag: 'MX-04', area: 'Packing', application: 'mixer', ratedPowerKw: 15, poles: 6, efficiencyClass: 'IE3', controlMethod: 'direct-on-line', hoursPerYear: 1500, loadFactor: 0.5 },
  { tag: 'AC-05', area: null, application: 'compressor', ratedPowerKw: 75, poles: 2, efficiencyClass: 'IE2', controlMethod: 'direct-on-line', hoursPerYear: 8200, loadFactor: 0.85 },
] as const;

/** Site of createSite in tests/support/api.ts, as calc's input. */
const SITE_INPUT: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, demandChargePerKwMonth: 5, currency: 'EUR', co2KgPerKwh: 0.25, defaultHoursPerYear: 6000 };

async function createMotors(target: Organization, targetSite: Site) {
  const motors: Motor[] = [];
  for (const motor of MOTORS) {
    motors.push(
      await Motor.create({
        ...motor,
        organizationId: target.id,
        siteId: targetSite.id,
        voltageV: 400,
        frequencyHz: 50,
        description: null,
        speedRpm: null,
        ratedCurrentA: null,
        nameplateEfficiencyPct: null,
        powerFactor: null,
        frame: null,
        enclosure: null,
        manufacturer: null,
        yearInstalled: null,
        dutyProfile: null,
      } as never),
    );
  }
  return motors;
}

function independentAssessment() {
  return MOTORS.map((motor) => {
    const input: MotorInput = { tag: motor.tag, application: motor.application, ratedPowerKw: motor.ratedPowerKw, poles: motor.poles, voltageV: 400, frequencyHz: 50, efficiencyClass: motor.efficiencyClass, controlMethod: motor.controlMethod, hoursPerYear: motor.hoursPerYear, loadFactor: motor.loadFactor, rewinds: 0 };
    if (motor.area) input.area = motor.area;
    const result = assess(input, SITE_INPUT);
    return { input, result, option: result.options.find((option) => option.code === result.recommended.code)! };
  });
}

const money = (values: number[]) => values.reduce((sum, value) => sum.plus(value), new Decimal(0)).toDecimalPlaces(2).toNumber();

/**
 * Text of a PDF made by pdfkit: its content streams are Flate-compressed and its embedded (subset)
 * fonts write glyph ids, so the streams are inflated with zlib and each font's ToUnicode map turns
 * the ids back into characters. Returns the text of each page.
 */
function pdfPages(pdf: Buffer): string[] {
  const source = pdf.toString('latin1');
  const objects = new Map<number, { dict: string; stream: Buffer | null }>();
  const objectPattern = /(\d+) 0 obj\s*([\s\S]*?)endobj/g;
  for (let match = objectPattern.exec(source); match; match = objectPattern.exec(source)) {
    const body = match[2]!;
    const streamAt = body.indexOf('stream');
    if (streamAt < 0) {
      objects.set(Number(match[1]), { dict: body, stream: null });
      continue;
    }
    const dict = body.slice(0, streamAt);
    let data = body.slice(streamAt + 6).replace(/^\r?\n/, '');
    data = data.slice(0, data.lastIndexOf('endstream'));
    const raw = Buffer.from(data, 'latin1');
    let stream: Buffer = raw;
    if (dict.includes('/FlateDecode')) {
      try {
        stream = inflateSync(raw);
      } catch {
        stream = raw;
      }
    }
    objects.set(Number(match[1]), { dict, stream });
  }
  const ref = (dict: string, key: string) => Number(new RegExp(`/${key} (\\d+) 0 R`).exec(dict)?.[1]);
  const cmapCache = new Map<number, Map<number, string>>();
  function cmapOfFont(fontId: number): Map<number, string> {
    if (cmapCache.has(fontId)) return cmapCache.get(fontId)!;
    const map = new Map<number, string>();
    const toUnicode = objects.get(ref(objects.get(fontId)?.dict ?? '', 'ToUnicode'))?.stream?.toString('latin1') ?? '';
    const hex = (h: string) => parseInt(h, 16);
    // Multi-character entries (ligatures) are written with spaces: <0066 0069>.
    const chars = (h: string) => String.fromCharCode(...(h.replace(/\s+/g, '').match(/.{4}/g) ?? []).map(hex));
    for (const block of toUnicode.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
      for (const line of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(\[[^\]]*\]|<[0-9a-fA-F]+>)/g)) {
        const start = hex(line[1]!);
        const end = hex(line[2]!);
        if (line[3]!.startsWith('[')) [...line[3]!.matchAll(/<([0-9a-fA-F ]+)>/g)].forEach((entry, index) => map.set(start + index, chars(entry[1]!)));
        else for (let code = start, base = hex(line[3]!.slice(1, -1)); code <= end; code += 1) map.set(code, String.fromCharCode(base + code - start));
      }
    }
    for (const block of toUnicode.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
      for (const line of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>/g)) map.set(hex(line[1]!), chars(line[2]!));
    }
    cmapCache.set(fontId, map);
    return map;
  }
  const pages = [...objects.values()].filter((object) => /\/Type\s*\/Page\b/.test(object.dict));
  // Pages in document order: follow the /Kids of the page tree.
  const root = [...objects.values()].find((object) => /\/Type\s*\/Pages\b/.test(object.dict) && !/\/Parent/.test(object.dict));
  const kids = [...(root?.dict.match(/\/Kids\s*\[([^\]]*)\]/)?.[1]?.matchAll(/(\d+) 0 R/g) ?? [])].map((m) => objects.get(Number(m[1]))!);
  return (kids.length === pages.length ? kids : pages).map((page) => {
    const resources = objects.get(ref(page.dict, 'Resources'))?.dict ?? page.dict;
    const fontDict = /\/Font\s*<<([\s\S]*?)>>/.exec(resources)?.[1] ?? objects.get(ref(resources, 'Font'))?.dict ?? '';
    const fonts = new Map([...fontDict.matchAll(/\/(\w+) (\d+) 0 R/g)].map((m) => [m[1]!, Number(m[2])]));
    const content = objects.get(ref(page.dict, 'Contents'))?.stream?.toString('latin1') ?? '';
    let text = '';
    let cmap = new Map<number, string>();
    for (const token of content.matchAll(/\/(\w+) [\d.]+ Tf|\[([^\]]*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj|(ET)/g)) {
      if (token[1]) cmap = cmapOfFont(fonts.get(token[1]) ?? -1);
      const hexes = token[2] !== undefined ? [...token[2].matchAll(/<([0-9a-fA-F]*)>/g)].map((m) => m[1]!) : token[3] !== undefined ? [token[3]] : [];
      for (const h of hexes) for (const code of h.match(/.{4}/g) ?? []) text += cmap.get(parseInt(code, 16)) ?? '';
      if (token[4]) text += ' ';
    }
    return text.replace(/\s+/g, ' ');
  });
}

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
  site = await createSite(organization, { name: 'Dairy north' });
  await createMotors(organization, site);
  engineer = await createUser(organization, 'engineer');
  approver = await createUser(organization, 'approver');
});
afterAll(async () => context.close());

async function generate(user: User = engineer, body: object = { siteId: site.id }): Promise<CaseOutput> {
  const session = await signIn(context.app, user);
  const response = await session.post('/api/cases').send(body);
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as CaseOutput;
}

describe('business cases', () => {
  it('totals equal the sum of the motor results, assessed independently by calc', async () => {
    const snapshot = await generate();
    const { totals, items } = snapshot.results;
    const expected = independentAssessment();
    const recommended = expected.filter((entry) => entry.option.code !== 'keep');
    expect(items).toHaveLength(MOTORS.length);
    expect(totals.motors).toBe(MOTORS.length);
    expect(totals.recommendedMotors).toBe(recommended.length);
    expect(recommended.length).toBeGreaterThan(0);
    for (const entry of expected) {
      const item = items.find((candidate) => candidate.tag === entry.input.tag)!;
      expect(item.optionCode).toBe(entry.option.code);
      expect(item.baselineKwh).toBe(entry.result.baseline.annualKwh);
      expect(item.afterKwh).toBe(entry.option.annualKwh);
      // gross − rebate reproduces calc's net capex (server/cases/rebates.ts mirrors calc's rule).
      expect(Math.abs(item.grossCapex - item.rebates - item.capex)).toBeLessThanOrEqual(0.01);
    }
    const sum = (pick: (entry: (typeof expected)[number]) => number) => expected.reduce((total, entry) => total + pick(entry), 0);
    expect(totals.baselineKwh).toBeCloseTo(sum((e) => e.result.baseline.annualKwh), 1);
    expect(totals.savingsKwh).toBeCloseTo(recommended.reduce((t, e) => t + e.option.savingsKwh, 0), 1);
    expect(totals.afterKwh).toBeCloseTo(totals.baselineKwh - totals.savingsKwh, 1);
    expect(totals.co2SavedKg).toBeCloseTo(recommended.reduce((t, e) => t + e.option.co2SavedKg, 0), 1);
    expect(totals.kvaFreed).toBeCloseTo(recommended.reduce((t, e) => t + e.option.kvaReduction, 0), 3);
    expect(totals.savingsCost).toBe(money(recommended.map((e) => e.option.savingsCost)));
    expect(totals.capex).toBe(money(recommended.map((e) => e.option.capex)));
    expect(totals.baselineCost).toBe(money(expected.map((e) => e.result.baseline.annualCost)));
    expect(totals.lifeCycleCost).toBe(money(recommended.map((e) => e.option.lifeCycleCost)));
    // NPV is additive: the aggregate cash flow's NPV equals the items' NPVs within rounding of cents.
    expect(Math.abs(totals.npv - money(recommended.map((e) => e.option.npv)))).toBeLessThan(0.05 * recommended.length * totals.analysisYears);
    // IRR is not additive: it is the rate that zeroes the NPV of the summed flows.
    const flows = snapshot.results.charts.cashFlow.map((year) => year.cashFlow);
    expect(flows[0]).toBe(-totals.capex);
    expect(totals.irr).toBeCloseTo(internalRateOfReturn(flows)!, 4);
    expect(Math.abs(netPresentValue(totals.irr!, flows))).toBeLessThan(totals.capex * 1e-3);
    expect(totals.simplePaybackYears).toBeCloseTo(totals.capex / totals.savingsCost, 2);
    // Per site and per area add up to the case.
    expect(snapshot.results.perSite).toHaveLength(1);
    expect(snapshot.results.perSite[0]!.savingsCost).toBe(totals.savingsCost);
    expect(money(snapshot.results.perArea.map((area) => area.savingsCost))).toBe(totals.savingsCost);
    expect(snapshot.results.perArea.map((area) => area.area).sort()).toEqual(['', 'Boiler house', 'Packing']);
    expect(snapshot.results.cautions.join(' ')).toContain('permanent-magnet rotor is hazardous');
    expect(snapshot.results.assumptions.some((a) => a.what.startsWith('discount rate'))).toBe(true);
    expect(snapshot).toMatchObject({ scope: 'site', siteId: site.id, status: 'draft', currency: 'EUR', createdBy: { id: engineer.id } });
  });

  it('sensitivity equals re-running assess with the scaled energy price and hours', async () => {
    const snapshot = await generate();
    const expected = independentAssessment().filter((entry) => entry.option.code !== 'keep');
    for (const factor of snapshot.results.sensitivity.factors) {
      for (const point of factor.points) {
        const scale = 1 + point.changePct / 100;
        const savings = expected.map((entry) => {
          const result =
            factor.factor === 'energyPrice'
              ? assess(entry.input, scaleEnergyPrice(SITE_INPUT, scale))
              : assess(scaleOperatingHours(entry.input, entry.result.motor.annualHours, scale), SITE_INPUT);
          return result.options.find((option) => option.code === entry.option.code)!.savingsCost;
        });
        expect(Math.abs(point.savingsCost - money(savings))).toBeLessThanOrEqual(0.01 * expected.length);
      }
      // More energy price or hours, shorter payback.
      expect(factor.high.simplePaybackYears!).toBeLessThan(factor.low.simplePaybackYears!);
    }
  });

  it('keeps a snapshot unchanged after its motor is edited, and counts versions per scope', async () => {
    const first = await generate();
    const motor = (await Motor.findOne({ where: { organizationId: organization.id, tag: 'AC-05' } }))!;
    await motor.update({ hoursPerYear: 2000, ratedPowerKw: 90 });
    const session = await signIn(context.app, engineer);
    const again = await session.get(`/api/cases/${first.id}`).expect(200);
    expect(again.body.results).toEqual(first.results);
    const second = await generate();
    expect(second.version).toBe(first.version + 1);
    expect(second.results.totals.baselineKwh).not.toBe(first.results.totals.baselineKwh);
    await motor.update({ hoursPerYear: 8200, ratedPowerKw: 75 });
    const all = await generate(engineer, { all: true });
    expect(all).toMatchObject({ scope: 'all', siteId: null, version: 1 });
    const list = await session.get(`/api/cases?siteId=${site.id}&sort=-version`).expect(200);
    expect(list.body.items[0]).toMatchObject({ id: second.id, version: second.version, status: 'draft', headline: { savingsCost: second.results.totals.savingsCost } });
  });

  it('names the field of invalid input', async () => {
    const session = await signIn(context.app, engineer);
    const neither = await session.post('/api/cases').send({});
    expect(neither.status).toBe(400);
    expect(neither.body.error.message).toBe('siteId: is required unless all is true');
    const both = await session.post('/api/cases').send({ siteId: site.id, all: true });
    expect(both.body.error.message).toBe('all: must be left out when siteId is given');
    const created = await generate();
    const format = await session.get(`/api/cases/${created.id}/export?format=doc`);
    expect(format.status).toBe(400);
    expect(format.body.error.message).toBe('format: must be xlsx or pdf');
    const approverSession = await signIn(context.app, approver);
    const reject = await approverSession.post(`/api/cases/${created.id}/decision`).send({ decision: 'rejected' });
    expect(reject.body.error.message).toBe('comment: is required to reject');
  });

  it('exports .xlsx whose figures read back as numbers equal to the snapshot', async () => {
    const snapshot = await generate();
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const response = await session.get(`/api/cases/${snapshot.id}/export?format=xlsx`).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(response.status).toBe(200);
    expect(response.headers['content-disposition']).toContain('business-case-dairy-north-v');
    const workbook = XLSX.read(response.body as Buffer, { type: 'buffer' });
    expect(workbook.SheetNames).toEqual(['Summary', 'Dairy north', 'Sensitivity', 'Cash flow', 'Assumptions']);
    const summary = XLSX.utils.sheet_to_json<unknown[]>(workbook.Sheets.Summary!, { header: 1 });
    const headerRow = summary.findIndex((row) => row[0] === 'Motors');
    const header = summary[headerRow] as string[];
    const values = summary[headerRow + 1]!;
    const cell = (name: string) => values[header.indexOf(name)];
    const totals = snapshot.results.totals;
    expect(cell('Savings [kWh/yr]')).toBe(totals.savingsKwh);
    expect(cell('Cost saved [EUR/yr]')).toBe(totals.savingsCost);
    expect(cell('Capex [EUR]')).toBe(totals.capex);
    expect(cell('NPV [EUR]')).toBe(totals.npv);
    expect(cell('Simple payback [yr]')).toBe(totals.simplePaybackYears);
    const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(workbook.Sheets['Dairy north']!);
    expect(rows).toHaveLength(MOTORS.length);
    for (const item of snapshot.results.items) {
      const row = rows.find((candidate) => candidate.Tag === item.tag)!;
      expect(row['Savings [kWh/yr]']).toBe(item.savingsKwh);
      expect(row['Cost saved [EUR/yr]']).toBe(item.savingsCost);
      expect(row['Capex [EUR]']).toBe(item.capex);
      expect(row['Line current freed [A]']).toBe(item.lineCurrentFreedA);
    }
    // Numbers are numeric cells, not text.
    const sheet = workbook.Sheets['Dairy north']!;
    expect(sheet.E2?.t).toBe('n');
    expect(money(rows.map((row) => row['Cost saved [EUR/yr]'] as number))).toBe(totals.savingsCost);
  });

  it('exports a PDF with the expected pages and text', async () => {
    const snapshot = await generate();
    const session = await signIn(context.app, engineer);
    const response = await session.get(`/api/cases/${snapshot.id}/export?format=pdf`).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('application/pdf');
    const pdf = response.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.toString('latin1')).toContain('OpenSans');
    const pages = pdfPages(pdf);
    // Text runs break at line-break opportunities (after '/', '-'): compare without white space.
    const flat = (text: string) => text.replace(/\s+/g, '');
    // Summary, charts, sites/areas/sensitivity, recommended list, assumptions and cautions.
    expect(pages).toHaveLength(5);
    expect(flat(pages[0]!)).toContain(flat(`Dairy north: business case, version ${snapshot.version}`));
    expect(flat(pages[0]!)).toContain(flat(`${snapshot.results.totals.savingsCost.toLocaleString('en-GB', { maximumFractionDigits: 0 })} EUR/yr`));
    expect(flat(pages[1]!)).toContain(flat('Cumulative cash flow [EUR]'));
    expect(flat(pages[2]!)).toContain(flat('Sensitivity of the simple payback'));
    expect(flat(pages[3]!)).toContain(flat('Recommended retrofits'));
    for (const item of snapshot.results.items.filter((i) => i.optionCode !== 'keep')) expect(flat(pages[3]!)).toContain(flat(item.tag));
    expect(flat(pages[4]!)).toContain(flat('Assumptions and their sources'));
    expect(flat(pages[4]!)).toContain(flat('A permanent-magnet rotor is hazardous to handle'));
    expect(flat(pages[4]!)).toContain(flat('page 5 of 5'));
  });

  it('e-mails the report with its PDF to the approvers and the given address, then records the approval', async () => {
    const snapshot = await generate();
    const proposedMotor = (await Motor.findOne({ where: { organizationId: organization.id, tag: snapshot.results.items.find((i) => i.optionCode !== 'keep')!.tag } }))!;
    const proposal = await Retrofit.create({ organizationId: organization.id, motorId: proposedMotor.id, optionCode: 'ie3', source: 'manual', jobId: null, predictedSavingsKwh: 1, predictedSavingsCost: 1, capex: 1, npv: 1, currency: 'EUR', createdBy: engineer.id });
    const session = await signIn(context.app, engineer);
    const draft = await session.get(`/api/cases/${snapshot.id}`).set('Accept-Encoding', 'gzip').expect(200);
    expect(draft.body.status).toBe('draft');
    const sent = await session.post(`/api/cases/${snapshot.id}/send`).send({ to: ['finance.officer@test.example'] });
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect(sent.body.case.status).toBe('sent');
    expect(sent.body.send.to).toEqual(expect.arrayContaining([approver.email.toLowerCase(), 'finance.officer@test.example']));
    const mail = await waitForMail((message) => message.subject === `For approval: Dairy north business case v${snapshot.version}`);
    expect(mail.toAddresses).toEqual(expect.arrayContaining(['finance.officer@test.example']));
    expect(mail.organizationId).toBe(organization.id);
    const attachments = await OutboxAttachment.findAll({ where: { messageId: mail.id } });
    expect(attachments).toHaveLength(1);
    expect(attachments[0]).toMatchObject({ filename: `business-case-dairy-north-v${snapshot.version}.pdf`, contentType: 'application/pdf' });
    expect(attachments[0]!.content.subarray(0, 5).toString()).toBe('%PDF-');

    const approverSession = await signIn(context.app, approver);
    const decided = await approverSession.post(`/api/cases/${snapshot.id}/decision`).send({ decision: 'approved', comment: 'Go ahead in the spring shutdown.' });
    expect(decided.status, JSON.stringify(decided.body)).toBe(200);
    const recommended = snapshot.results.items.filter((i) => i.optionCode !== 'keep');
    expect(decided.body.case).toMatchObject({ status: 'approved', decidedBy: { id: approver.id }, decisionComment: 'Go ahead in the spring shutdown.' });
    expect(decided.body.retrofits).toEqual({ created: recommended.length - 1, approved: 1, rejected: 0 });
    const retrofits = await Retrofit.findAll({ where: { organizationId: organization.id, status: 'approved' } });
    expect(retrofits.map((r) => r.motorId).sort()).toHaveLength(recommended.length);
    await proposal.reload();
    expect(proposal.status).toBe('approved');
    expect(proposal.optionCode).toBe(recommended.find((i) => i.motorId === proposedMotor.id)!.optionCode);
    expect(retrofits.filter((r) => r.source === 'case')).toHaveLength(recommended.length - 1);
    const notice = await waitForMail((message) => message.subject === `Approved: Dairy north business case v${snapshot.version}`);
    expect(notice.toAddresses).toEqual([engineer.email]);
    expect(notice.textBody).toContain('Go ahead in the spring shutdown.');
    const twice = await approverSession.post(`/api/cases/${snapshot.id}/decision`).send({ decision: 'rejected', comment: 'No.' });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('already-decided');

    // The report is gzipped for clients that accept it, and the kept copy follows the decision.
    const zipped = await approverSession.get(`/api/cases/${snapshot.id}`).set('Accept-Encoding', 'gzip').expect(200);
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body.status).toBe('approved');
    const plain = await approverSession.get(`/api/cases/${snapshot.id}`).set('Accept-Encoding', 'identity').expect(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(zipped.body).toEqual(plain.body);

    const overview = await approverSession.get('/api/overview').expect(200);
    const siteRow = overview.body.sites.find((s: { id: number }) => s.id === site.id);
    expect(siteRow.figures.approved.retrofits).toBe(recommended.length);
    expect(siteRow.figures.identified.source).toBe('case');
    expect(overview.body.figures.energyTodayKwh).toBeGreaterThan(0);
    expect(overview.body.latestCases[0].siteId === site.id || overview.body.latestCases[0].scope === 'all').toBe(true);
  });

  it('lets only approvers decide, only engineers and admins generate and send', async () => {
    const snapshot = await generate();
    for (const role of ['engineer', 'admin', 'viewer'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      const response = await session.post(`/api/cases/${snapshot.id}/decision`).send({ decision: 'approved', comment: '' });
      expect(response.status).toBe(403);
      await session.get(`/api/cases/${snapshot.id}`).expect(200);
    }
    for (const role of ['approver', 'viewer'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await session.post('/api/cases').send({ siteId: site.id })).status).toBe(403);
      expect((await session.post(`/api/cases/${snapshot.id}/send`).send({})).status).toBe(403);
    }
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    expect((await admin.post('/api/cases').send({ siteId: site.id })).status).toBe(201);
    const approverSession = await signIn(context.app, approver);
    const rejected = await approverSession.post(`/api/cases/${snapshot.id}/decision`).send({ decision: 'rejected', comment: 'Wait for the new tariff.' });
    expect(rejected.body.case.status).toBe('rejected');
  });

  it('answers 404 for another organisation’s cases and sites on every route, 401 when not signed in', async () => {
    const snapshot = await generate();
    const foreignSite = await createSite(other);
    for (const role of ['admin', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(other, role));
      await session.get(`/api/cases/${snapshot.id}`).expect(404);
      await session.get(`/api/cases/${snapshot.id}/export?format=pdf`).expect(404);
      await session.get(`/api/cases/${snapshot.id}/export?format=xlsx`).expect(404);
      const list = await session.get('/api/cases?pageSize=500').expect(200);
      expect(list.body.items.map((item: { id: number }) => item.id)).not.toContain(snapshot.id);
      if (role === 'admin') {
        expect((await session.post(`/api/cases/${snapshot.id}/send`).send({})).status).toBe(404);
        expect((await session.post('/api/cases').send({ siteId: site.id })).status).toBe(404);
      } else {
        expect((await session.post(`/api/cases/${snapshot.id}/decision`).send({ decision: 'approved' })).status).toBe(404);
      }
    }
    const mine = await signIn(context.app, engineer);
    expect((await mine.post('/api/cases').send({ siteId: foreignSite.id })).status).toBe(404);
    await request(context.app).get('/api/cases').expect(401);
    await request(context.app).get(`/api/cases/${snapshot.id}/export?format=pdf`).expect(401);
  });
});
