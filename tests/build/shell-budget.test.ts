import { describe, it, expect } from 'vitest';
import { readManifest, staticClosure, gzipBytes, entryKey } from './manifest';

describe('the app shell bundle', () => {
  it('keeps the entry (React, router, Query, the shell) at most 125 kB gzipped', () => {
    const m = readManifest();
    const keys = staticClosure(m, entryKey(m));
    const total = [...keys].reduce((sum, k) => sum + gzipBytes(m[k]!.file), 0);
    expect(total).toBeLessThanOrEqual(125 * 1024);
  });

  it('loads every area and the signed-out pages as their own lazy chunks', () => {
    const m = readManifest();
    const entry = m[entryKey(m)]!;
    for (const area of ['bench', 'drafting', 'debrief', 'shop']) {
      expect(entry.dynamicImports ?? []).toContain(`src/features/${area}/area.tsx`);
      expect(staticClosure(m, entryKey(m)).has(`src/features/${area}/area.tsx`)).toBe(false);
    }
    expect(entry.dynamicImports ?? []).toContain('src/features/auth/sign-in-page.tsx');
  });

  it('ships the font files itself, so no font is fetched from elsewhere at run time', () => {
    const m = readManifest();
    const css = m[entryKey(m)]!.css ?? [];
    expect(css.length).toBeGreaterThan(0);
  });
});
