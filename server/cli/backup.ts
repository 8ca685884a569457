/**
 * `npm run backup -- <file>`: the whole database — schema, data, sequences — into one file in
 * pg_dump's custom format (compressed; `npm run restore -- <file>` reads it back). The database is the
 * one `npm start` uses: DATABASE_URL, or else the private cluster under DATA_DIR, which is started for
 * the dump and stopped again if it was not running. The dump is a consistent snapshot, so the server
 * may keep running. It is written beside the target and renamed at the end, so a failed backup never
 * leaves a truncated file under the given name.
 */
import { execFile } from 'node:child_process';
import { existsSync, renameSync, rmSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { openDatabase } from '../lib/bootstrap.js';
import { loadConfig } from '../lib/config.js';
import { ClusterError, POSTGRES_BIN } from '../lib/postgres-cluster.js';

const run = promisify(execFile);

/**
 * How a PostgreSQL client program reaches a database URL: the URL without its password on the
 * command line (which any user can list), the password in PGPASSWORD.
 */
export function clientConnection(url: string): { conninfo: string; env: NodeJS.ProcessEnv } {
  const parsed = new URL(url);
  const password = decodeURIComponent(parsed.password);
  parsed.password = '';
  return { conninfo: parsed.toString(), env: { ...process.env, ...(password ? { PGPASSWORD: password } : {}) } };
}

export function clientBinary(name: 'pg_dump' | 'pg_restore' | 'psql'): string {
  const path = join(POSTGRES_BIN, name);
  if (!existsSync(path)) throw new ClusterError(`${name} was not found in ${POSTGRES_BIN}: install Debian's "postgresql-15" package, or set POSTGRES_BIN.`);
  return path;
}

export function formatBytes(bytes: number): string {
  return bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} kB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

async function main(): Promise<void> {
  const [file, ...extra] = process.argv.slice(2);
  if (!file || file.startsWith('-') || extra.length > 0) {
    process.stderr.write('Usage: npm run backup -- <file>   (writes the database to <file> in pg_dump custom format)\n');
    process.exit(2);
  }
  const target = resolve(file);
  const partial = `${target}.partial`;
  const started = Date.now();
  const database = await openDatabase(loadConfig(), { migrate: false });
  try {
    const { conninfo, env } = clientConnection(database.url);
    await run(clientBinary('pg_dump'), ['--format=custom', '--compress=6', `--file=${partial}`, `--dbname=${conninfo}`], { env, maxBuffer: 16 * 1024 * 1024 });
    renameSync(partial, target);
  } catch (error) {
    rmSync(partial, { force: true });
    throw error;
  } finally {
    await database.close();
  }
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  process.stdout.write(`backed up the database to ${target} (${formatBytes(statSync(target).size)}) in ${seconds} s\n`);
}

// Run only as the command (restore.ts imports the helpers above).
if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((error: unknown) => {
    const failure = error as { stderr?: string; message?: string };
    process.stderr.write(`The backup failed: ${(failure.stderr || failure.message || String(error)).trim()}\n`);
    process.exit(1);
  });
}
