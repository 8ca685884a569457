/**
 * `npm run bench`: runs every tests/bench/*.bench.ts in its own process, one after another (so each
 * measures its own peak memory on an otherwise idle core), and prints what each prints.
 * `npm run bench -- calc` runs only the files whose name contains "calc".
 */
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const benchDir = fileURLToPath(new URL('.', import.meta.url));
const filter = process.argv[2] ?? '';
const files = readdirSync(benchDir)
  .filter((name) => name.endsWith('.bench.ts') && name.includes(filter))
  .sort();

let failed = 0;
for (const file of files) {
  process.stdout.write(`\n== ${file}\n`);
  const run = spawnSync(process.execPath, ['--import', 'tsx', `${benchDir}${file}`], { stdio: 'inherit' });
  if (run.status !== 0) {
    failed += 1;
    process.stdout.write(`!! ${file} exited with ${run.status ?? run.signal}\n`);
  }
}
process.stdout.write(`\n${files.length - failed} benchmarks ran, ${failed} failed\n`);
process.exit(failed === 0 ? 0 : 1);
