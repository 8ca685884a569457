/** Factories for the Retrofit log's API tests: motors, retrofits moved to a status, meter uploads. */
import { Motor, Retrofit, type Organization, type Site } from '../../server/models/index.js';

type Session = { post: (path: string) => import('supertest').Test };

export async function createMotor(organization: Organization, site: Site, overrides: Partial<Motor['_creationAttributes']> = {}) {
  return Motor.create({
    organizationId: organization.id,
    siteId: site.id,
    tag: `P-${Math.random().toString(36).slice(2, 8)}`,
    description: null,
    area: 'Process',
    application: 'pump',
    ratedPowerKw: 20,
    speedRpm: null,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: null,
    efficiencyClass: 'IE1',
    nameplateEfficiencyPct: null,
    powerFactor: null,
    frame: '180L',
    enclosure: null,
    manufacturer: null,
    yearInstalled: null,
    controlMethod: 'direct-on-line',
    hoursPerYear: 6000,
    loadFactor: 0.8,
    dutyProfile: null,
    ...overrides,
  });
}

/** A retrofit put straight into `status` (the workflow itself is tested through the API). */
export async function createRetrofitRow(organization: Organization, motor: Motor, createdBy: number | null, overrides: Partial<Retrofit['_creationAttributes']> = {}) {
  return Retrofit.create({
    organizationId: organization.id,
    motorId: motor.id,
    optionCode: 'ie4',
    source: 'manual',
    jobId: null,
    predictedSavingsKwh: 10_000,
    predictedSavingsCost: '1500',
    capex: '4000',
    npv: '9000',
    currency: 'EUR',
    createdBy,
    statusChangedAt: new Date(),
    ...overrides,
  });
}

export function uploadMeter(session: Session, retrofitId: number, period: 'baseline' | 'reporting', csv: string, fields: Record<string, string> = {}) {
  let request = session.post(`/api/retrofits/${retrofitId}/meter-data`).field('period', period);
  for (const [name, value] of Object.entries(fields)) request = request.field(name, value);
  return request.attach('file', Buffer.from(csv, 'utf8'), { filename: `${period}.csv`, contentType: 'text/csv' });
}

const pad = (value: number) => String(value).padStart(2, '0');
/** `YYYY-MM-DD HH:00` of an hour counted from midnight of `day` (UTC arithmetic, no zone). */
export function hourStamp(day: string, hour: number): string {
  const date = new Date(Date.parse(`${day}T00:00:00Z`) + hour * 3_600_000);
  return `${date.getUTCFullYear()}-${pad(date.getUTCMonth() + 1)}-${pad(date.getUTCDate())} ${pad(date.getUTCHours())}:00`;
}

/** Hourly mean-power CSV: on each day, `runHours[d]` hours at `runningKw` from midnight, the rest at `standbyKw`. */
export function dailyProfileCsv(firstDay: string, runHours: number[], runningKw: number, standbyKw: number): string {
  const lines = ['timestamp,Power [kW]'];
  runHours.forEach((hours, day) => {
    for (let hour = 0; hour < 24; hour += 1) lines.push(`${hourStamp(firstDay, day * 24 + hour)},${hour < hours ? runningKw : standbyKw}`);
  });
  return lines.join('\n');
}
