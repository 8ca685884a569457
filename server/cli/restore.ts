/**
 * `npm run restore -- <file> [--force]`: loads a backup made by `npm run backup` into the database
 * `npm start` uses (DATABASE_URL, or else the private cluster under DATA_DIR, created and started if
 * needed — a fresh DATA_DIR gives a fresh cluster). It refuses a database that already has tables
 * unless --force, which replaces everything in its public schema. The whole restore (and, with
 * --force, the removal of what was there) is one transaction: it succeeds entirely or changes nothing.
 * Stop the server first; start it afterwards (it applies any newer migrations).
 */
import { execFile, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { promisify } from 'node:util';
import { QueryTypes } from 'sequelize';
import { openDatabase } from '../lib/bootstrap.js';
import { loadConfig } from '../lib/config.js';
import { clientBinary, clientConnection } from './backup.js';

const run = promisify(execFile);

/** Replaces the public schema inside the restore's transaction (--force). */
const CLEAR_PUBLIC_SCHEMA = 'DROP SCHEMA public CASCADE;\nCREATE SCHEMA public;\n';

class RestoreRefused extends Error {}

/**
 * pg_restore turns the dump into SQL; psql runs it inside one transaction and stops at the first
 * error. The transaction is committed only once pg_restore has exited cleanly: a backup that is cut
 * off or damaged part way still reads as a backup (its table of contents comes first), and psql's own
 * --single-transaction would commit whatever SQL arrived before pg_restore failed.
 */
function restoreInto(url: string, file: string, force: boolean): Promise<void> {
  const { conninfo, env } = clientConnection(url);
  return new Promise((resolvePromise, reject) => {
    const reader = spawn(clientBinary('pg_restore'), ['--no-owner', '--no-privileges', '--file=-', file], { stdio: ['ignore', 'pipe', 'pipe'] });
    const writer = spawn(clientBinary('psql'), ['--no-psqlrc', '--quiet', '--set=ON_ERROR_STOP=1', `--dbname=${conninfo}`], {
      env,
      stdio: ['pipe', 'ignore', 'pipe'],
    });
    let errors = '';
    reader.stderr.on('data', (chunk: Buffer) => (errors += chunk.toString()));
    writer.stderr.on('data', (chunk: Buffer) => (errors += chunk.toString()));
    // psql may stop reading at an error; the pipe then breaks, which the exit codes report.
    writer.stdin.on('error', () => undefined);
    writer.stdin.write(force ? `BEGIN;\n${CLEAR_PUBLIC_SCHEMA}` : 'BEGIN;\n');
    reader.stdout.pipe(writer.stdin, { end: false });
    // 'close' comes after pg_restore's output has ended, so everything it wrote is already in the pipe.
    const readerExit = new Promise<number | null>((done) => reader.once('close', (code) => done(code)));
    void readerExit.then((code) => writer.stdin.end(code === 0 ? 'COMMIT;\n' : 'ROLLBACK;\n'));
    const writerExit = new Promise<number | null>((done) => writer.once('close', (code) => done(code)));
    reader.once('error', reject);
    writer.once('error', reject);
    void Promise.all([readerExit, writerExit]).then(([readerCode, writerCode]) => {
      if (readerCode === 0 && writerCode === 0) resolvePromise();
      else reject(new Error(`pg_restore exited ${readerCode}, psql exited ${writerCode}; nothing was changed.\n${errors.trim()}`));
    });
  });
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const force = args.includes('--force');
  const files = args.filter((arg) => arg !== '--force');
  if (files.length !== 1 || files[0]!.startsWith('-')) {
    process.stderr.write('Usage: npm run restore -- <file> [--force]   (loads a backup; --force replaces a database that is not empty)\n');
    process.exit(2);
  }
  const file = resolve(files[0]!);
  if (!existsSync(file)) throw new RestoreRefused(`${file} does not exist.`);
  try {
    await run(clientBinary('pg_restore'), ['--list', file], { maxBuffer: 64 * 1024 * 1024 });
  } catch {
    throw new RestoreRefused(`${file} is not a backup in pg_dump's custom format (made by npm run backup).`);
  }
  const started = Date.now();
  const database = await openDatabase(loadConfig(), { migrate: false });
  try {
    const [found] = await database.sequelize.query<{ tables: number }>(
      `SELECT count(*)::int AS tables FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
       WHERE c.relkind IN ('r', 'p', 'v', 'm', 'S') AND n.nspname NOT IN ('pg_catalog', 'information_schema') AND n.nspname NOT LIKE 'pg\\_%'`,
      { type: QueryTypes.SELECT },
    );
    const name = await database.sequelize.query<{ name: string }>('SELECT current_database() AS name', { type: QueryTypes.SELECT });
    const databaseName = name[0]?.name ?? '?';
    if ((found?.tables ?? 0) > 0 && !force) {
      throw new RestoreRefused(
        `The database "${databaseName}" is not empty (${found?.tables} tables and sequences); restore refuses to overwrite it. Restore into a fresh database (or a fresh DATA_DIR), or add --force to replace everything in it.`,
      );
    }
    await restoreInto(database.url, file, force);
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    process.stdout.write(`restored ${file} into "${databaseName}"${force && (found?.tables ?? 0) > 0 ? ' (replacing what was there)' : ''} in ${seconds} s\n`);
  } finally {
    await database.close();
  }
}

main().catch((error: unknown) => {
  if (error instanceof RestoreRefused) process.stderr.write(`${error.message}\n`);
  else process.stderr.write(`The restore failed: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
