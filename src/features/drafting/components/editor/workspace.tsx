import { useCallback, useEffect, useMemo, useReducer, useState } from 'react';
import { useReactFlow } from '@xyflow/react';
import { lintProcedure, pathFigures, type LintFinding, type LintReport } from '@shared/engine';
import type { StepKind } from '@shared/schema';
import { Alert } from '../../../../components/ui/card';
import { cx } from '../../../../components/ui/cx';
import { historyReducer, initialHistory, type Edit } from '../../lib/edits';
import { stepFor } from '../../lib/new-step';
import { copySteps, pasteSteps } from '../../lib/clipboard';
import { diffDocuments } from '../../lib/diff';
import { autoLayout } from '../../lib/layout';
import type { ChangeMark, FlowMarks } from '../../lib/flow';
import { useDebounced } from '../../hooks/use-debounced';
import { useDraftSaving } from '../../hooks/use-draft-saving';
import { useEditorKeys } from '../../hooks/use-editor-keys';
import type { VersionDetail, VersionSummary } from '../../api/types';
import type { VersionIds } from '../../api/versions';
import { Inspector } from '../inspector/inspector';
import { StatusBadge } from '../labels';
import { Canvas } from './canvas';
import { Palette } from './palette';
import { SoundnessPanel } from './soundness-panel';
import { FiguresPanel } from './figures-panel';
import { PreviewPanel } from './preview-panel';
import { ReviewPanel } from './review-panel';
import { Counts, SaveStatus, ToolButton } from './toolbar';
import { ConflictNotice, VersionActions } from './version-actions';
import { VersionPicker } from './version-picker';

type Tab = 'step' | 'check' | 'review';

const UNCHECKED: LintReport = { findings: [], errorCount: 0, warningCount: 0, ok: true };

interface Props {
  ids: VersionIds;
  version: VersionDetail;
  base: VersionDetail | null;
  roles: string[];
  hasOpenDraft: boolean;
  versions: VersionSummary[];
  onReload: () => void;
}

