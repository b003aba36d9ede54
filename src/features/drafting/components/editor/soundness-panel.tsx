import type { LintFinding, LintReport } from '@shared/engine';
import { cx } from '../../../../components/ui/cx';

/** The live soundness check: each finding selects the steps it names on the canvas. */
export function SoundnessPanel({ report, onPick }: { report: LintReport; onPick: (f: LintFinding) => void }) {
  return (
    <section aria-labelledby="soundness-title" className="flex flex-col gap-2">
      <h2 id="soundness-title" className="text-sm font-bold uppercase tracking-wide text-ink-soft">
        Soundness · {report.errorCount} error{report.errorCount === 1 ? '' : 's'}, {report.warningCount} warning{report.warningCount === 1 ? '' : 's'}
      </h2>
      {report.findings.length === 0 && <p className="rounded-lg bg-go-soft p-2 text-go">No problems found: every path reaches an ending.</p>}
      <ul className="flex flex-col gap-1.5" data-testid="soundness-list">
        {report.findings.map((f, i) => (
          <li key={`${f.code}-${i}`}>
            <button
              type="button"
              onClick={() => onPick(f)}
              className={cx('w-full rounded-lg border-l-4 bg-panel p-2 text-left text-sm hover:bg-ink/5', f.severity === 'error' ? 'border-stop' : 'border-caution')}
              data-code={f.code}
            >
              <span className={cx('mr-1 font-bold uppercase', f.severity === 'error' ? 'text-stop' : 'text-ink')}>{f.severity}</span>
              <span className="font-mono text-xs text-ink-soft">{f.code}</span>
              <span className="mt-0.5 block text-ink">{f.message}</span>
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
