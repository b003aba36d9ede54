import type { LintFinding, LintReport, PathFigures } from '@shared/engine';
import type { ProcedureDocument } from '@shared/schema';
import { cx } from '../../../../components/ui/cx';
import type { Edit } from '../../lib/edits';
import type { DocumentDiff } from '../../lib/diff';
import { REMOVED_PREFIX } from '../../lib/flow';
import type { VersionIds } from '../../api/versions';
import { Inspector } from '../inspector/inspector';
import { SoundnessPanel } from './soundness-panel';
import { FiguresPanel } from './figures-panel';
import { PreviewPanel } from './preview-panel';
import { ReviewPanel } from './review-panel';

export type Tab = 'step' | 'check' | 'review';

interface SidePanelProps {
  ids: VersionIds;
  doc: ProcedureDocument;
  diff: DocumentDiff | null;
  baseNumber: number | null;
  report: LintReport;
  figures: PathFigures | null;
  checked: boolean;
  selected: string[];
  tab: Tab;
  onTab: (tab: Tab) => void;
  readOnly: boolean;
  canComment: boolean;
  preview: boolean;
  onEdit: (e: Edit) => void;
  onPick: (ids: string[]) => void;
  onShow: (nodeIds: string[]) => void;
  onPath: (path: string[], current: string | null) => void;
  onClosePreview: () => void;
}

/** The technician preview, or the tabs: the selected step, the soundness check, the review. */
export function SidePanel({ ids, doc, diff, baseNumber, report, figures, checked, selected, tab, onTab, readOnly, canComment, preview, onEdit, onPick, onShow, onPath, onClosePreview }: SidePanelProps) {
  const selectedStep = selected.length === 1 ? doc.steps.find((s) => s.id === selected[0]) : undefined;
  const tabs: [Tab, string][] = [['step', 'Step'], ['check', `Soundness (${report.errorCount})`], ['review', 'Review']];
  return (
    <aside className={cx('flex shrink-0 flex-col gap-3 overflow-y-auto rounded-[var(--radius-card)] border border-line bg-panel p-3', preview ? 'w-[420px]' : 'w-[380px]')}>
      {preview ? <PreviewPanel doc={doc} onPath={onPath} onClose={onClosePreview} /> : (
        <>
          <div role="tablist" aria-label="Side panel" className="flex gap-1">
            {tabs.map(([t, label]) => (
              <button key={t} role="tab" type="button" aria-selected={tab === t} onClick={() => onTab(t)}
                className={cx('min-h-10 flex-1 rounded-md px-2 text-sm font-semibold', tab === t ? 'bg-ink text-white' : 'bg-paper text-ink hover:bg-ink/10')}>{label}</button>
            ))}
          </div>
          {tab === 'step' && (selectedStep
            ? <Inspector ids={ids} step={selectedStep} doc={doc} readOnly={readOnly} onEdit={onEdit} />
            : <p className="text-ink-soft">{selected.length > 1 ? `${selected.length} steps selected: copy, delete or move them together.` : 'Select a step to edit it.'}</p>)}
          {tab === 'check' && checked && <><SoundnessPanel report={report} onPick={(f: LintFinding) => onPick([...f.steps].filter((id) => doc.steps.some((s) => s.id === id)))} /><FiguresPanel figures={figures} /></>}
          {tab === 'review' && <ReviewPanel ids={ids} diff={diff} baseNumber={baseNumber} selectedStep={selected[0] ?? null} canComment={canComment} onPick={(id) => onPick([id])} onShowRemoved={(id) => onShow([`${REMOVED_PREFIX}${id}`])} />}
        </>
      )}
    </aside>
  );
}
