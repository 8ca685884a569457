/**
 * `npm run calc -- <command>`: reads one JSON document on standard input, writes one on standard
 * output. Exit 0 on success; 2 with {"error": {"message", "field"}} on invalid input; 1 on a bug.
 * The commands and their schemas live in calc/commands.ts; calc/README.md documents each.
 */
import { commands } from './commands.js';
import { CalcInputError } from './errors.js';

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

function fail(exitCode: number, message: string, field?: string): never {
  process.stdout.write(`${JSON.stringify({ error: { message, field: field ?? null } })}\n`);
  process.exit(exitCode);
}

async function main(): Promise<void> {
  const name = process.argv[2];
  const command = name === undefined ? undefined : commands[name];
  if (!command) fail(2, `unknown command "${name ?? ''}"; one of: ${Object.keys(commands).join(', ')}`, 'command');
  let input: unknown;
  try {
    input = JSON.parse(await readStdin());
  } catch {
    fail(2, 'standard input is not one JSON document', '');
  }
  try {
    const output = command.run(input);
    process.stdout.write(`${JSON.stringify(output)}\n`);
  } catch (error) {
    if (error instanceof CalcInputError) fail(2, error.message, error.field);
    throw error;
  }
}

await main();
