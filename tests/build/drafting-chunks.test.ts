import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { DIST, entryKey, readManifest, staticClosure, type Manifest } from './manifest';

// The Bench runs on phones with poor signal: the graph editor (@xyflow/react) and the layout
// engine (elkjs) must never be in what the Bench route loads. Chunks are checked by their
// contents, not only by name, since the bundler may merge modules into shared chunks.
const MARKERS = {
  '@xyflow/react': /react-flow__/,
  elkjs: /org\.eclipse\.elk/,
};

function filesOf(m: Manifest, keys: Iterable<string>): string[] {
  return [...new Set([...keys].map((k) => m[k]!.file).filter((f) => f.endsWith('.js')))];
}

function librariesIn(files: string[]): string[] {
  const found = new Set<string>();
  for (const f of files) {
    const text = readFileSync(path.join(DIST, f), 'utf8');
    for (const [lib, re] of Object.entries(MARKERS)) if (re.test(text)) found.add(lib);
  }
  return [...found].sort();
}

describe('Drafting code stays out of the Bench route', () => {
  it('the entry chunk and the Bench area chunk, with their static imports, contain neither @xyflow/react nor elkjs', () => {
    const m = readManifest();
    const keys = staticClosure(m, entryKey(m));
    staticClosure(m, 'src/features/bench/area.tsx', keys);
    expect(librariesIn(filesOf(m, keys))).toEqual([]);
  });

  it('the markers do find both libraries in the chunks the editor loads, so the check above can fail', () => {
    const m = readManifest();
    const editorKey = 'src/features/drafting/components/editor/editor-page.tsx';
    expect(m[editorKey]).toBeDefined();
    const keys = staticClosure(m, editorKey);
    for (const d of m[editorKey]!.dynamicImports ?? []) staticClosure(m, d, keys);
    expect(librariesIn(filesOf(m, keys))).toEqual(['@xyflow/react', 'elkjs']);
  });

  it('the Drafting list chunk does not statically import the editor or the layout engine', () => {
    const m = readManifest();
    const keys = staticClosure(m, 'src/features/drafting/area.tsx');
    expect(librariesIn(filesOf(m, keys))).toEqual([]);
  });
});
