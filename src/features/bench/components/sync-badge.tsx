import { useSyncExternalStore } from 'react';
import { syncStore, retryRefused } from '../../../lib/offline/outbox';
import { cx } from '../../../components/ui/cx';

/** Always on screen: whether every step, note and photo has reached the server. */
export function SyncBadge() {
  const s = useSyncExternalStore(syncStore.subscribe, syncStore.get);
  if (s.refused) {
    return (
      <div role="alert" className="rounded-lg border-2 border-stop bg-stop-soft p-3 text-ink">
        <p className="font-bold text-stop">Not synced: the server refused what this phone sent</p>
        <p>{s.refused}</p>
        <button type="button" onClick={() => void retryRefused()} className="mt-2 min-h-12 rounded-lg border-2 border-ink bg-panel px-4 font-semibold">Try again</button>
      </div>
    );
  }
  const synced = s.waiting === 0;
  return (
    <p role="status" data-testid="sync-status" data-synced={synced ? 'yes' : 'no'}
      className={cx('inline-flex min-h-10 items-center gap-2 rounded-full px-3 text-base font-bold', synced ? 'bg-go-soft text-go' : 'bg-signal-soft text-ink')}>
      <span aria-hidden className={cx('h-3 w-3 rounded-full', synced ? 'bg-go' : s.online ? 'animate-pulse bg-signal' : 'bg-ink-soft')} />
      {synced ? 'All synced' : `${s.waiting} waiting to sync${s.online ? '' : ' — no signal, kept on this phone'}`}
    </p>
  );
}
