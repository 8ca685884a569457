/**
 * Global setup of the end-to-end tests: the client built, a throwaway PostgreSQL with the demo
 * seeded, the mail catcher and the app on free loopback ports — the same pieces `npm start` runs.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { createApp } from '../../server/app.js';
import { buildClientIfStale } from '../../server/lib/client-build.js';
import { loadConfig } from '../../server/lib/config.js';
import { connectDatabase } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { startMailCatcher } from '../../server/lib/mail-catcher.js';
import { createMailer } from '../../server/lib/mail.js';
import { migrator, seeder } from '../../server/lib/migrator.js';
import { startCluster } from '../../server/lib/postgres-cluster.js';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    e2eDatabaseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  setLogLevel('warn');
  const config = loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 'e2e-secret-e2e-secret' });
  buildClientIfStale(config.clientDir);
  const dataDir = mkdtempSync(join(tmpdir(), 'statorline-e2e-'));
  const cluster = await startCluster({ dataDir, port: 50000 + Math.floor(Math.random() * 5000), throwaway: true });
  await cluster.ensureDatabase('statorline_e2e');
  const url = cluster.url('statorline_e2e');
  const sequelize = connectDatabase(url);
  await migrator(sequelize).up();
  await seeder(sequelize).up();
  const catcher = await startMailCatcher(0);
  const mailer = createMailer({ catcherPort: catcher.port, from: config.mailFrom });
  const { app, close } = createApp({ config, databaseUrl: url, mailer });
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', () => resolve()));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  project.provide('baseUrl', baseUrl);
  project.provide('e2eDatabaseUrl', url);
  return async () => {
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    mailer.close();
    await catcher.close();
    await close();
    await sequelize.close();
    await cluster.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
}
