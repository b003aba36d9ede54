import { describe, it, expect } from 'vitest';
import { readManifest, staticClosure, gzipBytes, entryKey } from './manifest';

// What a phone downloads to reach the first step of a diagnosis: the entry chunk with its
// static imports, plus the Bench area chunk with its static imports (each file counted once).
describe('the Bench route bundle', () => {
  it('keeps the JavaScript a phone needs to reach the first step at most 170 kB gzipped', () => {
    const m = readManifest();
    const keys = staticClosure(m, entryKey(m));
    staticClosure(m, 'src/features/bench/area.tsx', keys);
    const files = new Set([...keys].map((k) => m[k]!.file).filter((f) => f.endsWith('.js')));
    const total = [...files].reduce((sum, f) => sum + gzipBytes(f), 0);
    console.log(`Bench route JavaScript: ${(total / 1024).toFixed(1)} kB gzipped in ${files.size} files`);
    expect(total).toBeLessThanOrEqual(170 * 1024);
  });

  it('keeps the graph editor and the charts out of the Bench route', () => {
    const m = readManifest();
    const keys = staticClosure(m, 'src/features/bench/area.tsx');
    const sources = [...keys].map((k) => m[k]!.src ?? k).join(' ');
    expect(sources).not.toMatch(/@xyflow|recharts|elkjs/);
  });
});
