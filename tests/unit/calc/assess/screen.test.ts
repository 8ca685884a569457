/**
 * screenMotors against assess: for thousands of random motors in batches that share a site, price
 * book and assumptions (flat and time-of-use prices, demand charges, given price books and rebates,
 * given assumptions, BLDC curves, speedRpm, nameplate efficiency, drives fitted today, pumps with
 * static head, invalid rows), every figure of every option, the recommendation and the motor's own
 * figures must equal assess's for that motor exactly, and a bad motor must be reported by index and
 * field. Identity of two entry points over one core (no published value is checked here).
 */
import { describe, expect, it } from 'vitest';
import { assess, type OptionResult } from '../../../../calc/assess/assess.js';
import { OPTION_FIGURES, OPTION_SLOTS, screenMotors } from '../../../../calc/assess/screen.js';
import { CalcInputError } from '../../../../calc/errors.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from '../../../../calc/assess/schema.js';
import { seededRandom } from '../../../support/random.js';

interface Case {
  motor: MotorInput;
  site: SiteInput;
  priceBook?: PriceBookInput;
  assumptions?: AssumptionsInput;
}

/* eslint-disable @typescript-eslint/no-explicit-any */
/** Varied random motors, sites, price books and assumptions; some break a rule on purpose. */
function cases(count: number, seed: number): Case[] {
  const r = seededRandom(seed);
  const pick = <T>(l: readonly T[]): T => l[Math.floor(r() * l.length)]!;
  const maybe = (p: number) => r() < p;
  const out: any[] = [];
  for (let i = 0; i < count; i++) {
    const application = pick(['fan', 'pump', 'compressor', 'conveyor', 'mixer', 'other', undefined] as const);
    const flow = application === 'fan' || application === 'pump';
    const freq = pick([50, 60] as const);
    const motor: any = { tag: maybe(0.8) ? `T-${i}` : undefined, ratedPowerKw: pick([0.12, 0.37, 0.75, 2.2, 5.5, 7.5, 11, 15, 37, 45, 75, 110, 250, 400, 1000]) * (maybe(0.3) ? 0.5 + r() : 1) };
    if (motor.ratedPowerKw < 0.12) motor.ratedPowerKw = 0.12;
    if (motor.ratedPowerKw > 1000) motor.ratedPowerKw = 1000;
    if (application) motor.application = application;
    if (maybe(0.8)) motor.poles = pick([2, 4, 6, 8] as const);
    else { const p = pick([2, 4, 6, 8]); motor.speedRpm = (120 * freq / p) * (0.85 + r() * 0.14); }
    if (maybe(0.4)) motor.frequencyHz = freq;
    if (maybe(0.3)) motor.voltageV = pick([230, 400, 460, 690, 3300]);
    if (maybe(0.85)) motor.efficiencyClass = pick(['IE1', 'IE2', 'IE3', 'IE4', 'IE5', 'unknown'] as const);
    if (maybe(0.15)) motor.nameplateEfficiencyPct = 70 + r() * 27;
    if (maybe(0.15)) motor.powerFactor = 0.6 + r() * 0.35;
    else if (maybe(0.15)) { motor.voltageV = motor.voltageV ?? 400; motor.ratedCurrentA = (motor.ratedPowerKw * 1000) / (1.732 * motor.voltageV * 0.82 * 0.9) * (0.9 + r() * 0.2); }
    const cm = pick(['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive', undefined] as const);
    if (cm) motor.controlMethod = cm;
    if (cm === 'variable-speed-drive' && maybe(0.5)) motor.driveClass = pick(['IE0', 'IE1', 'IE2'] as const);
    const profile = r();
    if (profile < 0.6) {
      const n = pick([1, 3, 8, 8, 8, 12]);
      motor.dutyProfile = Array.from({ length: n }, () => ({ fraction: maybe(0.05) ? 0 : Math.round((0.1 + r() * (flow ? 1.0 : 1.05)) * 100) / 100, hours: Math.round(r() * 8760 / n) }));
      if (maybe(0.5)) motor.loadFactor = 0.3 + r() * 0.7;
    } else if (profile < 0.85) {
      motor.hoursPerYear = Math.round(r() * 8760);
      if (maybe(0.7)) motor.loadFactor = 0.2 + r() * 0.9;
    }
    if (maybe(0.5)) motor.rewinds = Math.floor(r() * 4);
    if (maybe(0.3)) motor.yearInstalled = 1985 + Math.floor(r() * 40);
    if (application === 'pump' && maybe(0.5)) motor.staticHeadFraction = Math.round(r() * 0.9 * 100) / 100;
    if (application === 'fan' && maybe(0.1)) motor.staticHeadFraction = 0.1;
    if (maybe(0.15)) motor.bldcCurve = { source: 'sized design #' + i, ratedPowerKw: motor.ratedPowerKw * (0.9 + r() * 0.2), points: [ { loadFraction: 0.1, efficiency: 0.7 + r() * 0.1, powerFactor: 0.6 + r() * 0.2 }, { loadFraction: 0.5, efficiency: 0.88 + r() * 0.05, powerFactor: 0.9 }, { loadFraction: 1, efficiency: 0.93 + r() * 0.04, powerFactor: 0.95 }, { loadFraction: 1.2, efficiency: 0.92, powerFactor: 0.95 } ] };
    if (motor.tag === undefined) delete motor.tag;
    const site: any = {};
    if (maybe(0.9)) site.voltageV = pick([400, 415, 480]);
    if (maybe(0.9)) site.frequencyHz = freq;
    if (maybe(0.75)) site.energyPricePerKwh = Math.round((0.05 + r() * 0.3) * 1000) / 1000;
    else site.timeOfUse = [{ period: 'peak', pricePerKwh: 0.2 + r() * 0.2, hoursShare: r() }, { period: 'off', pricePerKwh: 0.05 + r() * 0.1, hoursShare: r() }, ...(maybe(0.3) ? [{ period: 'x', pricePerKwh: 0, hoursShare: 0 }] : [])];
    if (maybe(0.6)) site.demandChargePerKwMonth = Math.round(r() * 15 * 100) / 100;
    if (maybe(0.7)) site.currency = pick(['EUR', 'USD', 'GBP']);
    if (maybe(0.6)) site.co2KgPerKwh = r() * 0.8;
    if (maybe(0.2)) site.defaultHoursPerYear = Math.round(r() * 8760);
    const c: any = { motor, site };
    if (maybe(0.3)) {
      const pb: any = {};
      if (maybe(0.5)) pb.currency = site.currency ?? 'EUR';
      if (maybe(0.7)) pb.items = { ...(maybe(0.5) ? { ie4: [{ upToKw: 10, costPerKw: 80, fixedCost: 100 }, { upToKw: 2000, costPerKw: 60 + r() * 20, fixedCost: 500 }] } : {}), ...(maybe(0.5) ? { vsd: [{ upToKw: 1000, costPerKw: 40 + r() * 40, fixedCost: 300 }] } : {}), ...(maybe(0.2) ? { rewind: [{ upToKw: 5, costPerKw: 30, fixedCost: 100 }] } : {}) };
      if (maybe(0.4)) pb.motorInstallation = { fixedCost: r() * 500, costPerKw: r() * 10 };
      if (maybe(0.4)) pb.driveInstallation = { fixedCost: r() * 500, costPerKw: r() * 10 };
      if (maybe(0.5)) pb.rebates = { ie4: { fraction: r() * 0.5 }, 'bldc-vsd': { perKw: r() * 20, fixed: r() * 200 }, ...(maybe(0.3) ? { ie3: { fixed: 1e6 } } : {}) };
      c.priceBook = pb;
    }
    if (maybe(0.35)) {
      const a: any = {};
      if (maybe(0.5)) a.discountRatePct = pick([0, 2, 5, 8, 12, 2, -5, 30]);
      if (maybe(0.5)) a.energyEscalationPct = pick([0, 2, 3, 5, -3, 8, 12]);
      if (maybe(0.3)) a.lifeYears = { ie3: 1 + Math.floor(r() * 30), vsd: 1 + Math.floor(r() * 20), ...(maybe(0.5) ? { keep: 5 } : {}) };
      if (maybe(0.3)) a.rewindPenaltyPctPoints = r() * 3;
      if (maybe(0.3)) a.defaultHoursPerYear = Math.round(r() * 8760);
      if (maybe(0.3)) a.defaultLoadFactor = 0.3 + r() * 0.6;
      if (maybe(0.3)) a.unknownClassLossFactor = 1 + r();
      if (maybe(0.3)) a.newDriveClass = pick(['IE0', 'IE1', 'IE2'] as const);
      if (maybe(0.3)) a.co2KgPerKwh = r();
      c.assumptions = a;
    }
    out.push(c);
  }
  return out;
}

