import { describe, expect, it } from 'vitest';
import { assess, type AssessResult, type OptionResult } from '../../../../calc/assess/assess.js';
import { assessInputSchema, type MotorInput, type SiteInput } from '../../../../calc/assess/schema.js';
import { OPTION_CODES } from '../../../../calc/assess/options.js';
import { runAssessCommand } from '../../../../calc/assess/command.js';
import { iecClassEfficiency } from '../../../../calc/efficiency/classes.js';
import { netPresentValue, savingsCashFlows } from '../../../../calc/economics/cash-flows.js';

const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, demandChargePerKwMonth: 5, currency: 'EUR', co2KgPerKwh: 0.3 };
const fan: MotorInput = {
  tag: 'F-101',
  ratedPowerKw: 15,
  poles: 4,
  efficiencyClass: 'IE1',
  application: 'fan',
  controlMethod: 'outlet-damper',
  loadFactor: 0.8,
  dutyProfile: [
    { fraction: 1, hours: 1000 },
    { fraction: 0.8, hours: 2000 },
    { fraction: 0.6, hours: 2000 },
    { fraction: 0.4, hours: 1000 },
  ],
};
const conveyor: MotorInput = { ratedPowerKw: 7.5, poles: 4, efficiencyClass: 'unknown', application: 'conveyor', loadFactor: 0.7, hoursPerYear: 6000 };
const option = (result: AssessResult, code: string): OptionResult => {
  const found = result.options.find((entry) => entry.code === code);
  if (!found) throw new Error(`no option ${code}`);
  return found;
};

