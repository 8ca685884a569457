/** The Sequelize connection and the models bound to it. */
import pg from 'pg';
import { Sequelize } from 'sequelize';
import { initModels } from '../models/index.js';
import { logger } from './logger.js';

// BIGINT ids and COUNT(*) arrive as strings from pg; every count here fits a JS number.
pg.types.setTypeParser(20, (value) => Number.parseInt(value, 10));

let current: Sequelize | undefined;

export function connectDatabase(url: string, options: { poolMax?: number } = {}): Sequelize {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: (sql) => logger.debug(sql),
    pool: { max: options.poolMax ?? 10, min: 0, idle: 10_000, acquire: 15_000 },
    dialectOptions: { application_name: 'statorline' },
  });
  initModels(sequelize);
  current = sequelize;
  return sequelize;
}

export function database(): Sequelize {
  if (!current) throw new Error('The database is not connected yet');
  return current;
}
