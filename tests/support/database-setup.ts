/**
 * Global setup of the API tests: a throwaway PostgreSQL cluster in a temporary folder (never the
 * demo data), one migrated database, torn down afterwards. With DATABASE_URL set (a CI that runs
 * its own server) a fresh database is created on that server instead.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { connectDatabase } from '../../server/lib/database.js';
import { migrator } from '../../server/lib/migrator.js';
import { startCluster } from '../../server/lib/postgres-cluster.js';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    clusterUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const dataDir = mkdtempSync(join(tmpdir(), 'statorline-test-'));
  const port = 55000 + Math.floor(Math.random() * 5000);
  const cluster = await startCluster({ dataDir, port, throwaway: true });
  await cluster.ensureDatabase('statorline_test');
  const url = cluster.url('statorline_test');
  const sequelize = connectDatabase(url);
  await migrator(sequelize).up();
  await sequelize.close();
  project.provide('databaseUrl', url);
  project.provide('clusterUrl', cluster.url('postgres'));
  return async () => {
    await cluster.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
}