/** The editor: palette, canvas and the side panel, over one history of edits. */
export function Workspace({ ids, version, base, roles, hasOpenDraft, versions, onReload }: Props) {
  const editable = version.status === 'draft' && roles.includes('author');
  const [history, dispatch] = useReducer(historyReducer, version.document, initialHistory);
  const doc = history.present;
  const [selected, setSelected] = useState<string[]>([]);
  const [tab, setTab] = useState<Tab>(version.status === 'in_review' ? 'review' : 'check');
  const [preview, setPreview] = useState(false);
  const [walk, setWalk] = useState<{ path: string[]; current: string | null }>({ path: [], current: null });
  const saving = useDraftSaving(ids, doc, version, editable);
  const { fitView, getViewport } = useReactFlow();

  // the canvas paints first; the soundness check and the figures follow a moment later
  const [checked, setChecked] = useState(false);
  useEffect(() => { const t = setTimeout(() => setChecked(true), 60); return () => clearTimeout(t); }, []);
  const settled = useDebounced(doc, 250);
  const report = useMemo(() => (checked ? lintProcedure(settled) : UNCHECKED), [checked, settled]);
  const figures = useMemo(() => { if (!checked) return null; try { return pathFigures(settled); } catch { return null; } }, [checked, settled]);
  const diff = useMemo(() => (base ? diffDocuments(base.document, doc) : null), [base, doc]);

  const marks = useMemo<FlowMarks>(() => {
    const issues = new Map<string, 'error' | 'warning'>();
    for (const f of report.findings) for (const id of f.steps) if (issues.get(id) !== 'error') issues.set(id, f.severity);
    const changes = new Map<string, ChangeMark>();
    if (diff && (tab === 'review' || version.status === 'in_review')) {
      for (const s of diff.added) changes.set(s.id, 'added');
      for (const s of diff.changed) changes.set(s.id, 'changed');
    }
    return { issues, changes, ...(preview ? { path: new Set(walk.path), current: walk.current } : {}) };
  }, [report, diff, tab, version.status, preview, walk]);
  const [selectRequest, setSelectRequest] = useState({ ids: [] as string[], seq: 0 });
  const select = useCallback((ids: string[]) => { setSelected(ids); setSelectRequest((r) => ({ ids, seq: r.seq + 1 })); }, []);

  const onEdit = useCallback((e: Edit) => {
    if (!editable) return;
    dispatch({ type: 'edit', edit: e });
    if (e.type === 'update-step' && e.step.id !== e.id) select(selected.map((x) => (x === e.id ? e.step.id : x)));
    if (e.type === 'add-steps') select(e.steps.map((s) => s.id));
  }, [editable, select, selected]);
  const onSelect = useCallback((ids: string[]) => {
    // React Flow reports the selection again after every node update; only a real change counts
    setSelected((prev) => (prev.length === ids.length && prev.every((id, i) => id === ids[i]) ? prev : ids));
    if (ids.length === 1) setTab((t) => (t === 'review' ? t : 'step'));
  }, []);
  const pick = useCallback((ids: string[]) => {
    select(ids);
    if (ids.length > 0) void fitView({ nodes: ids.map((id) => ({ id })), duration: 300, maxZoom: 1.2, padding: 0.4 });
  }, [fitView, select]);
  const onPath = useCallback((path: string[], current: string | null) => setWalk({ path, current }), []);

  const addAtCentre = (kind: StepKind) => {
    const v = getViewport();
    // a grid from the top left of the view, so steps added one after another do not hide each other
    const n = doc.steps.length;
    const at = { x: Math.round((-v.x + 40) / v.zoom) + (n % 3) * 280, y: Math.round((-v.y + 40) / v.zoom) + (Math.floor(n / 3) % 3) * 190 };
    onEdit({ type: 'add-steps', steps: [stepFor(doc, kind, at)] });
  };
  const [arranging, setArranging] = useState(false);
  const layout = () => {
    setArranging(true);
    void autoLayout(doc)
      .then((moves) => { onEdit({ type: 'move-steps', moves }); setTimeout(() => void fitView({ duration: 200, maxZoom: 1 }), 50); })
      .finally(() => setTimeout(() => setArranging(false), 300));
  };

  useEditorKeys({
    undo: () => editable && dispatch({ type: 'undo' }),
    redo: () => editable && dispatch({ type: 'redo' }),
    layout: () => editable && layout(),
    fit: () => void fitView({ duration: 300, maxZoom: 1 }),
    preview: () => setPreview((p) => !p),
    copy: () => (selected.length > 0 ? copySteps(doc, new Set(selected)) : null),
    paste: (text) => { const steps = pasteSteps(doc, text); if (steps) onEdit({ type: 'add-steps', steps }); },
  });

  const selectedStep = selected.length === 1 ? doc.steps.find((s) => s.id === selected[0]) : undefined;
  const tabs: [Tab, string][] = [['step', 'Step'], ['check', `Soundness (${report.errorCount})`], ['review', 'Review']];

  return (
    <div className="flex h-[calc(100dvh-7.5rem)] min-h-[560px] flex-col gap-2">
      <header className="flex flex-wrap items-center gap-2">
        <h1 className="mr-2 text-2xl">{doc.meta.title}</h1>
        <StatusBadge status={version.status} />
        {version.number !== null && <span className="font-semibold">v{version.number}</span>}
        <VersionPicker procedureId={ids.procedureId} current={version.id} versions={versions} />
        <SaveStatus state={saving.state} editable={editable} />
        {checked ? <Counts errors={report.errorCount} warnings={report.warningCount} /> : <span className="text-sm text-ink-soft">Checking…</span>}
        <div className="ml-auto">
          <VersionActions ids={ids} version={version} roles={roles} hasOpenDraft={hasOpenDraft} errors={report.errorCount} beforeMove={saving.save} onChanged={onReload} />
        </div>
      </header>
      <div className="flex flex-wrap items-center gap-1" role="toolbar" aria-label="Editor tools">
        {editable && (
          <>
            <ToolButton label="Undo" shortcut="Ctrl+Z" disabled={history.past.length === 0} onClick={() => dispatch({ type: 'undo' })}>↶ Undo</ToolButton>
            <ToolButton label="Redo" shortcut="Ctrl+Shift+Z" disabled={history.future.length === 0} onClick={() => dispatch({ type: 'redo' })}>↷ Redo</ToolButton>
            <ToolButton label="Arrange automatically" shortcut="L" onClick={layout}>Arrange</ToolButton>
          </>
        )}
        <ToolButton label="Fit to view" shortcut="F" onClick={() => void fitView({ duration: 300, maxZoom: 1 })}>Fit</ToolButton>
        <ToolButton label="Preview as a technician" shortcut="P" pressed={preview} onClick={() => setPreview((p) => !p)}>Preview</ToolButton>
        {editable && <ToolButton label="Save now" disabled={!saving.dirty} onClick={() => void saving.save()}>Save</ToolButton>}
        <span className="ml-2 text-xs text-ink-soft">{editable
          ? 'Shift-drag to select several · Ctrl+C / Ctrl+V copies steps · Delete removes · L arranges · F fits · P previews'
          : version.status === 'draft' || version.status === 'in_review' ? 'Read only: only authors edit drafts.' : 'A numbered version never changes; start a new draft from it to make changes.'}</span>
      </div>
      {saving.state.kind === 'conflict' && <ConflictNotice state={saving.state} doc={doc} onReload={onReload} />}
      {saving.state.kind === 'invalid' && <Alert title="Not saved yet: fix these fields">{saving.state.problems.map((p) => <p key={p}><code>{p}</code></p>)}</Alert>}
      {saving.state.kind === 'failed' && <Alert title="Saving failed">{saving.state.message}</Alert>}
      <div className="flex min-h-0 flex-1 gap-2">
        {editable && <aside className="w-44 shrink-0 overflow-y-auto"><Palette disabled={!editable} onAdd={addAtCentre} /></aside>}
        <div className="min-w-0 flex-1 overflow-hidden rounded-[var(--radius-card)] border border-line bg-panel" aria-busy={arranging} data-testid="canvas-frame">
          <Canvas doc={doc} marks={marks} selectRequest={selectRequest} readOnly={!editable} onEdit={onEdit} onSelect={onSelect} />
        </div>
        <aside className={cx('flex shrink-0 flex-col gap-3 overflow-y-auto rounded-[var(--radius-card)] border border-line bg-panel p-3', preview ? 'w-[420px]' : 'w-[380px]')}>
          {preview ? <PreviewPanel doc={doc} onPath={onPath} onClose={() => setPreview(false)} /> : (
            <>
              <div role="tablist" aria-label="Side panel" className="flex gap-1">
                {tabs.map(([t, label]) => (
                  <button key={t} role="tab" type="button" aria-selected={tab === t} onClick={() => setTab(t)}
                    className={cx('min-h-10 flex-1 rounded-md px-2 text-sm font-semibold', tab === t ? 'bg-ink text-white' : 'bg-paper text-ink hover:bg-ink/10')}>{label}</button>
                ))}
              </div>
              {tab === 'step' && (selectedStep
                ? <Inspector step={selectedStep} doc={doc} readOnly={!editable} onEdit={onEdit} />
                : <p className="text-ink-soft">{selected.length > 1 ? `${selected.length} steps selected: copy, delete or move them together.` : 'Select a step to edit it.'}</p>)}
              {tab === 'check' && checked && <><SoundnessPanel report={report} onPick={(f: LintFinding) => pick([...f.steps].filter((id) => doc.steps.some((s) => s.id === id)))} /><FiguresPanel figures={figures} /></>}
              {tab === 'review' && <ReviewPanel ids={ids} diff={diff} baseNumber={base?.number ?? null} selectedStep={selected[0] ?? null} canComment={roles.includes('author') || roles.includes('lead')} onPick={(id) => pick([id])} />}
            </>
          )}
        </aside>
      </div>
    </div>
  );
}
