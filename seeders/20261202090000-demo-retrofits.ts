/**
 * Demo scenario (invented): five retrofits of Kestrel Valley Foods across the Retrofit log's
 * lifecycle, on different motors of its three sites — one proposed, one approved, one ordered (its
 * installation still to come), one installed with baseline and reporting meter data (so the
 * retrofit's page and the Overview show realised savings), and one verified with its frozen figures.
 *
 * Everything is made the way the product makes it, so the demo shows what a user would see:
 * - the predicted figures are calc's `assess` of the register motor, with the input the server
 *   builds for the Quick study and the "Propose a retrofit" dialog (server/studies/motor-input.ts);
 * - the meter data are invented CSV text (a deterministic generator, no Math.random) parsed by the
 *   upload's own parser and stored as `uploadMeterData` stores them;
 * - the verified retrofit's frozen savings come from the real verification (verification.ts).
 *
 * Every date is relative to the seeding day, so the demo stays current: nothing is overdue (the
 * proposal waits 6 days, the order's installation is due in 24 days).
 *
 * `down` deletes only these retrofits: Kestrel's retrofits whose notes start with DEMO_NOTE_MARKER
 * (their events and meter data go with them by cascade).
 */
import type { QueryInterface, Transaction } from 'sequelize';
import { assess, type OptionResult } from '../calc/assess/assess.js';
import type { Migration } from '../server/lib/migrator.js';
import type { Motor, Site } from '../server/models/index.js';
import { parseMeterCsv } from '../server/retrofits/meter-csv.js';
import { verifySavings, type PeriodData } from '../server/retrofits/verification.js';
import { installedEquipment, type InstalledEquipment, type MeterPoint, type RetrofitStatus } from '../server/shared/retrofit.js';
import type { StoredAssessSettings } from '../server/settings/service.js';
import { assessInputForMotor } from '../server/studies/motor-input.js';
// The demo register's deterministic generator (mulberry32), so the meter data are the same everywhere.
import { generator } from './demo/kestrel-valley.js';

const KESTREL_SLUG = 'kestrel-valley-foods';
/** Every seeded retrofit's notes start with this; `down` finds them by it. */
export const DEMO_NOTE_MARKER = 'Demo retrofit (invented). ';
const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;

interface MeterPlan {
  /** First metered day, in days before the seeding day. */
  fromDaysAgo: number;
  days: number;
  intervalMinutes: 15 | 60;
  /** Hour of day the motor starts [h]; it then runs the day's hours. */
  startHour: number;
  /** Run hours on a weekday and on a weekend day [h], varied a little by the generator. */
  weekdayHours: [number, number];
  weekendHours: [number, number];
  /** A meter outage: [day index, first hour, hours] left out of the file. */
  outage?: [number, number, number];
  seed: number;
}

interface RetrofitPlan {
  key: string;
  siteCode: string;
  tag: string;
  optionCode: string;
  status: RetrofitStatus;
  /** Days before the seeding day of each transition, in lifecycle order, from 'proposed'. */
  timeline: Partial<Record<RetrofitStatus, number>>;
  comments: Partial<Record<RetrofitStatus, string>>;
  notes: string;
  orderDaysAgo?: number;
  /** Negative: in the future. */
  expectedInstallationDaysAgo?: number;
  installationDaysAgo?: number;
  actualCapexFactor?: number;
  rebateShare?: number;
  installer?: string;
  baseline?: MeterPlan;
  reporting?: MeterPlan;
  /** Share of the predicted savings the reporting period's metered power realises [-]. */
  realisedShare?: number;
}

const LIFECYCLE: RetrofitStatus[] = ['proposed', 'approved', 'ordered', 'installed', 'verified'];

/**
 * The plan. None of them is a wastewater pump of 7.5–45 kW: the Retrofit log's end-to-end test
 * proposes one of those that has no retrofit.
 */
