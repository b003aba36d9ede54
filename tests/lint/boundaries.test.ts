import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { describe, it, expect } from 'vitest';

// The import boundaries of DEVELOPERS.md are enforced by eslint.config.js. Each fixture here is a
// violation (or, allowed.fixture, a use that is fine) linted with ESLint's Node API as if it stood
// at the path its first line names, so the path-resolving rules see it where it would hurt.
const dir = path.join(import.meta.dirname, 'fixtures');
const eslint = new ESLint({ ignore: false });

const fixtures = readdirSync(dir).filter((f) => f.endsWith('.fixture')).map((file) => {
  const code = readFileSync(path.join(dir, file), 'utf8');
  const at = /^\/\/ lint-as: (\S+)/m.exec(code)?.[1];
  const expected = /^\/\/ expect: (\S+)/m.exec(code)?.[1];
  if (!at || !expected) throw new Error(`${file}: name the path with "// lint-as:" and the rule with "// expect:"`);
  return { file, code, at, expected };
});

const rulesOf = (r: ESLint.LintResult) => r.messages.map((m) => m.ruleId ?? m.message);

describe('lint refuses imports across the boundaries', () => {
  it('has fixtures for every boundary', () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(10);
  });

  for (const f of fixtures) {
    it(`${f.file}: ${f.expected === 'nothing' ? 'passes' : `is refused by ${f.expected}`} at ${f.at}`, async () => {
      const [result] = await eslint.lintText(f.code, { filePath: f.at });
      expect(rulesOf(result!)).toEqual(f.expected === 'nothing' ? [] : [f.expected]);
    });
  }

  it('a dependency cycle between two modules is refused in both', async () => {
    const results = await eslint.lintFiles([path.join(dir, 'cycle-a.ts'), path.join(dir, 'cycle-b.ts')]);
    expect(results.map((r) => [path.basename(r.filePath), rulesOf(r)])).toEqual([
      ['cycle-a.ts', ['import-x/no-cycle']], ['cycle-b.ts', ['import-x/no-cycle']],
    ]);
  }, 30_000);
});
