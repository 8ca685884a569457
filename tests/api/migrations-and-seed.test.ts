import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import type { Sequelize } from 'sequelize';
import { connectDatabase } from '../../server/lib/database.js';
import { migrator, seeder } from '../../server/lib/migrator.js';
import { setLogLevel } from '../../server/lib/logger.js';

// A database of its own, so running migrations down does not disturb the other API tests.
const DATABASE = 'statorline_migrations';
let sequelize: Sequelize;

async function tableNames(): Promise<string[]> {
  const [rows] = await sequelize.query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`);
  return (rows as Array<{ tablename: string }>).map((row) => row.tablename);
}

beforeAll(async () => {
  setLogLevel('silent');
  const admin = new pg.Client({ connectionString: inject('clusterUrl') });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${DATABASE}`);
  await admin.query(`CREATE DATABASE ${DATABASE}`);
  await admin.end();
  sequelize = connectDatabase(inject('clusterUrl').replace(/\/postgres$/, `/${DATABASE}`));
});
afterAll(async () => sequelize.close());

describe('migrations', () => {
  it('run up, down to nothing, and up again', async () => {
    const umzug = migrator(sequelize);
    await umzug.up();
    const afterUp = await tableNames();
    expect(afterUp).toEqual(expect.arrayContaining(['organizations', 'users', 'session', 'sites', 'motors', 'import_batches', 'audit_logs', 'outbox_messages']));
    await umzug.down({ to: 0 });
    expect((await tableNames()).filter((name) => name !== 'schema_migrations')).toEqual([]);
    await umzug.up();
    expect(await tableNames()).toEqual(afterUp);
  });
});

describe('demo seed', () => {
  it('inserts the invented scenario and its down removes only its own rows', async () => {
    await sequelize.query(`INSERT INTO organizations (name, slug, created_at, updated_at) VALUES ('Someone Else', 'someone-else', now(), now())`);
    const umzug = seeder(sequelize);
    await umzug.up();
    const [[counts]] = (await sequelize.query(`
      SELECT (SELECT count(*) FROM organizations) AS organizations,
             (SELECT count(*) FROM users) AS users,
             (SELECT count(*) FROM sites s JOIN organizations o ON o.id = s.organization_id WHERE o.slug = 'kestrel-valley-foods') AS kestrel_sites,
             (SELECT count(*) FROM motors m JOIN organizations o ON o.id = m.organization_id WHERE o.slug = 'kestrel-valley-foods') AS kestrel_motors,
             (SELECT min(rated_power_kw) FROM motors) AS smallest,
             (SELECT max(rated_power_kw) FROM motors) AS largest`)) as unknown as [[Record<string, number>]];
    expect(counts).toMatchObject({ organizations: 3, users: 5, kestrel_sites: 3 });
    expect(counts.kestrel_motors).toBeGreaterThanOrEqual(140);
    expect(counts.kestrel_motors).toBeLessThanOrEqual(160);
    expect(counts.smallest).toBeGreaterThanOrEqual(0.37);
    expect(counts.largest).toBeLessThanOrEqual(160);
    const [profiles] = await sequelize.query(`SELECT duty_profile, hours_per_year FROM motors WHERE duty_profile IS NOT NULL`);
    for (const row of profiles as Array<{ duty_profile: Array<{ hours: number }>; hours_per_year: number }>) {
      expect(row.duty_profile.reduce((sum, bin) => sum + bin.hours, 0)).toBe(row.hours_per_year);
    }
    await umzug.down({ to: 0 });
    const [remaining] = await sequelize.query(`SELECT slug FROM organizations`);
    expect(remaining).toEqual([{ slug: 'someone-else' }]);
  });
});
