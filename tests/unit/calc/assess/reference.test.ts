/**
 * The optimised `assess` (its core in calc/assess/engine.ts: per-point rounding shared by the options,
 * memoised class values, life factors computed once per life, the closed-form NPV and IRR of the
 * escalating savings, a fast exact toFixed(0)) against a straightforward reference written from the
 * domain functions (year-by-year cash flows), for a few hundred generated motors.
 * Identity of two implementations of the same published model (no published value is checked here).
 */
import { describe, expect, it } from 'vitest';
import { assess, type AssessResult } from '../../../../calc/assess/assess.js';
import type { MotorInput, SiteInput } from '../../../../calc/assess/schema.js';
import { iecClassEfficiency, unknownClassEfficiency, type Poles } from '../../../../calc/efficiency/classes.js';
import { inductionReactiveKvar, lossSplit, machineLossKw, rewoundEfficiency, typicalRatedPowerFactor } from '../../../../calc/efficiency/part-load.js';
import { driveInputPowerFactor, driveLossKw } from '../../../../calc/drives/losses.js';
import { flowOperatingPoint, type ControlMethod } from '../../../../calc/loads/fans-pumps.js';
import {
  capitalRecoveryFactor,
  discountedPaybackYears,
  internalRateOfReturn,
  lifeCycleCost,
  netPresentValue,
  savingsCashFlows,
  simplePaybackYears,
} from '../../../../calc/economics/cash-flows.js';
import { roundMoney } from '../../../../calc/economics/money.js';
import { DEFAULT_PRICE_BOOK, installationCost, itemCost } from '../../../../calc/economics/price-book.js';
import { seededRandom } from '../../../support/random.js';

const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14, demandChargePerKwMonth: 6, currency: 'EUR', co2KgPerKwh: 0.35 };

function motors(count: number): MotorInput[] {
  const random = seededRandom(7);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!;
  return Array.from({ length: count }, () => {
    const application = pick(['fan', 'pump', 'compressor', 'conveyor'] as const);
    const flow = application === 'fan' || application === 'pump';
    return {
      ratedPowerKw: pick([0.37, 0.75, 2.2, 5.5, 11, 15, 37, 75, 110, 250, 400]) * (random() < 0.3 ? 1.07 : 1),
      poles: pick([2, 4, 6, 8] as const),
      application,
      controlMethod: flow ? pick(['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes'] as const) : 'direct-on-line',
      efficiencyClass: pick(['IE1', 'IE2', 'IE3', 'unknown'] as const),
      loadFactor: 0.5 + random() * 0.4,
      rewinds: Math.floor(random() * 3),
      dutyProfile: Array.from({ length: 8 }, (_, bin) => ({ fraction: 0.3 + 0.1 * bin, hours: Math.round(200 + random() * 800) })),
    };
  });
}

const round = (value: number, decimals: number): number => Math.round(value * 10 ** decimals) / 10 ** decimals;

