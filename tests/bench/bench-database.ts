/**
 * A throwaway PostgreSQL cluster for a benchmark (like tests/support/database-setup.ts): a temporary
 * folder, fsync off, migrated, with one organisation, user and site; removed on `close`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connectDatabase } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { migrator } from '../../server/lib/migrator.js';
import { startCluster } from '../../server/lib/postgres-cluster.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import { Tenant } from '../../server/lib/tenant.js';
import { Organization, User } from '../../server/models/index.js';
import { createSite } from '../support/api.js';

export async function benchDatabase() {
  setLogLevel('silent');
  const dataDir = mkdtempSync(join(tmpdir(), 'statorline-bench-'));
  const port = 50000 + Math.floor(Math.random() * 5000);
  const cluster = await startCluster({ dataDir, port, throwaway: true });
  await cluster.ensureDatabase('statorline_bench');
  const sequelize = connectDatabase(cluster.url('statorline_bench'));
  await migrator(sequelize).up();
  setUploadDir(join(dataDir, 'uploads'));
  const organization = await Organization.create({ name: 'Bench Works', slug: 'bench-works' });
  const user = await User.create({ organizationId: organization.id, email: 'bench@bench.example', name: 'Bench', role: 'engineer', passwordHash: null });
  const site = await createSite(organization, { name: 'Bench site' });
  const tenant = new Tenant({ id: user.id, email: user.email, name: user.name, role: 'engineer', organization: { id: organization.id, name: organization.name } });
  return {
    sequelize,
    organization,
    site,
    tenant,
    async close() {
      await sequelize.close();
      await cluster.stop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;
}