export const DEMO_RETROFITS: RetrofitPlan[] = [
  {
    key: 'verified',
    siteCode: 'KVC',
    tag: 'C-F-109',
    optionCode: 'bldc-vsd',
    status: 'verified',
    timeline: { proposed: 150, approved: 143, ordered: 140, installed: 100, verified: 30 },
    comments: {
      proposed: 'Inlet vanes throttle this exhaust fan most of its hours; a drive and a permanent-magnet motor would set the airflow instead.',
      approved: 'Approved. Fit it at the next planned stop of the condenser deck.',
      ordered: 'Ordered with the drive; lead time five weeks.',
      installed: 'Installed; inlet vanes locked fully open.',
      verified: 'Three weeks of reporting data confirm the savings; verified.',
    },
    notes: 'Condenser deck exhaust fan. Meter: the fan’s own sub-meter on the MCC, hourly export.',
    orderDaysAgo: 140,
    expectedInstallationDaysAgo: 104,
    installationDaysAgo: 100,
    actualCapexFactor: 1.07,
    rebateShare: 0.15,
    installer: 'Marlow & Pike Electrical',
    baseline: { fromDaysAgo: 128, days: 21, intervalMinutes: 60, startHour: 4, weekdayHours: [15, 18], weekendHours: [12, 14], seed: 4101 },
    reporting: { fromDaysAgo: 60, days: 21, intervalMinutes: 60, startHour: 4, weekdayHours: [15, 18], weekendHours: [12, 14], outage: [9, 13, 3], seed: 4102 },
    realisedShare: 0.94,
  },
  {
    key: 'installed',
    siteCode: 'KVD',
    tag: 'D-P-116',
    optionCode: 'bldc-vsd',
    status: 'installed',
    timeline: { proposed: 95, approved: 90, ordered: 88, installed: 45 },
    comments: {
      proposed: 'This circulation pump runs against a half-closed valve; a drive would set the flow instead.',
      approved: 'Approved; keep the valve as a bypass for the first month.',
      ordered: 'Ordered from the framework supplier.',
      installed: 'Installed and commissioned; valve left fully open.',
    },
    notes: 'Packing hall circulation pump. Meter: clamp-on logger at the motor starter, 15-minute mean power.',
    orderDaysAgo: 88,
    expectedInstallationDaysAgo: 48,
    installationDaysAgo: 45,
    actualCapexFactor: 1.04,
    installer: 'Ridgeline Electrical Services',
    baseline: { fromDaysAgo: 80, days: 14, intervalMinutes: 15, startHour: 5, weekdayHours: [14, 17], weekendHours: [6, 9], seed: 5101 },
    reporting: { fromDaysAgo: 22, days: 21, intervalMinutes: 15, startHour: 5, weekdayHours: [14, 17], weekendHours: [6, 9], seed: 5102 },
    realisedShare: 0.88,
  },
  {
    key: 'ordered',
    siteCode: 'KVW',
    tag: 'W-F-111',
    optionCode: 'bldc-vsd',
    status: 'ordered',
    timeline: { proposed: 40, approved: 34, ordered: 20 },
    comments: {
      proposed: 'Old IE1 fan on inlet vanes running most of the year: a large saving for the works.',
      approved: 'Approved; plan the changeover with the operations team.',
      ordered: 'Ordered; the supplier confirmed delivery in three weeks.',
    },
    notes: 'Inlet works fan.',
    orderDaysAgo: 20,
    expectedInstallationDaysAgo: -24,
    baseline: { fromDaysAgo: 17, days: 14, intervalMinutes: 60, startHour: 0, weekdayHours: [19, 22], weekendHours: [19, 22], seed: 6101 },
  },
  {
    key: 'approved',
    siteCode: 'KVC',
    tag: 'C-C-105',
    optionCode: 'ie5',
    status: 'approved',
    timeline: { proposed: 12, approved: 5 },
    comments: {
      proposed: 'This refrigeration compressor motor runs almost all year; an IE5 motor on the same frame.',
      approved: 'Approved; order it with the next maintenance parts.',
    },
    notes: 'Chill dock refrigeration compressor.',
  },
  {
    key: 'proposed',
    siteCode: 'KVD',
    tag: 'D-F-107',
    optionCode: 'bldc-vsd',
    status: 'proposed',
    timeline: { proposed: 6 },
    comments: { proposed: 'IE1 supply air fan throttled by inlet vanes; the assessment pays back in under a year.' },
    notes: 'CIP station supply air fan.',
  },
];

const pad = (value: number) => String(value).padStart(2, '0');
const isoDay = (ms: number) => {
  const date = new Date(ms);
  return `${date.getUTCFullYear()}-${pad(date.getUTCMonth() + 1)}-${pad(date.getUTCDate())}`;
};

/**
 * Invented meter CSV of one period: mean power per interval [kW]. Each day the motor starts at
 * `startHour` and runs the day's hours (more on weekdays), at `runningKw` shaped by the time of day
 * (a little more in the afternoon), the day's demand (±6 %) and a ripple (±4 %); stopped, the meter reads a standby of about
 * 1 % of the rating.
 */
