/**
 * Runs the examples of calc/README.md so the documentation cannot drift from the code.
 * Format: a line `<!-- example: COMMAND -->`, then a ```json input block, then a ```json block
 * with the expected output (a subset: fields not listed are not compared).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { commands } from '../../../calc/commands.js';

const readme = readFileSync(new URL('../../../calc/README.md', import.meta.url), 'utf8');
const examplePattern = /<!-- example: ([\w-]+) -->\s*```json\n([\s\S]*?)```\s*```json\n([\s\S]*?)```/g;
const examples = [...readme.matchAll(examplePattern)].map((match) => ({
  command: match[1] ?? '',
  input: JSON.parse(match[2] ?? 'null') as unknown,
  expected: JSON.parse(match[3] ?? 'null') as unknown,
}));

/** Deep subset comparison; numbers agree within 0.1 % relative (or 1e-9 absolute near zero). */
function expectSubset(actual: unknown, expected: unknown, path: string): void {
  if (typeof expected === 'number') {
    expect(typeof actual, path).toBe('number');
    const tolerance = Math.max(Math.abs(expected) * 1e-3, 1e-9);
    expect(Math.abs((actual as number) - expected), `${path}: ${String(actual)} vs ${expected}`).toBeLessThanOrEqual(tolerance);
  } else if (Array.isArray(expected)) {
    expect(Array.isArray(actual), path).toBe(true);
    expected.forEach((item, index) => expectSubset((actual as unknown[])[index], item, `${path}[${index}]`));
  } else if (expected !== null && typeof expected === 'object') {
    expect(actual !== null && typeof actual === 'object', path).toBe(true);
    for (const [key, value] of Object.entries(expected)) {
      expectSubset((actual as Record<string, unknown>)[key], value, `${path}.${key}`);
    }
  } else {
    expect(actual, path).toEqual(expected);
  }
}

describe('calc/README.md examples', () => {
  it('documents at least one example per command', () => {
    const documented = new Set(examples.map((example) => example.command));
    for (const name of Object.keys(commands)) expect(documented.has(name), `example for ${name}`).toBe(true);
  });

  it.each(examples.map((example, index) => [index, example] as const))('example %i runs as documented', (_index, example) => {
    const command = commands[example.command];
    expect(command, `command ${example.command}`).toBeDefined();
    expectSubset(command?.run(example.input), example.expected, example.command);
  });
});
