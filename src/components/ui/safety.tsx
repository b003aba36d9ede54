import type { ReactNode } from 'react';
import { cx } from './cx';

export type SignalWord = 'DANGER' | 'WARNING' | 'CAUTION' | 'NOTICE';

// ANSI Z535 / ISO 3864 signal words; the panel colours follow the usual convention
// (red, orange, yellow, blue) with our own layout.
const styles: Record<SignalWord, { band: string; text: string; mark: string }> = {
  DANGER: { band: 'bg-danger text-white', text: 'border-danger', mark: '!' },
  WARNING: { band: 'bg-warning text-white', text: 'border-warning', mark: '!' },
  CAUTION: { band: 'bg-caution text-ink', text: 'border-caution', mark: '!' },
  NOTICE: { band: 'bg-notice text-white', text: 'border-notice', mark: 'i' },
};

/** A safety note in signal-word style: the word on a coloured band, the text below it. */
export function SafetyNote({ signal, children, action }: { signal: SignalWord; children: ReactNode; action?: ReactNode }) {
  const s = styles[signal];
  return (
    <div className={cx('overflow-hidden rounded-lg border-2 bg-panel', s.text)} role={signal === 'DANGER' ? 'alert' : 'note'}>
      <div className={cx('flex items-center gap-2 px-3 py-1 text-base font-black tracking-widest', s.band)}>
        <span aria-hidden className="inline-flex h-6 w-6 items-center justify-center rounded-full border-2 border-current text-sm">{s.mark}</span>
        {signal}
      </div>
      <div className="px-3 py-2 text-base leading-snug">{children}</div>
      {action && <div className="px-3 pb-3">{action}</div>}
    </div>
  );
}

/**
 * Whether a procedure's own limits note already says that service data come first, so the screen
 * need not say it again. Example: saysServiceDataFirst("The manufacturer's service data … come first.") === true
 */
export function saysServiceDataFirst(note: string): boolean {
  return /service data/i.test(note);
}

/** Said on every screen that shows limits. */
export function LimitsNotice({ className }: { className?: string }) {
  return (
    <p className={cx('text-sm text-ink-soft', className)}>
      Limits shown here are the procedure's; the manufacturer's service data and local regulations come first.
      Demo limits are illustrative, not service data.
    </p>
  );
}
