/** The Sequelize connection and the models bound to it. */
import pg from 'pg';
import { ConnectionError, Sequelize } from 'sequelize';
import { initModels } from '../models/index.js';
import { logger } from './logger.js';

// BIGINT ids and COUNT(*) arrive as strings from pg; every count here fits a JS number.
pg.types.setTypeParser(20, (value) => Number.parseInt(value, 10));

let current: Sequelize | undefined;

/** How long opening a connection may take before the request fails as unavailable [ms]. */
export const CONNECT_TIMEOUT_MS = 10_000;

/** Network errors and SQLSTATEs that mean "the database is not there right now" (stopped, restarting, unreachable), not "the query is wrong". */
const UNAVAILABLE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', '57P01', '57P02', '57P03']);
const UNAVAILABLE_MESSAGE = /Connection terminated|Client has encountered a connection error|Client was closed|connection is closed|timeout exceeded when trying to connect/i;

/**
 * Whether an error (Sequelize's, pg's or the session store's) means the database is unreachable:
 * the API answers those with 503 'unavailable', and the pools reconnect by themselves once it is back.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  if (error instanceof ConnectionError) return true;
  let cause: unknown = error;
  for (let depth = 0; depth < 3 && typeof cause === 'object' && cause !== null; depth += 1) {
    const { code, message } = cause as { code?: unknown; message?: unknown };
    // SQLSTATE class 08: connection exceptions.
    if (typeof code === 'string' && (UNAVAILABLE_CODES.has(code) || /^08[0-9A-Z]{3}$/.test(code))) return true;
    if (typeof message === 'string' && UNAVAILABLE_MESSAGE.test(message)) return true;
    cause = (cause as { parent?: unknown; cause?: unknown }).parent ?? (cause as { cause?: unknown }).cause;
  }
  return false;
}

export function connectDatabase(url: string, options: { poolMax?: number } = {}): Sequelize {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: (sql) => logger.debug(sql),
    pool: { max: options.poolMax ?? 10, min: 0, idle: 10_000, acquire: 15_000 },
    // A database that does not answer fails the request within seconds (503) instead of hanging it.
    dialectOptions: { application_name: 'statorline', connectionTimeoutMillis: CONNECT_TIMEOUT_MS },
  });
  initModels(sequelize);
  current = sequelize;
  return sequelize;
}

export function database(): Sequelize {
  if (!current) throw new Error('The database is not connected yet');
  return current;
}
