/**
 * Brings the database up for the start command and the command-line tools: the given DATABASE_URL,
 * or the project's private cluster (created once, started, stopped on exit); then migrations.
 */
import type { Sequelize } from 'sequelize';
import type { Config } from './config.js';
import { connectDatabase } from './database.js';
import { logger } from './logger.js';
import { migrator, seeder } from './migrator.js';
import { startCluster, type RunningCluster } from './postgres-cluster.js';

export const DATABASE_NAME = 'statorline';

export interface OpenDatabase {
  url: string;
  sequelize: Sequelize;
  cluster: RunningCluster | undefined;
  close(): Promise<void>;
}

export async function openDatabase(config: Config, options: { migrate?: boolean; seed?: boolean } = {}): Promise<OpenDatabase> {
  let cluster: RunningCluster | undefined;
  let url = config.databaseUrl;
  if (!url) {
    cluster = await startCluster({ dataDir: config.dataDir, port: config.pgPort });
    await cluster.ensureDatabase(DATABASE_NAME);
    url = cluster.url(DATABASE_NAME);
    logger.info(`PostgreSQL ${cluster.startedHere ? 'started' : 'already running'} on 127.0.0.1:${config.pgPort} (data in ${config.dataDir})`);
  }
  const sequelize = connectDatabase(url);
  await sequelize.authenticate();
  if (options.migrate !== false) {
    const applied = await migrator(sequelize).up();
    if (applied.length > 0) logger.info(`applied ${applied.length} migration(s)`);
  }
  if (options.seed) {
    const seeded = await seeder(sequelize).up();
    if (seeded.length > 0) logger.info(`seeded: ${seeded.map((s) => s.name).join(', ')}`);
  }
  return {
    url,
    sequelize,
    cluster,
    async close() {
      await sequelize.close();
      await cluster?.stop();
    },
  };
}
