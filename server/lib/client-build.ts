/** Builds the client (quasar build) when dist/spa is missing or older than anything it is built from. */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { projectRoot } from './config.js';
import { logger } from './logger.js';

const CLIENT_SOURCES = ['app', 'calc', 'server/shared', 'index.html', 'quasar.config.ts', 'package-lock.json'];

function newestMtime(path: string): number {
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  return readdirSync(path).reduce((newest, name) => Math.max(newest, newestMtime(join(path, name))), stats.mtimeMs);
}

export function buildClientIfStale(clientDir: string): void {
  const index = join(clientDir, 'index.html');
  const builtAt = existsSync(index) ? statSync(index).mtimeMs : 0;
  const sources = CLIENT_SOURCES.map((path) => join(projectRoot, path)).filter(existsSync);
  if (builtAt > Math.max(...sources.map(newestMtime))) return;
  logger.info('building the client (quasar build)…');
  const build = spawnSync(join(projectRoot, 'node_modules/.bin/quasar'), ['build'], {
    cwd: projectRoot,
    env: { ...process.env, STATORLINE_DIST: relative(projectRoot, clientDir) },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  if (build.status !== 0) throw new Error('The client build failed (see above).');
}