/* eslint-enable @typescript-eslint/no-explicit-any */

/** The assess figure as a screening column holds it: null becomes NaN. */
const asColumn = (value: number | null): number => (value === null ? Number.NaN : value);

describe('screenMotors', () => {
  it('gives every figure of assess, exactly, for 2,400 random motors in 48 batches (a batch shares the site, price book and assumptions)', { timeout: 60_000 }, () => {
    let assessed = 0;
    let failed = 0;
    let compared = 0;
    const mismatches: string[] = [];
    for (let batch = 0; batch < 48; batch += 1) {
      const generated = cases(50, 1000 + batch);
      const shared = generated[0]!;
      const motors = generated.map((entry) => entry.motor);
      let screening;
      try {
        screening = screenMotors(motors, shared.site, shared.priceBook, shared.assumptions);
      } catch (error) {
        // A site-level error concerns every motor: assess gives the same one (after its motor checks).
        expect(error).toBeInstanceOf(CalcInputError);
        continue;
      }
      expect(screening.motorCount).toBe(motors.length);
      motors.forEach((motor, index) => {
        let result;
        try {
          result = assess(motor, shared.site, shared.priceBook, shared.assumptions, { detail: 'totals' });
        } catch (error) {
          failed += 1;
          const thrown = error as CalcInputError;
          const listed = screening.errors.find((entry) => entry.motorIndex === index);
          const field = thrown.field.startsWith('motor.') ? `motors.${index}.${thrown.field.slice(6)}` : thrown.field;
          expect(listed).toEqual({ motorIndex: index, field, message: `"${field}" ${thrown.message.slice(thrown.field.length + 3)}` });
          expect(screening.recommendedSlot[index]).toBe(-1);
          expect(Number.isNaN(screening.figures.npv[index * OPTION_SLOTS]!)).toBe(true);
          return;
        }
        assessed += 1;
        expect(screening.errors.some((entry) => entry.motorIndex === index)).toBe(false);
        expect(screening.optionCount[index]).toBe(result.options.length);
        expect(screening.optionCodes[screening.recommendedSlot[index]!]).toBe(result.recommended.code);
        expect(screening.efficiencyPct[index]).toBe(result.motor.efficiencyPct);
        expect(screening.powerFactor[index]).toBe(result.motor.powerFactor);
        expect(screening.annualHours[index]).toBe(result.motor.annualHours);
        for (let slot = 0; slot < OPTION_SLOTS; slot += 1) {
          const option = result.options.find((entry) => entry.code === screening.optionCodes[slot]);
          for (const figure of OPTION_FIGURES) {
            const column = screening.figures[figure][index * OPTION_SLOTS + slot]!;
            const expected = option ? asColumn((option as OptionResult)[figure]) : Number.NaN;
            compared += 1;
            if (!Object.is(column, expected)) mismatches.push(`motor ${index} of batch ${batch}, ${screening.optionCodes[slot]} ${figure}: ${column} ≠ ${expected}`);
          }
        }
      });
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(compared).toBe(assessed * OPTION_SLOTS * OPTION_FIGURES.length);
    expect(assessed).toBeGreaterThan(1500);
    expect(failed).toBeGreaterThan(50);
  });

  it('reports a bad motor by index and field and screens the others', () => {
    const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14 };
    const good: MotorInput = { ratedPowerKw: 11, poles: 4, efficiencyClass: 'IE1', hoursPerYear: 4000 };
    const screening = screenMotors([good, { ...good, ratedPowerKw: 0 }, good, { ...good, dutyProfile: [{ fraction: 2, hours: 100 }] }], site);
    expect(screening.errors).toEqual([
      { motorIndex: 1, field: 'motors.1.ratedPowerKw', message: '"motors.1.ratedPowerKw" must be between 0.12 and 1000' },
      { motorIndex: 3, field: 'motors.3.dutyProfile.0.fraction', message: '"motors.3.dutyProfile.0.fraction" must be between 0 and 1.25' },
    ]);
    expect(Array.from(screening.recommendedSlot).map((slot) => slot >= 0)).toEqual([true, false, true, false]);
    expect(screening.figures.annualKwh[2 * OPTION_SLOTS]).toBe(assess(good, site).baseline.annualKwh);
  });

  it('leaves a bad motor all NaN and its neighbours as if it were not in the batch (common practice, no source)', () => {
    const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14 };
    const fan: MotorInput = { ratedPowerKw: 45, poles: 4, efficiencyClass: 'IE1', application: 'fan', controlMethod: 'outlet-damper', dutyProfile: [{ fraction: 0.6, hours: 3000 }, { fraction: 0.9, hours: 2000 }] };
    const pump: MotorInput = { ratedPowerKw: 7.5, poles: 2, efficiencyClass: 'IE2', application: 'pump', controlMethod: 'throttle-valve', hoursPerYear: 6000 };
    // Fails in its last bin, after the first bins' operating points are written to the core's scratch.
    const bad: MotorInput = { ...fan, loadFactor: 1.2, dutyProfile: [{ fraction: 0.5, hours: 100 }, { fraction: 1.1, hours: 100 }] };
    const alone = screenMotors([fan, pump], site);
    const mixed = screenMotors([fan, bad, pump], site);
    expect(mixed.errors.map((entry) => entry.field)).toEqual(['motors.1.dutyProfile.1.fraction']);
    for (const figure of OPTION_FIGURES) {
      const column = mixed.figures[figure];
      expect(Array.from(column.subarray(OPTION_SLOTS, 2 * OPTION_SLOTS)).every(Number.isNaN)).toBe(true);
      expect(Array.from(column.subarray(0, OPTION_SLOTS))).toEqual(Array.from(alone.figures[figure].subarray(0, OPTION_SLOTS)));
      expect(Array.from(column.subarray(2 * OPTION_SLOTS))).toEqual(Array.from(alone.figures[figure].subarray(OPTION_SLOTS)));
    }
  });

  it('shares no state between calls: assess gives the same JSON before and after a failed motor and a screening, and a held result does not change', () => {
    const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14, demandChargePerKwMonth: 9 };
    const fan: MotorInput = { ratedPowerKw: 45, poles: 4, efficiencyClass: 'IE1', application: 'fan', controlMethod: 'inlet-vanes', dutyProfile: [{ fraction: 0.4, hours: 2000 }, { fraction: 0.8, hours: 3000 }, { fraction: 1, hours: 500 }] };
    const held = assess(fan, site);
    const first = JSON.stringify(held);
    const other: MotorInput = { ratedPowerKw: 200, poles: 2, efficiencyClass: 'IE3', hoursPerYear: 8000, bldcCurve: { source: 'test', ratedPowerKw: 200, points: [{ loadFraction: 0.5, efficiency: 0.95, powerFactor: 0.9 }, { loadFraction: 1, efficiency: 0.96, powerFactor: 0.95 }] } };
    expect(() => assess({ ...fan, dutyProfile: [{ fraction: 0.5, hours: 100 }, { fraction: 2, hours: 100 }] }, site)).toThrow(CalcInputError);
    screenMotors([other, fan, { ...other, ratedPowerKw: 0 }], site, undefined, { discountRatePct: 3, energyEscalationPct: 3 });
    assess(other, site, undefined, { lifeYears: { ie3: 7 } }, { detail: 'totals' });
    expect(JSON.stringify(assess(fan, site))).toBe(first);
    expect(JSON.stringify(held)).toBe(first);
  });

  it('throws a site error once, naming the field as assess does', () => {
    expect(() => screenMotors([{ ratedPowerKw: 11, poles: 4 }], { voltageV: 400, frequencyHz: 50 })).toThrow('"energyPricePerKwh" is required unless timeOfUse is given');
    expect(() => screenMotors([], { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.1, currency: 'EUR' }, { currency: 'USD' })).toThrow('"priceBook.currency" must equal site.currency (EUR)');
  });

  it('returns empty columns for an empty batch', () => {
    const screening = screenMotors([], { energyPricePerKwh: 0.1 });
    expect(screening.motorCount).toBe(0);
    expect(screening.figures.npv.length).toBe(0);
    expect(screening.errors).toEqual([]);
  });
});
