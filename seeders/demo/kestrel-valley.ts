/**
 * The demo scenario (invented): "Kestrel Valley Foods" with a dairy plant, a cold store and a
 * wastewater works, about 150 motors; and "Larkspur Ceramics", a small second organisation that
 * shows isolation. Motors come from a seeded generator, so every run gives the same register.
 */
export const DEMO_PASSWORD = 'statorline-demo';

export interface DemoSite {
  key: string;
  name: string;
  code: string;
  location: string;
  voltageV: number;
  frequencyHz: 50 | 60;
  energyPricePerKwh: number;
  timeOfUse: Array<{ name: string; pricePerKwh: number; shareOfHoursPct: number }>;
  demandChargePerKwMonth: number;
  currency: string;
  co2KgPerKwh: number;
  defaultHoursPerYear: number;
  areas: string[];
  motorCount: number;
  /** Share of each application among the site's motors. */
  mix: Partial<Record<Application, number>>;
}

type Application = 'fan' | 'pump' | 'compressor' | 'conveyor' | 'mixer' | 'other';

export interface DemoMotor {
  siteKey: string;
  tag: string;
  description: string;
  area: string;
  application: Application;
  ratedPowerKw: number;
  speedRpm: number;
  poles: number;
  voltageV: number;
  frequencyHz: number;
  ratedCurrentA: number;
  efficiencyClass: 'IE1' | 'IE2' | 'IE3' | 'IE4' | 'unknown';
  nameplateEfficiencyPct: number | null;
  powerFactor: number;
  frame: string | null;
  enclosure: string;
  manufacturer: string | null;
  yearInstalled: number;
  rewinds: number;
  controlMethod: 'direct-on-line' | 'throttle-valve' | 'outlet-damper' | 'inlet-vanes' | 'variable-speed-drive';
  hoursPerYear: number;
  loadFactor: number | null;
  dutyProfile: Array<{ fraction: number; hours: number }> | null;
}

export const organizations = [
  { key: 'kestrel', name: 'Kestrel Valley Foods', slug: 'kestrel-valley-foods' },
  { key: 'larkspur', name: 'Larkspur Ceramics', slug: 'larkspur-ceramics' },
] as const;

export const users = [
  { organization: 'kestrel', email: 'admin@kestrel.example', name: 'Ada Brannock', role: 'admin' },
  { organization: 'kestrel', email: 'engineer@kestrel.example', name: 'Emeka Lindqvist', role: 'engineer' },
  { organization: 'kestrel', email: 'approver@kestrel.example', name: 'Priya Holloway', role: 'approver' },
  { organization: 'kestrel', email: 'viewer@kestrel.example', name: 'Tomas Ferrand', role: 'viewer' },
  { organization: 'larkspur', email: 'admin@larkspur.example', name: 'Ines Carrow', role: 'admin' },
] as const;

