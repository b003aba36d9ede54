import { memo, useSyncExternalStore } from 'react';
import { sendable, syncStore, type RefusedDiagnosis, type SyncStatus } from '../../../lib/offline/outbox';
import { cx } from '../../../components/ui/cx';
import { AsideList, RefusedCard } from './held-diagnoses';

const count = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The badge's one line. Example: syncLine({ waiting: 0, aside: [one], ... }) === 'All synced · 1 diagnosis set aside on this phone' */
export function syncLine(s: SyncStatus): string {
  const aside = s.aside.length ? ` · ${count(s.aside.length, 'diagnosis', 'diagnoses')} set aside on this phone` : '';
  if (s.waiting === 0) return `All synced${aside}`;
  return `${s.waiting} waiting to sync${s.online ? '' : ' — no signal, kept on this phone'}${aside}`;
}

/** What a refused diagnosis keeps on the phone, in plain words. Example: 'the start and 2 steps' */
export function heldWords(k: RefusedDiagnosis['heldKinds']): string {
  const parts = [k.start ? 'the start' : '', k.step ? count(k.step, 'step') : '', k.photo ? count(k.photo, 'photo') : ''].filter(Boolean);
  return parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts.at(-1)}` : (parts[0] ?? 'nothing');
}

function SyncPill({ s }: { s: SyncStatus }) {
  const synced = s.waiting === 0;
  // A pulse says "sending"; when everything left is held by a refusal nothing is moving.
  const moving = s.online && sendable(s) > 0;
  return (
    <p role="status" data-testid="sync-status" data-synced={synced ? 'yes' : 'no'}
      className={cx('inline-flex min-h-10 items-center gap-2 rounded-full px-3 text-base font-bold', synced ? 'bg-go-soft text-go' : 'bg-signal-soft text-ink')}>
      <span aria-hidden className={cx('h-3 w-3 shrink-0 rounded-full', synced ? 'bg-go' : moving ? 'animate-pulse bg-signal' : 'bg-ink-soft')} />
      {syncLine(s)}
    </p>
  );
}

/**
 * Always on screen: whether every start, step and photo has reached the server, and what to do
 * about a diagnosis the server refused. On a diagnosis screen, `diagnosisId` puts that diagnosis's
 * refusal first and words it as "this diagnosis"; others are named by vehicle and procedure.
 * Memoised: it follows the sync store, so a step screen drawing the next step need not draw it.
 */
export const SyncBadge = memo(function SyncBadge({ diagnosisId }: { diagnosisId?: string }) {
  const s = useSyncExternalStore(syncStore.subscribe, syncStore.get);
  const storage = s.storageProblem && <p role="alert" data-testid="storage-problem" className="rounded-lg border-2 border-stop bg-panel p-3 font-semibold text-stop">{s.storageProblem}</p>;
  if (s.refused.length === 0 && s.aside.length === 0 && !storage) return <SyncPill s={s} />;
  const mine = (r: { diagnosisId: string }) => Number(r.diagnosisId === diagnosisId);
  const refused = [...s.refused].sort((a, b) => mine(b) - mine(a));
  return (
    <div className="w-full basis-full space-y-2">
      <SyncPill s={s} />
      {storage}
      {refused.map((r) => <RefusedCard key={r.diagnosisId} refused={r} held={heldWords(r.heldKinds)} current={r.diagnosisId === diagnosisId} />)}
      {s.aside.length > 0 && <AsideList aside={s.aside} current={diagnosisId} />}
    </div>
  );
});