describe('assess: options and the baseline', () => {
  it('lists every option, speed-control variants only for a throttled fan or pump, codes from OPTION_CODES', () => {
    const fanResult = assess(fan, site);
    expect(fanResult.options.map((entry) => entry.code)).toEqual([...OPTION_CODES]);
    expect(assess(conveyor, site).options.map((entry) => entry.code)).toEqual(['keep', 'rewind', 'ie3', 'ie4', 'ie5', 'bldc']);
    expect(assess({ ...fan, controlMethod: 'variable-speed-drive' }, site).options).toHaveLength(6);
    expect(fanResult.baseline).toBe(fanResult.options[0]);
    expect(fanResult.baseline.code).toBe('keep');
  });

  it('keeps input = output + losses, efficiency below 1 and losses positive at every bin of every option (energy balance)', () => {
    for (const motor of [fan, conveyor, { ...fan, application: 'pump' as const, controlMethod: 'throttle-valve' as const }]) {
      for (const entry of assess(motor, site).options) {
        for (const bin of entry.bins) {
          if (bin.inputKw === 0) continue;
          expect(bin.inputKw, `${entry.code}`).toBeGreaterThan(bin.shaftKw);
          expect(bin.efficiency).toBeLessThan(1);
          expect(bin.efficiency).toBeCloseTo(bin.shaftKw / bin.inputKw, 3);
          expect(bin.powerFactor).toBeGreaterThan(0);
          expect(bin.powerFactor).toBeLessThanOrEqual(1);
          // I = P/(√3·V·PF), NEC / circuit theory.
          expect(bin.currentA).toBeCloseTo((1000 * bin.inputKw) / (Math.sqrt(3) * 400 * bin.powerFactor), 0);
        }
        const kwh = entry.bins.reduce((sum, bin) => sum + bin.inputKw * bin.runHours, 0);
        expect(entry.annualKwh).toBeCloseTo(kwh, -1);
      }
    }
  });

  it('gives each option savings = baseline − option, in kWh, cost and CO2 (identity)', () => {
    const result = assess(fan, site);
    for (const entry of result.options) {
      expect(entry.savingsKwh).toBeCloseTo(result.baseline.annualKwh - entry.annualKwh, 0);
      expect(entry.savingsCost).toBeCloseTo(result.baseline.annualCost - entry.annualCost, 1);
      expect(entry.co2SavedKg).toBeCloseTo(entry.savingsKwh * 0.3, 0);
      expect(entry.annualCost).toBeCloseTo(entry.energyCost + entry.demandCost, 1);
      expect(entry.energyCost).toBeCloseTo(entry.annualKwh * 0.15, 0);
      expect(entry.demandCost).toBeCloseTo(entry.peakKw * 5 * 12, 0);
    }
    expect(result.baseline.savingsKwh).toBe(0);
    expect(result.baseline.capex).toBe(0);
  });

  it('orders the new motors IE3 > IE4 > IE5 in energy use, all below IE1 today (monotonic classes)', () => {
    const result = assess(fan, site);
    expect(option(result, 'ie3').annualKwh).toBeLessThan(result.baseline.annualKwh);
    expect(option(result, 'ie4').annualKwh).toBeLessThan(option(result, 'ie3').annualKwh);
    expect(option(result, 'ie5').annualKwh).toBeLessThan(option(result, 'ie4').annualKwh);
    expect(option(result, 'ie5-vsd').annualKwh).toBeLessThan(option(result, 'ie3-vsd').annualKwh);
    expect(option(result, 'rewind').annualKwh).toBeGreaterThan(result.baseline.annualKwh);
  });

  it('judges added speed control with the fan curves: the damper-to-drive saving at 60 % flow is the curve difference', () => {
    const result = assess({ ...fan, dutyProfile: [{ fraction: 0.6, hours: 4000 }] }, site);
    const damper = result.baseline.bins[0]!;
    const drive = option(result, 'keep-vsd').bins[0]!;
    expect(damper.shaftKw).toBeCloseTo(15 * 0.8 * (0.5 + 0.5 * 0.6), 3); // outlet-damper curve
    expect(drive.shaftKw).toBeCloseTo(15 * 0.8 * 0.6 ** 3, 3); // cube law, fan without static head
    expect(drive.speedFraction).toBeCloseTo(0.6, 4);
    expect(option(result, 'keep-vsd').savingsKwh).toBeGreaterThan(0.5 * result.baseline.annualKwh);
  });

  it('uses the rated efficiency of each class (IEC 60034-30-1) and the IE5 level for the generic BLDC, saying so', () => {
    const result = assess(fan, site);
    expect(option(result, 'ie3').ratedEfficiencyPct).toBe(iecClassEfficiency(15, 4, 50, 'IE3').efficiencyPct);
    expect(result.motor.efficiencyPct).toBe(88.7); // IE1 15 kW 4p, Table 2
    const bldc = option(result, 'bldc');
    expect(bldc.ratedEfficiencyPct).toBe(iecClassEfficiency(15, 4, 50, 'IE5').efficiencyPct);
    expect(bldc.assumptions.map((entry) => String(entry.value)).join(' ')).toContain('generic permanent-magnet part-load model at the IE5 level');
  });

  it('replaces the generic BLDC model by a sized design’s part-load curve and names it in the assumptions', () => {
    const bldcCurve = {
      source: 'BLDC design #12, 36 slots / 4 poles',
      ratedPowerKw: 15,
      points: [
        { loadFraction: 0.1, efficiency: 0.8, powerFactor: 0.7 },
        { loadFraction: 0.5, efficiency: 0.95, powerFactor: 0.9 },
        { loadFraction: 1.25, efficiency: 0.96, powerFactor: 0.95 },
      ],
    };
    const result = assess({ ...fan, bldcCurve }, site);
    const bin = option(result, 'bldc').bins[0]!; // 80 % load → efficiency 0.95 + 0.3/0.75·0.01
    expect(bin.efficiency).toBeCloseTo(0.95 + (0.3 / 0.75) * 0.01, 4);
    expect(option(result, 'bldc').assumptions[0]!.source).toContain('BLDC design #12');
  });

  it('lets a nameplate efficiency win over the class, defaults an old unknown motor below IE1, and charges rewinds', () => {
    expect(assess({ ...conveyor, nameplateEfficiencyPct: 90.5 }, site).motor.efficiencyPct).toBe(90.5);
    const unknown = assess(conveyor, site);
    expect(unknown.motor.efficiencyPct).toBeLessThan(86.0); // IE1 7.5 kW 4p = 86.0 (Table 2)
    expect(unknown.assumptions.find((entry) => entry.what.startsWith("today's rated efficiency"))!.source).toContain('below IE1');
    expect(assess({ ...conveyor, yearInstalled: 2015 }, site).motor.efficiencyPct).toBe(88.7); // IE2 7.5 kW 4p (Table 2)
    expect(assess({ ...conveyor, efficiencyClass: 'IE2', rewinds: 2 }, site).motor.efficiencyPct).toBeCloseTo(86.7, 6); // 88.7 − 2 × 1 point
  });

  it('recommends the option of highest positive NPV, or keeping the motor when none pays', () => {
    const result = assess(fan, site);
    const best = result.options.filter((entry) => entry.code !== 'keep').sort((a, b) => b.npv - a.npv)[0]!;
    expect(result.recommended.code).toBe(best.code);
    expect(result.recommended.reason).toContain('highest NPV');
    const idle = assess({ ...conveyor, hoursPerYear: 50 }, site);
    expect(idle.recommended.code).toBe('keep');
    expect(idle.recommended.reason).toContain('no option has a positive NPV');
  });

  it('computes each option’s NPV from its own cash flows (same as the economics functions, to the cent)', () => {
    const result = assess(fan, site, undefined, { discountRatePct: 6, energyEscalationPct: 3 });
    const ie4 = option(result, 'ie4');
    const npv = netPresentValue(0.06, savingsCashFlows(ie4.capex, ie4.savingsCost, ie4.lifeYears, 0.03));
    expect(Math.abs(ie4.npv - npv)).toBeLessThan(0.02 * ie4.lifeYears); // savingsCost is rounded to cents before this recomputation
    expect(ie4.irr).not.toBeNull();
    expect(netPresentValue(ie4.irr!, savingsCashFlows(ie4.capex, ie4.savingsCost, ie4.lifeYears, 0.03))).toBeCloseTo(0, -1);
  });

  it('reduces the line current with a better motor and lists the assumptions with their sources', () => {
    const result = assess(fan, site);
    expect(option(result, 'ie4').lineCurrentReductionA).toBeGreaterThan(0);
    expect(option(result, 'ie4').lineCurrentA).toBeCloseTo(result.baseline.lineCurrentA - option(result, 'ie4').lineCurrentReductionA, 1);
    for (const entry of result.assumptions) {
      expect(entry.what.length).toBeGreaterThan(0);
      expect(entry.source.length).toBeGreaterThan(0);
    }
    expect(JSON.parse(JSON.stringify(result))).toEqual(result); // plain JSON data
  });

  it('uses the price book given, with rebates, and refuses a price book in another currency', () => {
    const result = assess(fan, site, { items: { ie4: [{ upToKw: 1000, costPerKw: 100, fixedCost: 0 }] }, rebates: { ie4: { fraction: 0.5 } } });
    expect(option(result, 'ie4').capex).toBeCloseTo((1500 + 200 + 8 * 15) * 0.5, 6);
    expect(() => assess(fan, site, { currency: 'USD' })).toThrow('"priceBook.currency" must equal site.currency (EUR)');
  });
});