export const kestrelSites: DemoSite[] = [
  {
    key: 'dairy',
    name: 'Kestrel Valley Dairy',
    code: 'KVD',
    location: 'Riverside industrial estate, unit 4',
    voltageV: 400,
    frequencyHz: 50,
    energyPricePerKwh: 0.158,
    timeOfUse: [
      { name: 'Day', pricePerKwh: 0.184, shareOfHoursPct: 55 },
      { name: 'Night', pricePerKwh: 0.126, shareOfHoursPct: 45 },
    ],
    demandChargePerKwMonth: 6.4,
    currency: 'EUR',
    co2KgPerKwh: 0.23,
    defaultHoursPerYear: 6200,
    areas: ['Milk reception', 'Pasteurisation', 'Cheese hall', 'CIP station', 'Boiler house', 'Packing'],
    motorCount: 58,
    mix: { pump: 0.4, fan: 0.15, compressor: 0.1, conveyor: 0.15, mixer: 0.15, other: 0.05 },
  },
  {
    key: 'cold-store',
    name: 'Kestrel Valley Cold Store',
    code: 'KVC',
    location: 'North ring road, distribution park',
    voltageV: 460,
    frequencyHz: 60,
    energyPricePerKwh: 0.142,
    timeOfUse: [],
    demandChargePerKwMonth: 9.1,
    currency: 'EUR',
    co2KgPerKwh: 0.23,
    defaultHoursPerYear: 8400,
    areas: ['Engine room', 'Freezer chambers', 'Chill dock', 'Condenser deck', 'Dispatch'],
    motorCount: 44,
    mix: { compressor: 0.25, fan: 0.45, pump: 0.15, conveyor: 0.1, other: 0.05 },
  },
  {
    key: 'wastewater',
    name: 'Kestrel Valley Wastewater Works',
    code: 'KVW',
    location: 'Mill lane, beside the river weir',
    voltageV: 400,
    frequencyHz: 50,
    energyPricePerKwh: 0.149,
    timeOfUse: [],
    demandChargePerKwMonth: 5.8,
    currency: 'EUR',
    co2KgPerKwh: 0.23,
    defaultHoursPerYear: 8000,
    areas: ['Inlet works', 'Aeration lanes', 'Clarifiers', 'Sludge treatment', 'Final effluent'],
    motorCount: 50,
    mix: { pump: 0.55, fan: 0.25, mixer: 0.15, other: 0.05 },
  },
];

export const larkspurSite: DemoSite = {
  key: 'kiln',
  name: 'Larkspur Kiln Works',
  code: 'LKW',
  location: 'Clay pit road',
  voltageV: 400,
  frequencyHz: 50,
  energyPricePerKwh: 0.171,
  timeOfUse: [],
  demandChargePerKwMonth: 4.2,
  currency: 'EUR',
  co2KgPerKwh: 0.23,
  defaultHoursPerYear: 5000,
  areas: ['Kiln 1', 'Slip house'],
  motorCount: 6,
  mix: { fan: 0.5, mixer: 0.3, conveyor: 0.2 },
};

/** A small deterministic generator (mulberry32), so the demo is the same on every machine. */
export function generator(seed: number) {
  let state = seed >>> 0;
  const next = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    pick<T>(items: readonly T[]): T {
      return items[Math.floor(next() * items.length)] as T;
    },
    between(low: number, high: number) {
      return low + (high - low) * next();
    },
  };
}

const RATINGS_KW = [0.37, 0.55, 0.75, 1.1, 1.5, 2.2, 3, 4, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 132, 160];

/** Typical rating ranges per application [kW]. */
const RANGE_BY_APPLICATION: Record<Application, [number, number]> = {
  fan: [0.37, 110],
  pump: [0.55, 160],
  compressor: [5.5, 160],
  conveyor: [0.37, 11],
  mixer: [0.75, 37],
  other: [0.37, 15],
};

/** Frame for a 50 Hz totally enclosed fan-cooled motor by rating and poles (EN 50347 practice). */
const FRAMES: Array<[number, Record<number, string>]> = [
  [0.37, { 2: '71M', 4: '71M', 6: '80M' }],
  [0.55, { 2: '71M', 4: '80M', 6: '80M' }],
  [0.75, { 2: '80M', 4: '80M', 6: '90S' }],
  [1.1, { 2: '80M', 4: '90S', 6: '90L' }],
  [1.5, { 2: '90S', 4: '90L', 6: '100L' }],
  [2.2, { 2: '90L', 4: '100L', 6: '112M' }],
  [3, { 2: '100L', 4: '100L', 6: '132S' }],
  [4, { 2: '112M', 4: '112M', 6: '132M' }],
  [5.5, { 2: '132S', 4: '132S', 6: '132M' }],
  [7.5, { 2: '132S', 4: '132M', 6: '160M' }],
  [11, { 2: '160M', 4: '160M', 6: '160L' }],
  [15, { 2: '160M', 4: '160L', 6: '180L' }],
  [18.5, { 2: '160L', 4: '180M', 6: '200L' }],
  [22, { 2: '180M', 4: '180L', 6: '200L' }],
  [30, { 2: '200L', 4: '200L', 6: '225M' }],
  [37, { 2: '200L', 4: '225S', 6: '250M' }],
  [45, { 2: '225M', 4: '225M', 6: '280S' }],
  [55, { 2: '250M', 4: '250M', 6: '280M' }],
  [75, { 2: '280S', 4: '280S', 6: '315S' }],
  [90, { 2: '280M', 4: '280M', 6: '315M' }],
  [110, { 2: '315S', 4: '315S', 6: '315M' }],
  [132, { 2: '315M', 4: '315M', 6: '355M' }],
  [160, { 2: '315M', 4: '315M', 6: '355M' }],
];

