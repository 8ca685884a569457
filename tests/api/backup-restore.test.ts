/**
 * Backup and restore (issue 10, faults): `npm run backup` / `npm run restore` as the user runs them,
 * against DATABASE_URL and against the private cluster of a fresh DATA_DIR. The demo is seeded into a
 * database of its own; its backup restored into a fresh database (and into a fresh private cluster,
 * backed up from there and restored once more) equals the original table by table — row count and the
 * md5 of every row in order — and sequence by sequence. A restore into a database that has tables is
 * refused unless --force, which then replaces it.
 */
import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { projectRoot } from '../../server/lib/config.js';
import { connectDatabase } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { migrator, seeder } from '../../server/lib/migrator.js';

const suffix = randomBytes(4).toString('hex');
const names = { source: `statorline_backup_${suffix}`, fresh: `statorline_restored_${suffix}`, again: `statorline_again_${suffix}`, cut: `statorline_cut_${suffix}` };
let workDir: string;

function urlOf(database: string): string {
  const url = new URL(inject('clusterUrl'));
  url.pathname = `/${database}`;
  return url.toString();
}

interface CommandResult {
  code: number;
  stdout: string;
  stderr: string;
}

/** `npm run <script> -- <args>` with the given environment (DATABASE_URL or DATA_DIR/PG_PORT). */
function npmRun(script: 'backup' | 'restore', args: string[], env: Record<string, string>): Promise<CommandResult> {
  const { DATABASE_URL: _unused, ...inherited } = process.env;
  return new Promise((resolve) => {
    execFile('npm', ['run', '--silent', script, '--', ...args], { cwd: projectRoot, env: { ...inherited, LOG_LEVEL: 'warn', ...env }, timeout: 120_000 }, (error, stdout, stderr) => {
      resolve({ code: error ? ((error as { code?: number }).code ?? 1) : 0, stdout, stderr });
    });
  });
}

async function withClient<T>(database: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: urlOf(database) });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** Every table's row count and md5 of its rows in text order; every sequence's position. */
async function fingerprint(client: pg.Client): Promise<Record<string, string>> {
  const result: Record<string, string> = {};
  const tables = await client.query<{ name: string }>(`SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' ORDER BY 1`);
  for (const { name } of tables.rows) {
    const row = await client.query<{ rows: number; md5: string }>(
      `SELECT count(*)::int AS rows, md5(coalesce(string_agg(t::text, E'\\n' ORDER BY t::text), '')) AS md5 FROM public."${name}" AS t`,
    );
    result[`table ${name}`] = `${row.rows[0]?.rows} rows, md5 ${row.rows[0]?.md5}`;
  }
  const sequences = await client.query<{ name: string; last: string | null }>(`SELECT sequencename AS name, last_value::text AS last FROM pg_sequences WHERE schemaname = 'public'`);
  for (const { name, last } of sequences.rows) result[`sequence ${name}`] = String(last);
  return result;
}

async function admin(sql: string): Promise<void> {
  await withClient('postgres', async (client) => {
    await client.query(sql);
  });
}

let original: Record<string, string>;

beforeAll(async () => {
  setLogLevel('silent');
  workDir = mkdtempSync(join(tmpdir(), 'statorline-backup-'));
  // The private cluster's folder lies inside: as root, its "postgres" user must be able to pass through.
  chmodSync(workDir, 0o711);
  await admin(`CREATE DATABASE ${names.source}`);
  const sequelize = connectDatabase(urlOf(names.source), { poolMax: 2 });
  await migrator(sequelize).up();
  await seeder(sequelize).up();
  await sequelize.close();
  original = await withClient(names.source, fingerprint);
}, 120_000);

afterAll(async () => {
  for (const name of Object.values(names)) await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  if (workDir) rmSync(workDir, { recursive: true, force: true });
}, 60_000);

