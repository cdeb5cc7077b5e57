/**
 * The engine runs in browsers and workers: nothing in shared/src outside src/cli/ may use a Node API
 * (style.md, "The shape of the repository"). Scans the non-test sources for Node imports and globals.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const src = fileURLToPath(new URL('.', import.meta.url));

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) {
      if (relative(src, p) === 'cli') continue;
      out.push(...sources(p));
    } else if (name.endsWith('.ts') && !name.endsWith('.test.ts')) out.push(p);
  }
  return out;
}

const FORBIDDEN: [RegExp, string][] = [
  [/from\s+['"]node:/, "import from 'node:…'"],
  [/import\(\s*['"]node:/, "dynamic import of 'node:…'"],
  [/from\s+['"](fs|path|os|child_process|url|util|crypto|worker_threads|process)(\/[^'"]*)?['"]/, 'import of a Node built-in module'],
  [/require\(/, 'require()'],
  [/\bprocess\./, 'process.*'],
  [/\b__dirname\b|\b__filename\b/, '__dirname / __filename'],
  [/\bBuffer\./, 'Buffer'],
  [/reference\s+types=["']node["']/, 'Node type reference'],
];

describe('shared/src outside src/cli/ is free of Node APIs', () => {
  it('no node: imports, fs/path/… imports, process., require(), Buffer or Node type references', () => {
    const files = sources(src);
    expect(files.length).toBeGreaterThan(20);
    const hits: string[] = [];
    for (const f of files) {
      const text = readFileSync(f, 'utf8');
      for (const [re, what] of FORBIDDEN) {
        const lines = text.split('\n');
        lines.forEach((line, k) => {
          if (re.test(line)) hits.push(`${relative(src, f)}:${k + 1}: ${what}: ${line.trim()}`);
        });
      }
    }
    expect(hits).toEqual([]);
  });
});