const DESCRIPTIONS: Record<Application, string[]> = {
  fan: ['Supply air fan', 'Extract fan', 'Evaporator fan', 'Condenser fan', 'Aeration blower', 'Dryer exhaust fan'],
  pump: ['Transfer pump', 'Circulation pump', 'Feed pump', 'Return pump', 'Dosing pump', 'Lift pump'],
  compressor: ['Refrigeration compressor', 'Air compressor', 'Ammonia screw compressor'],
  conveyor: ['Belt conveyor drive', 'Crate conveyor', 'Screw conveyor', 'Pallet conveyor'],
  mixer: ['Tank agitator', 'Batch mixer', 'Anoxic zone mixer', 'Curd vat stirrer'],
  other: ['Homogeniser drive', 'Separator drive', 'Gate actuator drive', 'Screen drive'],
};

const TAG_PREFIX: Record<Application, string> = { fan: 'F', pump: 'P', compressor: 'C', conveyor: 'CV', mixer: 'M', other: 'X' };
const MAKERS = ['Brindlemoor Electric', 'Kelvane Motorworks', 'Drossel & Feld', null, null];

/** Nominal efficiency by rating for an old, unclassified motor (a rough pre-IE1 spread). */
function olderMotorEfficiencyPct(ratedPowerKw: number): number {
  return Math.min(94, 70 + 6.2 * Math.log10(ratedPowerKw * 10) + (ratedPowerKw > 30 ? 1.5 : 0));
}

function pickApplication(random: ReturnType<typeof generator>, mix: DemoSite['mix']): Application {
  const roll = random.next();
  let cumulative = 0;
  for (const [application, share] of Object.entries(mix) as Array<[Application, number]>) {
    cumulative += share;
    if (roll < cumulative) return application;
  }
  return 'other';
}

/** Hours at each flow bin for a variable-demand fan or pump, adding up to `hours`. */
function flowProfile(random: ReturnType<typeof generator>, hours: number): Array<{ fraction: number; hours: number }> {
  const peak = random.pick([0.6, 0.7, 0.8]);
  const fractions = [0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0];
  const weights = fractions.map((fraction) => Math.exp(-(((fraction - peak) / 0.18) ** 2)));
  const total = weights.reduce((sum, weight) => sum + weight, 0);
  const bins = fractions.map((fraction, index) => ({ fraction, hours: Math.round((hours * (weights[index] ?? 0)) / total) }));
  const drift = hours - bins.reduce((sum, bin) => sum + bin.hours, 0);
  const largest = bins.reduce((best, bin) => (bin.hours > best.hours ? bin : best));
  largest.hours += drift;
  return bins.filter((bin) => bin.hours > 0);
}

