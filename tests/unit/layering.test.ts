// The folders' rules from DEVELOPERS.md ("The architecture in a page"), read from the import lines.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));

function sourceFiles(folder: string): string[] {
  return readdirSync(path.join(root, folder), { recursive: true, encoding: 'utf8' })
    .filter((name) => /\.(ts|mjs)$/.test(name))
    .map((name) => path.join(folder, name));
}

/** Every module a file imports or re-exports, resolved to a path from the repository root when relative. */
function importsOf(file: string): string[] {
  const text = readFileSync(path.join(root, file), 'utf8');
  const specifiers = [...text.matchAll(/(?:^|\n)\s*(?:import|export)\b[^;]*?\bfrom\s+['"]([^'"]+)['"]/g)].map((match) => match[1]);
  return specifiers.map((specifier) => (specifier.startsWith('.') ? path.relative(root, path.resolve(root, path.dirname(file), specifier)) : specifier));
}

describe('what db/ may import', () => {
  it('finds the import lines it checks', () => {
    // The check below proves nothing if the reader finds no imports at all.
    expect(importsOf('db/schema/coupons.ts')).toEqual(expect.arrayContaining(['drizzle-orm/mysql-core', 'db/schema/enums']));
  });

  it('nothing under db/ imports from src/ or scripts/', () => {
    const reaching = sourceFiles('db').flatMap((file) =>
      importsOf(file)
        .filter((target) => /^(src|scripts)\//.test(target))
        .map((target) => `${file} → ${target}`),
    );
    expect(reaching).toEqual([]);
  });

  it('the enum value lists that islands import pull in no other module', () => {
    expect(importsOf('db/schema/enums.ts')).toEqual([]);
  });
});
