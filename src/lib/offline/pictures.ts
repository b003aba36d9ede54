import { benchDb, type LocalPicture } from './db';
import { pictureUrl } from '../pictures/picture-url';

// Reference pictures travel with the versions kept on the phone (IndexedDB `pictures`), in their
// phone rendition: a stored picture never changes, so one kept copy per id is enough.

/** The ids of every picture a document names (any shape: documents are kept as plain JSON). */
export function pictureIdsOf(document: unknown): string[] {
  const steps = (document as { steps?: { pictures?: { id?: unknown }[] }[] } | null)?.steps ?? [];
  return [...new Set(steps.flatMap((s) => (s.pictures ?? []).map((p) => p.id)).filter((id): id is string => typeof id === 'string'))];
}

export async function getLocalPicture(id: string): Promise<LocalPicture | undefined> {
  return (await benchDb()).get('pictures', id);
}

/**
 * Fetches and keeps each picture of a document the phone does not have yet, one at a time (a
 * phone on a weak signal should not open eight downloads at once). A failure leaves the rest for
 * the next time the kit is refreshed. Returns how many were kept now.
 */
export async function keepPictures(document: unknown): Promise<number> {
  const db = await benchDb();
  let kept = 0;
  for (const id of pictureIdsOf(document)) {
    if (await db.getKey('pictures', id)) continue;
    const res = await fetch(pictureUrl(id, 'phone'), { credentials: 'same-origin' });
    if (!res.ok) continue;
    const blob = await res.blob();
    await db.put('pictures', { id, blob, bytes: blob.size, savedAt: new Date().toISOString() });
    kept++;
  }
  return kept;
}

/** What the phone keeps for working without signal: versions, pictures and their size in bytes. */
export interface KitSize { versions: number; pictures: number; bytes: number }

export async function kitSize(): Promise<KitSize> {
  const db = await benchDb();
  const [versions, pictures] = await Promise.all([db.getAll('versions'), db.getAll('pictures')]);
  const versionBytes = versions.reduce((n, v) => n + new Blob([JSON.stringify(v)]).size, 0);
  return { versions: versions.length, pictures: pictures.length, bytes: versionBytes + pictures.reduce((n, p) => n + p.bytes, 0) };
}
