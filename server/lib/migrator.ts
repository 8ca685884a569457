/**
 * Schema migrations and demo seeders, both run by umzug against the Sequelize query interface.
 * Two storages with distinct model names, or seeders would be recorded as migrations and re-run.
 * Stored names drop the file extension so runs from .ts (tsx) and compiled .js agree.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug, type MigrationFn } from 'umzug';
import { projectRoot } from './config.js';

export type Migration = MigrationFn<QueryInterface>;

interface MigrationModule {
  up: Migration;
  down: Migration;
}

function migrationsFrom(folder: string) {
  const directory = join(projectRoot, folder);
  return readdirSync(directory)
    .filter((file) => /^\d{14}-[a-z0-9-]+\.(ts|js)$/.test(file))
    .sort()
    .map((file) => {
      const path = join(directory, file);
      const load = async () => (await import(pathToFileURL(path).href)) as MigrationModule;
      return {
        name: file.replace(/\.(ts|js)$/, ''),
        up: async ({ context }: { context: QueryInterface }) => (await load()).up({ name: file, context }),
        down: async ({ context }: { context: QueryInterface }) => (await load()).down({ name: file, context }),
      };
    });
}

function quiet() {
  return { info: () => {}, warn: () => {}, error: () => {}, debug: () => {} };
}

export function migrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: migrationsFrom('migrations'),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, modelName: 'SchemaMigration', tableName: 'schema_migrations' }),
    logger: quiet(),
  });
}

export function seeder(sequelize: Sequelize) {
  return new Umzug({
    migrations: migrationsFrom('seeders'),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, modelName: 'SeedRun', tableName: 'seed_runs' }),
    logger: quiet(),
  });
}
