import { api, ApiError } from '../../../lib/api-client';
import { getVersion, readKit, saveKit, saveVersion } from '../../../lib/offline/db';
import { keepPictures } from '../../../lib/offline/pictures';
import type { BenchProcedure, BenchVersion } from '@shared/schema/bench';

// What a phone needs to start a diagnosis without signal: the published procedures with their
// pinned versions, the shop's machines and its meters, as last fetched with signal.

/** The request never reached the server (no signal). */
export const isOffline = (e: unknown) => e instanceof ApiError && e.isNetwork;

/** Fetches with signal and keeps a copy on the phone; without signal, answers the copy. */
export async function keptOnPhone<T>(key: string, fetcher: () => Promise<T>): Promise<T> {
  try {
    const data = await fetcher();
    await saveKit(key, data).catch(() => undefined); // a phone without IndexedDB still works online
    return data;
  } catch (e) {
    if (!isOffline(e)) throw e;
    const kept = await readKit(key).catch(() => undefined);
    if (!kept) throw e;
    return kept.data as T;
  }
}

/** The latest published version of a procedure, from the server, kept on the phone as well (its pictures follow in the background). */
export async function fetchVersion(slug: string): Promise<BenchVersion> {
  const version = await api.get<BenchVersion>(`/api/bench/procedures/${encodeURIComponent(slug)}`);
  await saveVersion(version);
  void keepPictures(version.document).catch(() => undefined);
  return version;
}

/**
 * Keeps each listed version on the phone with its reference pictures, fetching only what it does
 * not have yet (a picture missed on a weak signal is fetched the next time).
 */
export async function keepVersions(list: readonly BenchProcedure[]): Promise<void> {
  for (const p of list) {
    const kept = await getVersion(p.versionId);
    const version = kept ?? await api.get<BenchVersion>(`/api/bench/procedures/${encodeURIComponent(p.slug)}`);
    if (!kept) await saveVersion(version);
    await keepPictures(version.document);
  }
}

/** The server's filter, on the phone: symptom or title contains the words; ignition system equal. */
export function filterProcedures(list: readonly BenchProcedure[], f: { symptom: string; ignitionSystem: string }): BenchProcedure[] {
  const words = f.symptom.trim().toLowerCase();
  return list.filter((p) => (!words || p.symptom.toLowerCase().includes(words) || p.title.toLowerCase().includes(words))
    && (!f.ignitionSystem || p.ignitionSystem === f.ignitionSystem));
}

