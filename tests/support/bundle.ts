/**
 * The initial JavaScript of a built client (shared by tests/bench/client.bench.ts and
 * tests/e2e/bundle-size.test.ts): what index.html loads before anything else.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

/** Static import specifiers of a built ES module (`import … from "x"`, `import "x"`, `export … from "x"`), not `import("x")`. */
export function staticImports(code: string): string[] {
  const found = new Set<string>();
  const pattern = /(?:^|[;}\s])(?:import|export)\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']([^"']+\.js)["']/g;
  for (const match of code.matchAll(pattern)) found.add(match[1]!);
  return [...found];
}

/** The initial JavaScript of a built client folder: entry script + modulepreloads + their static imports. */
export function initialScripts(folder: string): string[] {
  const html = readFileSync(join(folder, 'index.html'), 'utf8');
  const roots = [
    // Attribute order and quoting vary with the HTML minifier.
    ...[...html.matchAll(/<script\b[^>]*>/g)].filter((tag) => /\btype=["']?module\b/.test(tag[0])).map((tag) => /\bsrc=["']?([^"' >]+)/.exec(tag[0])?.[1]),
    ...[...html.matchAll(/<link\b[^>]*>/g)].filter((tag) => /\brel=["']?modulepreload\b/.test(tag[0])).map((tag) => /\bhref=["']?([^"' >]+)/.exec(tag[0])?.[1]),
  ]
    .filter((url): url is string => url !== undefined)
    .map((url) => url.replace(/^\//, ''));
  const seen = new Set<string>();
  const queue = [...roots];
  while (queue.length > 0) {
    const file = queue.shift()!;
    if (seen.has(file) || !existsSync(join(folder, file))) continue;
    seen.add(file);
    const directory = file.includes('/') ? file.slice(0, file.lastIndexOf('/') + 1) : '';
    for (const specifier of staticImports(readFileSync(join(folder, file), 'utf8'))) {
      const resolved = specifier.startsWith('./') ? `${directory}${specifier.slice(2)}` : specifier.startsWith('/') ? specifier.slice(1) : specifier;
      queue.push(resolved);
    }
  }
  return [...seen];
}

/** Raw and gzip (node:zlib, default level) sizes of the initial JavaScript of a built client folder [bytes]. */
export function initialJavaScriptSize(folder: string): { files: string[]; raw: number; gzip: number } {
  const files = initialScripts(folder);
  let raw = 0;
  let gzip = 0;
  for (const file of files) {
    const content = readFileSync(join(folder, file));
    raw += content.length;
    gzip += gzipSync(content).length;
  }
  return { files, raw, gzip };
}