/** The reference: each option's bins and money, one bin and one option at a time, from the domain functions. */
function reference(motor: MotorInput, result: AssessResult) {
  const power = motor.ratedPowerKw;
  const poles = motor.poles as Poles;
  const original = motor.efficiencyClass === 'unknown' ? unknownClassEfficiency(power, poles, 50) : iecClassEfficiency(power, poles, 50, motor.efficiencyClass as 'IE1');
  const keep = rewoundEfficiency(original.efficiencyPct / 100, motor.rewinds ?? 0);
  const rated: Record<string, number> = {
    keep,
    rewind: rewoundEfficiency(keep, 1),
    ie3: iecClassEfficiency(power, poles, 50, 'IE3').efficiencyPct / 100,
    ie4: iecClassEfficiency(power, poles, 50, 'IE4').efficiencyPct / 100,
    ie5: iecClassEfficiency(power, poles, 50, 'IE5').efficiencyPct / 100,
  };
  rated.bldc = rated.ie5!;
  const pf = typicalRatedPowerFactor(power, poles);
  const sinPhi = Math.sqrt(1 - pf * pf);
  const flow = motor.application === 'fan' || motor.application === 'pump';
  const staticHead = motor.application === 'pump' ? 0.2 : 0;
  return result.options.map((option) => {
    const family = option.code.replace('-vsd', '');
    const speedControl = option.code.endsWith('-vsd');
    const method: ControlMethod = speedControl ? 'variable-speed-drive' : motor.controlMethod!;
    const efficiency = rated[family]!;
    const pm = family === 'bldc';
    const split = lossSplit(power, efficiency, pm ? 0.3 : 0.35);
    const drive = pm || speedControl ? 'IE2' : null;
    const m = pm ? 0 : 0.65 * sinPhi;
    let annualKwh = 0;
    let peakKw = 0;
    let peakCurrent = 0;
    let peakKva = 0;
    const bins = motor.dutyProfile!.map((bin) => {
      let shaftKw = bin.fraction * power;
      let speed = 1;
      let torque = bin.fraction;
      let runHours = bin.hours;
      if (flow) {
        const point = flowOperatingPoint(method, bin.fraction, staticHead);
        const load = motor.loadFactor! * point.powerFraction;
        shaftKw = load * power;
        speed = point.speedFraction;
        torque = speed > 0 ? load / speed : 0;
        runHours = bin.hours * point.runFraction;
      }
      let inputKw = 0;
      let powerFactor = 0;
      const running = runHours > 0 && speed > 0;
      if (running) {
        const motorInputKw = shaftKw + machineLossKw(split, speed, torque);
        if (drive) {
          const current = pm ? torque : Math.sqrt(m * m + (1 - m * m) * torque * torque);
          inputKw = motorInputKw + driveLossKw(power, current, drive);
          powerFactor = driveInputPowerFactor(Math.min((motorInputKw * efficiency) / power, 1.5));
        } else {
          inputKw = motorInputKw;
          const reactive = inductionReactiveKvar((power / efficiency) * (sinPhi / pf), 1, torque);
          powerFactor = inputKw / Math.sqrt(inputKw * inputKw + reactive * reactive);
        }
      }
      const kva = powerFactor > 0 ? inputKw / powerFactor : 0;
      const currentA = (1000 * kva) / (Math.sqrt(3) * 400);
      if (running) {
        annualKwh += inputKw * runHours;
        peakKw = Math.max(peakKw, inputKw);
        if (currentA > peakCurrent) [peakCurrent, peakKva] = [currentA, kva];
      }
      return { fraction: bin.fraction, hours: bin.hours, runHours: round(runHours, 2), shaftKw: round(shaftKw, 4), loadFraction: round(shaftKw / power, 4), speedFraction: round(speed, 4), inputKw: round(inputKw, 4), efficiency: inputKw > 0 ? round(shaftKw / inputKw, 4) : 0, powerFactor: round(powerFactor, 3), currentA: round(currentA, 2), kva: round(kva, 3) };
    });
    // Capex from the default price book (no drive today, no rebates in this set).
    const book = DEFAULT_PRICE_BOOK;
    let capex = family === 'rewind' ? itemCost(book.items.rewind, power) : 0;
    if (family !== 'keep' && family !== 'rewind') capex += itemCost(book.items[family as 'ie3'], power) + installationCost(book.motorInstallation, power);
    if (speedControl) capex += (pm ? 0 : itemCost(book.items.vsd, power)) + installationCost(book.driveInstallation, power);
    return { code: option.code, bins, capex, annualKwh, annualCost: annualKwh * 0.14 + peakKw * 6 * 12, peakKw, peakCurrent, peakKva };
  });
}

/** Mismatches found by `close` (collected, then asserted empty: 200,000 expect() calls would be slow). */
const mismatches: string[] = [];