export function demoMeterCsv(plan: MeterPlan, todayMs: number, runningKw: number, ratedPowerKw: number): string {
  const random = generator(plan.seed).next;
  const lines = ['timestamp,Power [kW]'];
  const first = todayMs - plan.fromDaysAgo * DAY_MS;
  const perHour = 60 / plan.intervalMinutes;
  for (let day = 0; day < plan.days; day += 1) {
    const dayMs = first + day * DAY_MS;
    const weekday = new Date(dayMs).getUTCDay();
    const [low, high] = weekday === 0 || weekday === 6 ? plan.weekendHours : plan.weekdayHours;
    const runHours = Math.round((low + (high - low) * random()) * 4) / 4;
    // The day's demand (flow, chamber load) moves the running power a few per cent from day to day.
    const dayLevel = 1 + 0.06 * (2 * random() - 1);
    for (let step = 0; step < 24 * perHour; step += 1) {
      const hour = step / perHour;
      const ripple = 2 * random() - 1;
      if (plan.outage && plan.outage[0] === day && hour >= plan.outage[1] && hour < plan.outage[1] + plan.outage[2]) continue;
      const running = hour >= plan.startHour && hour < plan.startHour + runHours;
      const kw = running
        ? runningKw * dayLevel * (1 + 0.05 * Math.sin((2 * Math.PI * (hour - 9)) / 24)) * (1 + 0.04 * ripple)
        : ratedPowerKw * 0.01 * (1 + 0.1 * ripple);
      const stamp = new Date(dayMs + hour * HOUR_MS);
      lines.push(`${isoDay(stamp.getTime())} ${pad(stamp.getUTCHours())}:${pad(stamp.getUTCMinutes())},${kw.toFixed(3)}`);
    }
  }
  return `${lines.join('\n')}\n`;
}

interface MotorRow {
  id: number;
  siteId: number;
  tag: string;
  ratedPowerKw: number;
  hoursPerYear: number | null;
  bldcDesignId: number | null;
  efficiencyClass: string;
  frame: string | null;
}

async function select<T>(queryInterface: QueryInterface, sql: string, replacements: Record<string, unknown>, transaction: Transaction): Promise<T[]> {
  const [rows] = await queryInterface.sequelize.query(sql, { replacements, transaction });
  return rows as T[];
}

/** The columns of `motors` and `sites` under the model's attribute names, as the server's models read them. */
const MOTOR_COLUMNS = `id, organization_id AS "organizationId", site_id AS "siteId", tag, description, area, application,
  rated_power_kw AS "ratedPowerKw", speed_rpm AS "speedRpm", poles, voltage_v AS "voltageV", frequency_hz AS "frequencyHz",
  rated_current_a AS "ratedCurrentA", efficiency_class AS "efficiencyClass", nameplate_efficiency_pct AS "nameplateEfficiencyPct",
  power_factor AS "powerFactor", frame, control_method AS "controlMethod", hours_per_year AS "hoursPerYear", load_factor AS "loadFactor",
  duty_profile AS "dutyProfile", rewinds, year_installed AS "yearInstalled", bldc_design_id AS "bldcDesignId", status`;
const SITE_COLUMNS = `id, name, code, voltage_v AS "voltageV", frequency_hz AS "frequencyHz", energy_price_per_kwh AS "energyPricePerKwh",
  time_of_use AS "timeOfUse", demand_charge_per_kw_month AS "demandChargePerKwMonth", currency, co2_kg_per_kwh AS "co2KgPerKwh",
  default_hours_per_year AS "defaultHoursPerYear"`;

const money = (value: number) => (Math.round(value * 100) / 100).toFixed(2);

