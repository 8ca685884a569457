/**
 * `npm test`: the type check of the whole repository (TypeScript strict), then every vitest project
 * (unit, app, api, e2e). Each API and e2e run starts its own throwaway PostgreSQL.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { projectRoot } from '../server/lib/config.js';

const bin = (name: string) => join(projectRoot, 'node_modules/.bin', name);

function step(title: string, command: string, args: string[]): void {
  process.stdout.write(`\n== ${title}\n`);
  const result = spawnSync(command, args, { cwd: projectRoot, stdio: 'inherit' });
  if (result.status !== 0) {
    process.stdout.write(`\n${title} failed (exit ${result.status ?? result.signal}).\n`);
    process.exit(result.status ?? 1);
  }
}

step('Type check (vue-tsc, strict)', bin('vue-tsc'), ['--noEmit', '-p', 'tsconfig.json']);
step('Tests (unit, app, api, e2e)', bin('vitest'), ['run', '--config', 'tests/vitest.config.ts', ...process.argv.slice(2)]);
