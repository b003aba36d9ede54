import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import path from 'node:path';

export interface ManifestChunk { file: string; src?: string; isEntry?: boolean; imports?: string[]; dynamicImports?: string[]; css?: string[] }
export type Manifest = Record<string, ManifestChunk>;

export const DIST = path.resolve('dist');

export function readManifest(): Manifest {
  return JSON.parse(readFileSync(path.join(DIST, '.vite/manifest.json'), 'utf8')) as Manifest;
}

/** The chunk keys a module pulls in through static imports, itself included. */
export function staticClosure(manifest: Manifest, key: string, seen = new Set<string>()): Set<string> {
  if (seen.has(key)) return seen;
  seen.add(key);
  for (const imp of manifest[key]?.imports ?? []) staticClosure(manifest, imp, seen);
  return seen;
}

export function gzipBytes(file: string): number {
  return gzipSync(readFileSync(path.join(DIST, file)), { level: 9 }).length;
}

export function entryKey(manifest: Manifest): string {
  const key = Object.keys(manifest).find((k) => manifest[k]!.isEntry && k.endsWith('index.html'));
  if (!key) throw new Error('no index.html entry in the manifest');
  return key;
}