function equipmentOf(plan: RetrofitPlan, motor: MotorRow, option: OptionResult): InstalledEquipment {
  const efficiencyPct = Math.round(option.ratedEfficiencyPct * 10) / 10;
  const equipment: InstalledEquipment =
    plan.optionCode === 'bldc-vsd'
      ? {
          motor: { type: 'Permanent-magnet synchronous motor', ratedPowerKw: motor.ratedPowerKw, efficiencyPct, efficiencyClass: 'IE5', ...(motor.frame ? { frame: motor.frame } : {}) },
          drive: { type: 'Variable-speed drive, sensorless', ratedPowerKw: motor.ratedPowerKw, efficiencyPct: 97.6 },
        }
      : { motor: { type: `${plan.optionCode.toUpperCase()} induction motor`, ratedPowerKw: motor.ratedPowerKw, efficiencyPct, efficiencyClass: plan.optionCode.toUpperCase(), ...(motor.frame ? { frame: motor.frame } : {}) } };
  if (plan.installer) equipment.installedBy = plan.installer;
  return installedEquipment.parse(equipment);
}

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.transaction(async (transaction) => {
    const [organization] = await select<{ id: number }>(queryInterface, `SELECT id FROM organizations WHERE slug = :slug`, { slug: KESTREL_SLUG }, transaction);
    // Without the demo organisation (removed by hand) there is nothing to attach the retrofits to.
    if (!organization) return;
    const organizationId = organization.id;
    const users = await select<{ id: number; email: string }>(queryInterface, `SELECT id, email FROM users WHERE organization_id = :organizationId`, { organizationId }, transaction);
    const userId = (email: string) => users.find((user) => user.email === email)?.id ?? null;
    const engineer = userId('engineer@kestrel.example');
    const approver = userId('approver@kestrel.example');
    const [settingsRow] = await select<{ priceBook: StoredAssessSettings['priceBook'] | null; assumptions: StoredAssessSettings['assumptions'] | null }>(
      queryInterface,
      `SELECT price_book AS "priceBook", assumptions FROM organization_settings WHERE organization_id = :organizationId`,
      { organizationId },
      transaction,
    );
    // As storedAssessSettings reads them.
    const settings: StoredAssessSettings = {};
    if (settingsRow?.priceBook) settings.priceBook = settingsRow.priceBook;
    if (settingsRow?.assumptions) settings.assumptions = settingsRow.assumptions;

    const now = new Date();
    const todayMs = Date.parse(`${isoDay(now.getTime())}T00:00:00Z`);
    // A transition at `days` before the seeding day, in the working day (09:00 + a few minutes per retrofit).
    const at = (days: number, index: number) => new Date(todayMs - days * DAY_MS + 9 * HOUR_MS + index * 17 * 60_000);

    for (const [index, plan] of DEMO_RETROFITS.entries()) {
      const [site] = await select<Site & { id: number }>(queryInterface, `SELECT ${SITE_COLUMNS} FROM sites WHERE organization_id = :organizationId AND code = :code`, { organizationId, code: plan.siteCode }, transaction);
      if (!site) throw new Error(`demo retrofits: site ${plan.siteCode} is missing`);
      const [motor] = await select<Motor & MotorRow>(
        queryInterface,
        `SELECT ${MOTOR_COLUMNS} FROM motors WHERE organization_id = :organizationId AND site_id = :siteId AND tag = :tag`,
        { organizationId, siteId: site.id, tag: plan.tag },
        transaction,
      );
      if (!motor) throw new Error(`demo retrofits: motor ${plan.tag} is missing`);
      // The demo register links no BLDC design; a linked one would need its stored result here.
      if (motor.bldcDesignId !== null) throw new Error(`demo retrofits: motor ${plan.tag} has a linked BLDC design; the seeder assesses without one`);
      const { input } = assessInputForMotor(motor, site, settings, null);
      const result = assess(input.motor, input.site, input.priceBook, input.assumptions);
      const option = result.options.find((entry) => entry.code === plan.optionCode);
      const keep = result.options.find((entry) => entry.code === 'keep');
      if (!option || !keep) throw new Error(`demo retrofits: ${plan.tag} has no option ${plan.optionCode}`);
      const currency = result.currency ?? site.currency;
      const hoursPerYear = motor.hoursPerYear ?? site.defaultHoursPerYear;

      const reached = LIFECYCLE.slice(0, LIFECYCLE.indexOf(plan.status) + 1);
      const created = at(plan.timeline.proposed!, index);
      const changed = at(plan.timeline[plan.status]!, index);
      const installedOrLater = reached.includes('installed');
      const capex = Math.max(0, option.capex);
      const row: Record<string, unknown> = {
        organization_id: organizationId,
        motor_id: motor.id,
        option_code: plan.optionCode,
        status: plan.status,
        source: 'manual',
        job_id: null,
        predicted_savings_kwh: Math.max(0, option.savingsKwh),
        predicted_savings_cost: money(Math.max(0, option.savingsCost)),
        capex: money(capex),
        npv: money(option.npv),
        currency,
        created_by: engineer,
        // One version per transition, as PATCH /api/retrofits/:id counts them.
        version: reached.length - 1,
        order_date: plan.orderDaysAgo === undefined ? null : isoDay(todayMs - plan.orderDaysAgo * DAY_MS),
        expected_installation_date: plan.expectedInstallationDaysAgo === undefined ? null : isoDay(todayMs - plan.expectedInstallationDaysAgo * DAY_MS),
        installation_date: plan.installationDaysAgo === undefined ? null : isoDay(todayMs - plan.installationDaysAgo * DAY_MS),
        actual_capex: installedOrLater && plan.actualCapexFactor ? money(capex * plan.actualCapexFactor) : null,
        rebate_received: plan.rebateShare ? money(capex * plan.rebateShare) : null,
        installed_equipment: installedOrLater ? JSON.stringify(equipmentOf(plan, motor, option)) : null,
        notes: `${DEMO_NOTE_MARKER}${plan.notes}`,
        status_changed_at: changed,
        verification_method: 'B',
        independent_variable: null,
        stipulated_hours_per_year: null,
        verified_savings_kwh: null,
        verified_uncertainty_kwh: null,
        created_at: created,
        updated_at: changed,
      };
      const [inserted] = (await queryInterface.bulkInsert('retrofits', [row], { returning: ['id'], transaction } as object)) as unknown as Array<{ id: number }>;
      const retrofitId = inserted!.id;

      await queryInterface.bulkInsert(
        'retrofit_events',
        reached.map((status, step) => ({
          organization_id: organizationId,
          retrofit_id: retrofitId,
          from_status: step === 0 ? null : reached[step - 1],
          to_status: status,
          user_id: status === 'approved' ? approver : engineer,
          comment: plan.comments[status] ?? null,
          created_at: at(plan.timeline[status]!, index),
        })),
        { transaction },
      );

      // Mean input power while running, before and after [kW]: the assessment's annual energy over
      // the running hours; after, the predicted saving realised at `realisedShare`.
      const beforeKw = keep.annualKwh / hoursPerYear;
      const afterKw = beforeKw - ((plan.realisedShare ?? 0) * option.savingsKwh) / hoursPerYear;
      const periods: Partial<Record<'baseline' | 'reporting', PeriodData>> = {};
      for (const [period, meter, kw] of [
        ['baseline', plan.baseline, beforeKw],
        ['reporting', plan.reporting, afterKw],
      ] as const) {
        if (!meter) continue;
        const csv = demoMeterCsv(meter, todayMs, kw, motor.ratedPowerKw);
        const parsed = parseMeterCsv(csv, { register: 'interval' });
        if (parsed.errors.length > 0 || parsed.unit === null) throw new Error(`demo retrofits: ${plan.tag} ${period} meter data: ${parsed.errors[0]?.message ?? 'no unit'}`);
        periods[period] = { points: parsed.points, scope: 'motor', variableName: parsed.variableName, gaps: parsed.gaps.length };
        // As uploadMeterData stores an accepted file.
        // Uploaded the day after the period's last day.
        const uploadDay = meter.fromDaysAgo - meter.days;
        await queryInterface.bulkInsert(
          'retrofit_meter_data',
          [
            {
              organization_id: organizationId,
              retrofit_id: retrofitId,
              period,
              unit: parsed.unit,
              register: 'interval',
              scope: 'motor',
              file_name: `${plan.tag}-${period === 'baseline' ? 'before' : 'after'}.csv`,
              variable_name: parsed.variableName,
              utc_offset: parsed.utcOffset,
              interval_minutes: parsed.intervalMinutes,
              rows: parsed.rows,
              points: JSON.stringify(parsed.points satisfies MeterPoint[]),
              gaps: JSON.stringify(parsed.gaps),
              user_id: engineer,
              created_at: new Date(todayMs - Math.max(0, uploadDay) * DAY_MS + 10 * HOUR_MS + index * 60_000),
            },
          ],
          { transaction },
        );
      }

      if (plan.status === 'verified') {
        // Frozen at the 'verified' transition from the real verification, as patchRetrofit does.
        const verification = verifySavings({
          retrofitId,
          method: 'B',
          independentVariable: null,
          ratedPowerKw: motor.ratedPowerKw,
          hoursPerYear: motor.hoursPerYear ?? null,
          predictedSavingsKwh: row.predicted_savings_kwh as number,
          baseline: periods.baseline ?? null,
          reporting: periods.reporting ?? null,
        });
        if (!verification.ready) throw new Error(`demo retrofits: ${plan.tag} cannot be verified: ${verification.missing.join('; ')}`);
        await queryInterface.bulkUpdate(
          'retrofits',
          { verified_savings_kwh: verification.annualSavingsKwh, verified_uncertainty_kwh: verification.uncertaintyKwh },
          { id: retrofitId },
          { transaction },
        );
      }
    }
  });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.sequelize.query(
    `DELETE FROM retrofits WHERE organization_id IN (SELECT id FROM organizations WHERE slug = :slug) AND notes LIKE :marker`,
    { replacements: { slug: KESTREL_SLUG, marker: `${DEMO_NOTE_MARKER.replace(/[\\%_]/g, '\\$&')}%` } },
  );
};
