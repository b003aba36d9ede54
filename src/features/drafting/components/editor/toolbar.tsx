import type { ReactNode } from 'react';
import { Badge } from '../../../../components/ui/card';
import { cx } from '../../../../components/ui/cx';
import type { SaveState } from '../../hooks/use-draft-saving';
import { useFormat } from '../../../../lib/format';

export function ToolButton({ onClick, disabled, label, children, pressed, shortcut }: { onClick: () => void; disabled?: boolean; label: string; children: ReactNode; pressed?: boolean; shortcut?: string }) {
  return (
    <button type="button" onClick={onClick} disabled={disabled} aria-label={label} aria-pressed={pressed} title={shortcut ? `${label} (${shortcut})` : label}
      className={cx('min-h-10 rounded-md border border-line px-3 text-sm font-semibold hover:border-ink disabled:opacity-40', pressed ? 'bg-ink text-white' : 'bg-panel text-ink')}>
      {children}
    </button>
  );
}

/** Where the draft stands on the server, in words. */
export function SaveStatus({ state, editable }: { state: SaveState; editable: boolean }) {
  const fmt = useFormat();
  if (!editable) return <span className="text-sm text-ink-soft">Read only</span>;
  const text = {
    saved: state.kind === 'saved' ? `Saved ${fmt.timeWithSeconds(state.at)}` : '',
    dirty: 'Unsaved changes',
    saving: 'Saving…',
    invalid: 'Cannot save yet',
    conflict: 'Changed elsewhere',
    failed: 'Save failed',
  }[state.kind];
  return <span role="status" data-testid="save-status" className={cx('text-sm font-semibold', state.kind === 'saved' ? 'text-go' : state.kind === 'dirty' || state.kind === 'saving' ? 'text-ink-soft' : 'text-stop')}>{text}</span>;
}

export function Counts({ errors, warnings }: { errors: number; warnings: number }) {
  return (
    <span className="flex items-center gap-1" data-testid="lint-counts">
      <Badge tone={errors > 0 ? 'stop' : 'go'}>{errors} error{errors === 1 ? '' : 's'}</Badge>
      <Badge tone={warnings > 0 ? 'signal' : 'neutral'}>{warnings} warning{warnings === 1 ? '' : 's'}</Badge>
    </span>
  );
}