describe('assess: bad input', () => {
  it('names the field for negative power, 3 poles, 0 V, more than 8760 hours and an unknown class', () => {
    expect(() => assess({ ...conveyor, ratedPowerKw: -5 }, site)).toThrow('"motor.ratedPowerKw" must be between 0.12 and 1000');
    expect(() => assess({ ...conveyor, poles: 3 as 4 }, site)).toThrow('"motor.poles" must be 2, 4, 6 or 8');
    expect(() => assess({ ...conveyor, voltageV: 0 }, site)).toThrow('"motor.voltageV" must be positive');
    expect(() => assess({ ...conveyor, hoursPerYear: 9000 }, site)).toThrow('"motor.hoursPerYear" must be between 0 and 8760');
    expect(() => assess({ ...fan, dutyProfile: [{ fraction: 1, hours: 5000 }, { fraction: 0.5, hours: 4000 }] }, site)).toThrow('"motor.dutyProfile" hours must add up to 8760 or less');
    expect(() => assess({ ...conveyor, efficiencyClass: 'IE7' as 'IE1' }, site)).toThrow('"motor.efficiencyClass" must be one of IE1, IE2, IE3, IE4, IE5, unknown');
    expect(() => assess({ ...conveyor, poles: undefined }, site)).toThrow('"motor.poles" or speedRpm is required');
    expect(() => assess(conveyor, { ...site, frequencyHz: undefined })).toThrow('"motor.frequencyHz" is required unless site.frequencyHz is given');
    expect(() => assess({ ...fan, loadFactor: 1.2, dutyProfile: [{ fraction: 1.2, hours: 100 }] }, site)).toThrow('"motor.dutyProfile.0.fraction" gives a shaft load above 125 % of rated');
  });

  it('names the field for the remaining rules', () => {
    expect(() => assess({ ...conveyor, rewinds: 1.5 }, site)).toThrow('"motor.rewinds" must be a whole number from 0 to 10');
    expect(() => assess({ ...conveyor, nameplateEfficiencyPct: 120 }, site)).toThrow('"motor.nameplateEfficiencyPct" must be between 1 and 99.9');
    expect(() => assess({ ...conveyor, powerFactor: 0 }, site)).toThrow('"motor.powerFactor" must be between 0.05 and 1');
    expect(() => assess({ ...fan, dutyProfile: [{ fraction: 2, hours: 10 }] }, site)).toThrow('"motor.dutyProfile.0.fraction" must be between 0 and 1.25');
    expect(() => assess({ ...fan, dutyProfile: [{ fraction: 1, hours: -10 }] }, site)).toThrow('"motor.dutyProfile.0.hours" must be between 0 and 8760');
    expect(() => assess({ ...fan, loadFactor: 2 }, site)).toThrow('"motor.loadFactor" must be between 0 and 1.25');
    expect(() => assess(conveyor, { ...site, voltageV: undefined })).toThrow('"motor.voltageV" is required unless site.voltageV is given');
    expect(() => assess(conveyor, { ...site, voltageV: -400 })).toThrow('"site.voltageV" must be positive');
    expect(() => assess({ ...conveyor, frequencyHz: 55 as 50 }, site)).toThrow('"motor.frequencyHz" must be 50 or 60');
    expect(() => assess({ ...conveyor, hoursPerYear: undefined }, { ...site, defaultHoursPerYear: 9999 })).toThrow('"site.defaultHoursPerYear" must be between 0 and 8760');
  });

  it('derives the poles from the speed when they are missing', () => {
    expect(assess({ ...conveyor, poles: undefined, speedRpm: 1460 }, site).motor.poles).toBe(4);
    expect(() => assess({ ...conveyor, poles: undefined, speedRpm: 3100 }, site)).toThrow('"motor.speedRpm" matches no 2-, 4-, 6- or 8-pole induction motor at 50 Hz');
  });

  it('validates the same rules through the zod schema the server reuses', () => {
    const bad = (motor: Record<string, unknown>, siteInput: Record<string, unknown> = site) => () => runAssessCommand({ motor: { ...conveyor, ...motor }, site: siteInput });
    expect(bad({ ratedPowerKw: -5 })).toThrow('"motor.ratedPowerKw" must be positive');
    expect(bad({ poles: 3 })).toThrow('"motor.poles" must be 2, 4, 6 or 8');
    expect(bad({ voltageV: 0 })).toThrow('"motor.voltageV" must be positive');
    expect(bad({ hoursPerYear: 9000 })).toThrow('"motor.hoursPerYear" must be at most 8760');
    expect(bad({ dutyProfile: [{ fraction: 1, hours: 5000 }, { fraction: 0.5, hours: 4000 }] })).toThrow('"motor.dutyProfile" hours must add up to 8760 or less');
    expect(bad({ efficiencyClass: 'IE7' })).toThrow('"motor.efficiencyClass" must be one of IE1, IE2, IE3, IE4, IE5, unknown');
    expect(bad({}, { voltageV: 400 })).toThrow('"site.energyPricePerKwh" is required unless timeOfUse is given');
    expect(assessInputSchema.safeParse({ motor: fan, site }).success).toBe(true);
  });
});
