import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type * as PicturesModule from '../../src/lib/offline/pictures';
import type * as DbModule from '../../src/lib/offline/db';

// The phone's picture kit on an in-memory IndexedDB (fake-indexeddb); only fetch is replaced.

let pictures: typeof PicturesModule;
let db: typeof DbModule;
const asked: string[] = [];
let failing = new Set<string>();

beforeEach(async () => {
  globalThis.indexedDB = new IDBFactory();
  vi.resetModules();
  asked.length = 0;
  failing = new Set();
  vi.stubGlobal('fetch', async (url: string) => {
    asked.push(url);
    const id = url.split('/')[3]!;
    if (failing.has(id)) return new Response('gone', { status: 503 });
    return new Response(new Blob([new Uint8Array(id.length * 100)], { type: 'image/webp' }), { status: 200 });
  });
  db = await import('../../src/lib/offline/db');
  pictures = await import('../../src/lib/offline/pictures');
});
afterEach(() => vi.unstubAllGlobals());

const documentWith = (...perStep: string[][]) => ({ steps: perStep.map((ids, i) => ({ id: `s${i}`, pictures: ids.map((id) => ({ id, caption: id })) })) });

describe('reference pictures kept on the phone', () => {
  it('names each picture of a document once, in step order, and ignores steps without pictures', () => {
    expect(pictures.pictureIdsOf({ steps: [{ id: 'a' }, ...documentWith(['p1', 'p2'], ['p2', 'p3']).steps] })).toEqual(['p1', 'p2', 'p3']);
    expect(pictures.pictureIdsOf(null)).toEqual([]);
  });

  it('fetches the phone rendition of each picture it does not hold yet, and never twice', async () => {
    const doc = documentWith(['p1', 'p2']);
    expect(await pictures.keepPictures(doc)).toBe(2);
    expect(asked).toEqual(['/api/pictures/p1/phone', '/api/pictures/p2/phone']);
    expect(await pictures.keepPictures(documentWith(['p2', 'p3']))).toBe(1);
    expect(asked.at(-1)).toBe('/api/pictures/p3/phone');
    expect((await pictures.getLocalPicture('p1'))?.bytes).toBe(200);
  });

  it('a picture the server did not give is left for the next refresh, and the others are kept', async () => {
    failing.add('p1');
    expect(await pictures.keepPictures(documentWith(['p1', 'p2']))).toBe(1);
    expect(await pictures.getLocalPicture('p1')).toBeUndefined();
    failing.clear();
    expect(await pictures.keepPictures(documentWith(['p1', 'p2']))).toBe(1);
    expect(await pictures.getLocalPicture('p1')).toBeDefined();
  });

  it("counts the pictures' bytes in the kit's size beside the kept versions", async () => {
    const version = { id: 'v1', slug: 'no-spark', title: 'No spark', number: 1, document: documentWith(['p1', 'p22']) };
    await db.saveVersion(version as unknown as Parameters<typeof db.saveVersion>[0]); // only its JSON size matters here
    await pictures.keepPictures(version.document);
    const size = await pictures.kitSize();
    expect(size.versions).toBe(1);
    expect(size.pictures).toBe(2);
    expect(size.bytes).toBe(new Blob([JSON.stringify(version)]).size + 200 + 300);
  });
});