describe('npm run backup / npm run restore', () => {
  it('backs up the demo and restores it into a fresh database, equal table by table; refuses a non-empty one unless --force', async () => {
    expect(Object.keys(original).filter((key) => key.startsWith('table ')).length).toBeGreaterThan(20);
    expect(original['table motors']).toMatch(/^[1-9]\d* rows/);

    const file = join(workDir, 'demo.dump');
    const started = Date.now();
    const backup = await npmRun('backup', [file], { DATABASE_URL: urlOf(names.source) });
    const backupMs = Date.now() - started;
    expect(backup.stderr).toBe('');
    expect(backup.code).toBe(0);
    expect(backup.stdout).toMatch(/^backed up the database to .*demo\.dump \([\d.]+ [kM]B\) in [\d.]+ s\n$/);
    expect(existsSync(`${file}.partial`)).toBe(false);
    // The password of the URL is handed over in the environment, never on a command line.
    expect(backup.stdout).not.toContain(new URL(inject('clusterUrl')).password);

    await admin(`CREATE DATABASE ${names.fresh}`);
    const restore = await npmRun('restore', [file], { DATABASE_URL: urlOf(names.fresh) });
    expect(restore.stderr).toBe('');
    expect(restore.code).toBe(0);
    expect(restore.stdout).toMatch(new RegExp(`^restored .*demo\\.dump into "${names.fresh}" in [\\d.]+ s\\n$`));
    expect(await withClient(names.fresh, fingerprint)).toEqual(original);

    // Not empty any more: refused, and nothing changes.
    await withClient(names.fresh, (client) => client.query(`UPDATE organizations SET name = name || ' (changed after the restore)'`));
    const changed = await withClient(names.fresh, fingerprint);
    const refused = await npmRun('restore', [file], { DATABASE_URL: urlOf(names.fresh) });
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(new RegExp(`^The database "${names.fresh}" is not empty \\(\\d+ tables and sequences\\); restore refuses to overwrite it\\. Restore into a fresh database \\(or a fresh DATA_DIR\\), or add --force to replace everything in it\\.\\n$`));
    expect(await withClient(names.fresh, fingerprint)).toEqual(changed);

    // --force replaces it, in one transaction.
    const forced = await npmRun('restore', [file, '--force'], { DATABASE_URL: urlOf(names.fresh) });
    expect(forced.stderr).toBe('');
    expect(forced.code).toBe(0);
    expect(forced.stdout).toContain('(replacing what was there)');
    expect(await withClient(names.fresh, fingerprint)).toEqual(original);

    // Not a backup: refused before anything is touched.
    const bogus = await npmRun('restore', [join(projectRoot, 'package.json')], { DATABASE_URL: urlOf(names.fresh) });
    expect(bogus.code).toBe(1);
    expect(bogus.stderr).toContain("is not a backup in pg_dump's custom format");
    const usage = await npmRun('backup', [], { DATABASE_URL: urlOf(names.fresh) });
    expect(usage.code).toBe(2);
    expect(usage.stderr).toContain('Usage: npm run backup -- <file>');

    console.info(`backup of the demo: ${(statSync(file).size / 1024).toFixed(1)} kB in ${backupMs} ms (command wall time, including tsx start); ${backup.stdout.trim()}; ${restore.stdout.trim()}`);
  }, 90_000);

  it('refuses bad arguments and a cut-off backup, leaving the target database as it was', async () => {
    const file = join(workDir, 'demo.dump');
    // A backup cut off part way (a copy interrupted, a full disk): its table of contents at the start is
    // intact, so it reads as a backup, but pg_restore stops at the missing data. None of it may stay.
    const whole = readFileSync(file);
    const cut = join(workDir, 'cut.dump');
    writeFileSync(cut, whole.subarray(0, Math.floor(whole.length * 0.97)));
    await admin(`CREATE DATABASE ${names.cut}`);
    const partial = await npmRun('restore', [cut], { DATABASE_URL: urlOf(names.cut) });
    expect(partial.code).toBe(1);
    expect(partial.stderr).toMatch(/^The restore failed: pg_restore exited 1, psql exited \d+; nothing was changed\./);
    expect(await withClient(names.cut, fingerprint)).toEqual({});

    for (const args of [[], ['--force'], [file, file], [file, '--frce']]) {
      const usage = await npmRun('restore', args, { DATABASE_URL: urlOf(names.cut) });
      expect(usage.code, args.join(' ')).toBe(2);
      expect(usage.stderr).toBe('Usage: npm run restore -- <file> [--force]   (loads a backup; --force replaces a database that is not empty)\n');
    }
    const missing = await npmRun('restore', [join(workDir, 'no-such.dump')], { DATABASE_URL: urlOf(names.cut) });
    expect(missing.code).toBe(1);
    expect(missing.stderr).toBe(`${join(workDir, 'no-such.dump')} does not exist.\n`);
    const extra = await npmRun('backup', [join(workDir, 'one.dump'), join(workDir, 'two.dump')], { DATABASE_URL: urlOf(names.cut) });
    expect(extra.code).toBe(2);
    expect(extra.stderr).toContain('Usage: npm run backup -- <file>');
    expect(existsSync(join(workDir, 'one.dump'))).toBe(false);
    expect(await withClient(names.cut, fingerprint)).toEqual({});
  }, 90_000);

  it('restores into the private cluster of a fresh DATA_DIR, and backs up from it', async () => {
    const file = join(workDir, 'demo.dump');
    const dataDir = join(workDir, 'cluster');
    const cluster = { DATA_DIR: dataDir, PG_PORT: String(56000 + Math.floor(Math.random() * 4000)) };
    const restore = await npmRun('restore', [file], cluster);
    expect(restore.code, restore.stderr).toBe(0);
    expect(restore.stdout).toMatch(/^restored .* into "statorline" in [\d.]+ s\n$/);
    const second = join(workDir, 'from-cluster.dump');
    const backup = await npmRun('backup', [second], cluster);
    expect(backup.code, backup.stderr).toBe(0);
    // The commands stopped the cluster they started.
    expect(existsSync(join(dataDir, 'pg', 'postmaster.pid'))).toBe(false);

    await admin(`CREATE DATABASE ${names.again}`);
    const again = await npmRun('restore', [second], { DATABASE_URL: urlOf(names.again) });
    expect(again.code, again.stderr).toBe(0);
    expect(await withClient(names.again, fingerprint)).toEqual(original);
  }, 90_000);
});