export function generateMotors(site: DemoSite, seed: number): DemoMotor[] {
  const random = generator(seed);
  const motors: DemoMotor[] = [];
  const counters = new Map<string, number>();
  for (let index = 0; index < site.motorCount; index += 1) {
    const application = pickApplication(random, site.mix);
    const [low, high] = RANGE_BY_APPLICATION[application];
    const ratings = RATINGS_KW.filter((rating) => rating >= low && rating <= high);
    // Small motors are more common than large ones in any plant.
    const ratedPowerKw = ratings[Math.floor(random.next() ** 1.6 * ratings.length)] ?? low;
    const poles = application === 'fan' && ratedPowerKw > 30 ? random.pick([4, 6]) : application === 'pump' ? random.pick([2, 4, 4]) : random.pick([4, 4, 4, 6, 2]);
    const synchronousRpm = (120 * site.frequencyHz) / poles;
    const slip = 0.06 - 0.012 * Math.log10(ratedPowerKw * 10);
    const speedRpm = Math.round(synchronousRpm * (1 - slip));
    const yearInstalled = Math.round(random.between(1989, 2023));
    const efficiencyClass: DemoMotor['efficiencyClass'] =
      yearInstalled < 2000 ? 'unknown' : yearInstalled < 2011 ? random.pick(['IE1', 'IE1', 'unknown']) : yearInstalled < 2017 ? 'IE2' : random.pick(['IE2', 'IE3', 'IE3']);
    const nameplateEfficiencyPct = efficiencyClass === 'unknown' && random.next() < 0.5 ? Math.round(olderMotorEfficiencyPct(ratedPowerKw) * 10) / 10 : null;
    const powerFactor = Math.round((0.72 + 0.05 * Math.log10(ratedPowerKw * 10) + random.between(-0.02, 0.02)) * 100) / 100;
    const efficiency = (nameplateEfficiencyPct ?? olderMotorEfficiencyPct(ratedPowerKw) + 2) / 100;
    const ratedCurrentA = Math.round(((ratedPowerKw * 1000) / (Math.sqrt(3) * site.voltageV * efficiency * powerFactor)) * 10) / 10;
    const variableDemand = application === 'fan' || application === 'pump';
    const controlMethod: DemoMotor['controlMethod'] = !variableDemand
      ? random.next() < 0.15 ? 'variable-speed-drive' : 'direct-on-line'
      : application === 'pump'
        ? random.pick(['throttle-valve', 'throttle-valve', 'direct-on-line', 'variable-speed-drive'])
        : random.pick(['outlet-damper', 'inlet-vanes', 'direct-on-line', 'variable-speed-drive']);
    const hoursPerYear = Math.min(8760, Math.round(site.defaultHoursPerYear * random.between(0.55, 1.05) / 10) * 10);
    const useProfile = variableDemand && controlMethod !== 'direct-on-line';
    const prefix = `${site.code.slice(2)}-${TAG_PREFIX[application]}`;
    const number = (counters.get(prefix) ?? 100) + 1;
    counters.set(prefix, number);
    const frameRow = FRAMES.find(([rating]) => rating >= ratedPowerKw);
    motors.push({
      siteKey: site.key,
      tag: `${prefix}-${number}`,
      description: random.pick(DESCRIPTIONS[application]),
      area: random.pick(site.areas),
      application,
      ratedPowerKw,
      speedRpm,
      poles,
      voltageV: site.voltageV,
      frequencyHz: site.frequencyHz,
      ratedCurrentA,
      efficiencyClass,
      nameplateEfficiencyPct,
      powerFactor,
      frame: frameRow ? (frameRow[1][poles] ?? null) : null,
      enclosure: random.next() < 0.9 ? 'IP55' : 'IP23',
      manufacturer: random.pick(MAKERS),
      yearInstalled,
      rewinds: yearInstalled < 2005 ? Math.floor(random.between(0, 3)) : 0,
      controlMethod,
      hoursPerYear,
      loadFactor: useProfile ? null : Math.round(random.between(0.45, 0.9) * 100) / 100,
      dutyProfile: useProfile ? flowProfile(random, hoursPerYear) : null,
    });
  }
  return motors;
}
