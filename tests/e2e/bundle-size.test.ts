/**
 * A cheap guard on the client's size (issue 10): the JavaScript index.html loads before anything
 * else (entry, modulepreloads and what they import statically) stays under 400 kB gzipped. The e2e
 * setup has just built dist/spa; lazy routes and charts are not counted. `npm run bench -- client`
 * prints the same figure with the largest chunks and the time to interactive.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/lib/config.js';
import { initialJavaScriptSize, staticImports } from '../support/bundle.js';

const BUDGET_BYTES_GZ = 400 * 1024;

describe('client bundle', () => {
  it('loads at most 400 kB of gzipped JavaScript before the first screen', () => {
    const folder = loadConfig({ NODE_ENV: 'test' }).clientDir;
    expect(existsSync(join(folder, 'index.html'))).toBe(true);
    const initial = initialJavaScriptSize(folder);
    expect(initial.files.length).toBeGreaterThan(0);
    expect(initial.files.some((file) => /apexcharts/i.test(file))).toBe(false);
    expect(initial.gzip, `initial JS ${(initial.gzip / 1024).toFixed(1)} kB gz in ${initial.files.join(', ')}`).toBeLessThanOrEqual(BUDGET_BYTES_GZ);
  });

  it('follows static imports only, not import()', () => {
    expect(staticImports('import{a as b}from"./vendor-1.js";import"./side.js";export{c}from"./re.js";const p=import("./lazy.js")')).toEqual([
      './vendor-1.js',
      './side.js',
      './re.js',
    ]);
  });
});
