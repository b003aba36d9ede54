import type { ReactNode } from 'react';
import { cx } from './cx';

export function Card({ children, className, as: Tag = 'section' }: { children: ReactNode; className?: string; as?: 'section' | 'div' | 'article' }) {
  return <Tag className={cx('rounded-[var(--radius-card)] border border-line bg-panel p-4 shadow-sm', className)}>{children}</Tag>;
}

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-4 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl sm:text-3xl">{title}</h1>
        {subtitle && <p className="mt-1 text-ink-soft">{subtitle}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  );
}

type Tone = 'neutral' | 'go' | 'stop' | 'edge' | 'signal';
const tones: Record<Tone, string> = {
  neutral: 'bg-ink/10 text-ink',
  go: 'bg-go-soft text-go',
  stop: 'bg-stop-soft text-stop',
  edge: 'bg-edge-soft text-edge',
  signal: 'bg-signal-soft text-signal',
};

export function Badge({ tone = 'neutral', children }: { tone?: Tone; children: ReactNode }) {
  return <span className={cx('inline-flex items-center rounded-full px-2.5 py-0.5 text-sm font-semibold', tones[tone])}>{children}</span>;
}

export function Alert({ tone = 'stop', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div role={tone === 'stop' ? 'alert' : 'status'} className={cx('rounded-lg border-l-4 p-3', tones[tone], tone === 'stop' ? 'border-stop' : 'border-current')}>
      {title && <p className="font-bold">{title}</p>}
      {children && <div className="text-ink">{children}</div>}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-[var(--radius-card)] border-2 border-dashed border-line p-8 text-center">
      <p className="text-lg font-semibold">{title}</p>
      {children && <div className="mt-2 text-ink-soft">{children}</div>}
    </div>
  );
}

export function Spinner({ label = 'Loading' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 p-4 text-ink-soft">
      <span className="h-5 w-5 animate-spin rounded-full border-2 border-line border-t-signal" aria-hidden />
      <span>{label}…</span>
    </div>
  );
}
