/**
 * Demo scenario (invented): Kestrel Valley Foods with three sites and about 150 motors, one user
 * per role; and Larkspur Ceramics, a second organisation. `down` deletes only these organisations
 * (their users, sites and motors go with them by cascade).
 */
import type { QueryInterface } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';
import { hashPassword } from '../server/lib/passwords.js';
import { DEMO_PASSWORD, generateMotors, kestrelSites, larkspurSite, organizations, users, type DemoSite } from './demo/kestrel-valley.js';

const SLUGS = organizations.map((organization) => organization.slug);

async function insertReturningIds(queryInterface: QueryInterface, table: string, rows: Record<string, unknown>[]): Promise<number[]> {
  const inserted = (await queryInterface.bulkInsert(table, rows, { returning: ['id'] } as object)) as unknown as Array<{ id: number }>;
  return inserted.map((row) => row.id);
}

function siteRow(site: DemoSite, organizationId: number, now: Date) {
  return {
    organization_id: organizationId,
    name: site.name,
    code: site.code,
    location: site.location,
    voltage_v: site.voltageV,
    frequency_hz: site.frequencyHz,
    energy_price_per_kwh: site.energyPricePerKwh,
    time_of_use: JSON.stringify(site.timeOfUse),
    demand_charge_per_kw_month: site.demandChargePerKwMonth,
    currency: site.currency,
    co2_kg_per_kwh: site.co2KgPerKwh,
    default_hours_per_year: site.defaultHoursPerYear,
    created_at: now,
    updated_at: now,
  };
}

export const up: Migration = async ({ context: queryInterface }) => {
  const now = new Date();
  const organizationIds = await insertReturningIds(
    queryInterface,
    'organizations',
    organizations.map((organization) => ({ name: organization.name, slug: organization.slug, created_at: now, updated_at: now })),
  );
  const idOf = (key: string) => organizationIds[organizations.findIndex((organization) => organization.key === key)] as number;

  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await queryInterface.bulkInsert(
    'users',
    users.map((user) => ({
      organization_id: idOf(user.organization),
      email: user.email,
      name: user.name,
      role: user.role,
      status: 'active',
      password_hash: passwordHash,
      created_at: now,
      updated_at: now,
    })),
  );

  const plan: Array<{ site: DemoSite; organizationId: number; seed: number }> = [
    ...kestrelSites.map((site, index) => ({ site, organizationId: idOf('kestrel'), seed: 1701 + index })),
    { site: larkspurSite, organizationId: idOf('larkspur'), seed: 9001 },
  ];
  const siteIds = await insertReturningIds(queryInterface, 'sites', plan.map(({ site, organizationId }) => siteRow(site, organizationId, now)));
  const motorRows = plan.flatMap(({ site, organizationId, seed }, index) =>
    generateMotors(site, seed).map((motor) => ({
      organization_id: organizationId,
      site_id: siteIds[index],
      tag: motor.tag,
      description: motor.description,
      area: motor.area,
      application: motor.application,
      rated_power_kw: motor.ratedPowerKw,
      speed_rpm: motor.speedRpm,
      poles: motor.poles,
      voltage_v: motor.voltageV,
      frequency_hz: motor.frequencyHz,
      rated_current_a: motor.ratedCurrentA,
      efficiency_class: motor.efficiencyClass,
      nameplate_efficiency_pct: motor.nameplateEfficiencyPct,
      power_factor: motor.powerFactor,
      frame: motor.frame,
      enclosure: motor.enclosure,
      manufacturer: motor.manufacturer,
      year_installed: motor.yearInstalled,
      rewinds: motor.rewinds,
      control_method: motor.controlMethod,
      hours_per_year: motor.hoursPerYear,
      load_factor: motor.loadFactor,
      duty_profile: motor.dutyProfile ? JSON.stringify(motor.dutyProfile) : null,
      status: 'in-service',
      created_at: now,
      updated_at: now,
    })),
  );
  await queryInterface.bulkInsert('motors', motorRows);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.bulkDelete('organizations', { slug: SLUGS });
};
