/**
 * Builds calc's `assess` input from a register motor: the motor's nameplate and duty, its site's
 * supply and tariff, the organisation's price book and assumptions, and the part-load curve of the
 * motor's linked BLDC design. Used by the quick study "from a register motor" and by the screening.
 *
 * What is not known stays out of the input, so calc defaults it in one place and lists it among the
 * result's assumptions (running hours: the site's defaultHoursPerYear, then the assumptions', then
 * calc's; load factor: the assumptions', then calc's).
 */
import type { PartLoadCurve } from '../../calc/contracts.js';
import type { AssessInput, MotorInput, SiteInput } from '../../calc/assess/schema.js';
import type { BldcDesign, Motor, Site } from '../models/index.js';
import type { StoredAssessSettings } from '../settings/service.js';

/** The curve of a design that can stand for the motor's BLDC option, or null (infeasible, none). */
export function designCurve(design: BldcDesign): PartLoadCurve | null {
  const curve = design.result.partLoadCurve;
  if (!design.result.feasible || !curve || curve.points.length < 2) return null;
  return { ...curve, source: `BLDC design #${design.id} "${design.name}": ${curve.source}` };
}

/** calc's site input from a site row. Time-of-use bands {name, pricePerKwh, shareOfHoursPct} → {period, pricePerKwh, hoursShare}. */
export function siteInput(site: Site): SiteInput {
  const input: SiteInput = {
    name: site.name,
    voltageV: site.voltageV,
    energyPricePerKwh: Number(site.energyPricePerKwh),
    demandChargePerKwMonth: Number(site.demandChargePerKwMonth),
    currency: site.currency,
    co2KgPerKwh: site.co2KgPerKwh,
    defaultHoursPerYear: site.defaultHoursPerYear,
  };
  if (site.frequencyHz === 50 || site.frequencyHz === 60) input.frequencyHz = site.frequencyHz;
  const bands = (site.timeOfUse ?? []).filter((band) => band.shareOfHoursPct > 0);
  if (bands.length > 0) {
    input.timeOfUse = bands.map((band) => ({ period: band.name, pricePerKwh: band.pricePerKwh, hoursShare: band.shareOfHoursPct / 100 }));
  }
  return input;
}

/** calc's motor input from a register motor; null fields are left out (calc defaults them). */
export function motorInput(motor: Motor, bldcCurve: PartLoadCurve | null): MotorInput {
  const input: MotorInput = { ratedPowerKw: motor.ratedPowerKw, tag: motor.tag };
  const optional: Partial<MotorInput> = {
    description: motor.description ?? undefined,
    area: motor.area ?? undefined,
    application: motor.application,
    speedRpm: motor.speedRpm ?? undefined,
    poles: [2, 4, 6, 8].includes(motor.poles) ? (motor.poles as 2 | 4 | 6 | 8) : undefined,
    voltageV: motor.voltageV,
    frequencyHz: motor.frequencyHz === 50 || motor.frequencyHz === 60 ? motor.frequencyHz : undefined,
    ratedCurrentA: motor.ratedCurrentA ?? undefined,
    efficiencyClass: motor.efficiencyClass,
    nameplateEfficiencyPct: motor.nameplateEfficiencyPct ?? undefined,
    powerFactor: motor.powerFactor ?? undefined,
    frame: motor.frame ?? undefined,
    controlMethod: motor.controlMethod,
    hoursPerYear: motor.hoursPerYear ?? undefined,
    loadFactor: motor.loadFactor ?? undefined,
    dutyProfile: motor.dutyProfile && motor.dutyProfile.length > 0 ? motor.dutyProfile.map((bin) => ({ fraction: bin.fraction, hours: bin.hours })) : undefined,
    rewinds: motor.rewinds,
    yearInstalled: motor.yearInstalled ?? undefined,
    bldcCurve: bldcCurve ?? undefined,
  };
  for (const [key, value] of Object.entries(optional)) {
    if (value !== undefined) (input as Record<string, unknown>)[key] = value;
  }
  return input;
}

/** The whole assess input of a register motor, and where each part came from. */
export function assessInputForMotor(
  motor: Motor,
  site: Site,
  settings: StoredAssessSettings,
  design: BldcDesign | null,
): { input: AssessInput; sources: string[]; bldcDesignId: number | null } {
  const curve = design ? designCurve(design) : null;
  const input: AssessInput = { motor: motorInput(motor, curve), site: siteInput(site) };
  if (settings.priceBook) input.priceBook = settings.priceBook;
  if (settings.assumptions) input.assumptions = settings.assumptions;
  const sources = [
    `motor: register motor ${motor.tag} (#${motor.id})`,
    `site: ${site.name} — ${input.site.timeOfUse ? 'time-of-use tariff' : 'flat energy price'}, demand charge, CO2 factor, default hours`,
    settings.priceBook ? 'price book: the organisation’s settings (missing parts: calc defaults)' : 'price book: calc defaults (none stored in Settings)',
    settings.assumptions ? 'assumptions: the organisation’s settings (missing ones: calc defaults)' : 'assumptions: calc defaults (none stored in Settings)',
    curve ? `BLDC options: part-load curve of linked design #${design!.id}` : design ? `BLDC options: generic model (linked design #${design.id} is not feasible)` : 'BLDC options: generic permanent-magnet model (no linked design)',
  ];
  return { input, sources, bldcDesignId: curve ? design!.id : null };
}
