import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// The phone reads the Bench API through the shared contract (shared/schema/bench.ts and the DTOs
// beside it): every answer type it names at a call of the API client is imported from shared/,
// so a server change to an answer's shape is a type error on the phone, not a silent mismatch.

const ROOT = path.resolve(import.meta.dirname, '../..');
const FOLDERS = ['src/features/bench', 'src/lib/offline'];

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return sources(p);
    return /\.tsx?$/.test(name) ? [p] : [];
  });
}

/** Each `api.get<T>(…)` (post, put, patch, delete) with the file it stands in and where T comes from. */
function answerTypes(): { file: string; type: string; from: string | null }[] {
  return FOLDERS.flatMap((f) => sources(path.join(ROOT, f))).flatMap((file) => {
    const text = readFileSync(file, 'utf8');
    const from = (name: string) => {
      const m = new RegExp(`import type \\{[^}]*\\b${name}\\b[^}]*\\} from '([^']+)'`).exec(text)
        ?? new RegExp(`import \\{[^}]*\\btype ${name}\\b[^}]*\\} from '([^']+)'`).exec(text);
      return m?.[1] ?? null;
    };
    return [...text.matchAll(/\bapi\.(?:get|post|put|patch|delete)<\s*([A-Za-z_][\w]*)/g)]
      .map((m) => ({ file: path.relative(ROOT, file), type: m[1]!, from: from(m[1]!) }));
  });
}

describe('the Bench client and the shared contract', () => {
  it('types every Bench API answer it reads with a type imported from shared/', () => {
    const found = answerTypes();
    expect(found.length).toBeGreaterThanOrEqual(6); // procedures, versions, vehicles, meters, diagnoses, record, report…
    const handTyped = found.filter((t) => !t.from?.startsWith('@shared/'));
    expect(handTyped, 'answer types not from shared/').toEqual([]);
  });

  it('keeps no answer types of its own beside its queries', () => {
    expect(readdirSync(path.join(ROOT, 'src/features/bench/api'))).not.toContain('types.ts');
  });
});