/** |a − b| ≤ 1e-9·max(|a|, |b|), nulls equal only to nulls. */
function close(actual: number | null, expected: number | null, what: string): void {
  const equal = actual === null || expected === null ? actual === expected : Math.abs(actual - expected) <= 1e-9 * Math.max(Math.abs(actual), Math.abs(expected));
  if (!equal) mismatches.push(`${what}: ${actual} vs ${expected}`);
}

describe('assess: optimised path against a straightforward reference', () => {
  const set = motors(300);

  it('gives every bin and every money figure of 300 generated motors to 1e-9 relative', () => {
    for (const motor of set) {
      const result = assess(motor, site);
      const expected = reference(motor, result);
      const baseline = expected[0]!;
      result.options.forEach((option, index) => {
        const ref = expected[index]!;
        if (option.code !== ref.code) mismatches.push(`code ${option.code} vs ${ref.code}`);
        option.bins.forEach((bin, b) => {
          for (const key of Object.keys(ref.bins[b]!) as (keyof typeof bin)[]) close(bin[key], ref.bins[b]![key], `${option.code} bin ${b} ${key}`);
        });
        close(option.annualKwh, round(ref.annualKwh, 1), `${option.code} annualKwh`);
        close(option.lineCurrentA, round(ref.peakCurrent, 2), `${option.code} lineCurrentA`);
        close(option.kvaReduction, round(baseline.peakKva - ref.peakKva, 3), `${option.code} kvaReduction`);
        const savings = baseline.annualCost - ref.annualCost;
        const rate = 0.08;
        const flows = savingsCashFlows(ref.capex, savings, option.lifeYears, 0.02);
        const lcc = lifeCycleCost(ref.capex, ref.annualCost, option.lifeYears, rate, 0.02);
        close(option.capex, roundMoney(ref.capex), `${option.code} capex`);
        close(option.savingsCost, roundMoney(savings), `${option.code} savingsCost`);
        close(option.npv, roundMoney(netPresentValue(rate, flows)), `${option.code} npv`);
        close(option.lifeCycleCost, roundMoney(lcc), `${option.code} lifeCycleCost`);
        close(option.equivalentAnnualCost, roundMoney(lcc * capitalRecoveryFactor(rate, option.lifeYears)), `${option.code} equivalentAnnualCost`);
        if (option.code === 'keep') return;
        const simple = simplePaybackYears(ref.capex, savings);
        const discounted = discountedPaybackYears(rate, flows);
        const irr = savings > 0 ? internalRateOfReturn(flows) : null;
        close(option.simplePaybackYears, simple === null ? null : round(simple, 2), `${option.code} simplePaybackYears`);
        close(option.discountedPaybackYears, discounted === null ? null : round(discounted, 2), `${option.code} discountedPaybackYears`);
        close(option.irr, irr === null ? null : round(irr, 4), `${option.code} irr`);
      });
      const best = result.options.find((option) => option.code === result.recommended.code)!;
      if (result.recommended.code !== 'keep') {
        if (!result.recommended.reason.includes(`highest NPV, ${best.npv.toFixed(0)} EUR over ${best.lifeYears} years at 8 %/a; saves ${best.savingsCost.toFixed(0)} EUR and ${best.savingsKwh.toFixed(0)} kWh a year`)) {
          mismatches.push(`reason: ${result.recommended.reason}`);
        }
      }
    }
    expect(mismatches.slice(0, 5)).toEqual([]);
  }, 60_000);

  it("gives the same figures with detail 'totals', only without the per-bin objects", () => {
    for (const motor of set.slice(0, 100)) {
      const full = assess(motor, site);
      const totals = assess(motor, site, undefined, undefined, { detail: 'totals' });
      expect(totals.options.every((option) => option.bins.length === 0)).toBe(true);
      const strip = (result: AssessResult) => ({ ...result, baseline: { ...result.baseline, bins: [] }, options: result.options.map((option) => ({ ...option, bins: [] })) });
      expect(totals).toEqual(strip(full));
    }
  }, 60_000);
});
