import { may, type Role } from '@shared/schema/role-names';
import { useCallback, useDeferredValue, useEffect, useMemo, useReducer, useState, type Dispatch, type SetStateAction } from 'react';
import { useReactFlow, type ReactFlowInstance, type Viewport } from '@xyflow/react';
import { lintProcedure, pathFigures, type LintReport } from '@shared/engine';
import type { ProcedureDocument, StepKind } from '@shared/schema';
import { Alert } from '../../../../components/ui/card';
import { historyReducer, initialHistory, type Edit, type History, type HistoryAction } from '../../lib/edits';
import { stepFor } from '../../lib/new-step';
import { copySteps, pasteSteps } from '../../lib/clipboard';
import { diffDocuments, type DocumentDiff } from '../../lib/diff';
import { autoLayout } from '../../lib/layout';
import type { ChangeMark, FlowMarks } from '../../lib/flow';
import { useDebounced } from '../../hooks/use-debounced';
import { useDraftSaving, type SaveState } from '../../hooks/use-draft-saving';
import { useEditorKeys } from '../../hooks/use-editor-keys';
import type { VersionDetail, VersionSummary } from '../../api/types';
import type { VersionIds } from '../../api/versions';
import { StatusBadge } from '../labels';
import { Canvas } from './canvas';
import { Palette } from './palette';
import { Counts, SaveStatus, ToolButton } from './toolbar';
import { ConflictNotice, VersionActions } from './version-actions';
import { VersionPicker } from './version-picker';
import { SidePanel, type Tab } from './side-panel';

interface Walk { path: string[]; current: string | null }

const UNCHECKED: LintReport = { findings: [], errorCount: 0, warningCount: 0, ok: true };

interface Props {
  ids: VersionIds;
  version: VersionDetail;
  base: VersionDetail | null;
  roles: Role[];
  hasOpenDraft: boolean;
  versions: VersionSummary[];
  onReload: () => void;
}

type FitView = ReactFlowInstance['fitView'];
type Commands = ReturnType<typeof useCommands>;

/** Soundness findings, review changes and the preview walk, as the canvas shows them. */
function flowMarks(report: LintReport, changed: DocumentDiff | null, walk: Walk | null, base: ProcedureDocument | null): FlowMarks {
  const issues = new Map<string, 'error' | 'warning'>();
  for (const f of report.findings) for (const id of f.steps) if (issues.get(id) !== 'error') issues.set(id, f.severity);
  const changes = new Map<string, ChangeMark>();
  if (changed) {
    for (const s of changed.added) changes.set(s.id, 'added');
    for (const s of changed.changed) changes.set(s.id, 'changed');
  }
  const gone = new Set(changed?.removed.map((s) => s.id));
  const removed = base && gone.size > 0 ? base.steps.filter((s) => gone.has(s.id)) : [];
  return { issues, changes, removed, ...(walk ? { path: new Set(walk.path), current: walk.current } : {}) };
}

/** Where a step added from the palette goes: a grid from the top left of the view, so steps added one after another do not hide each other. */
function placeInView(count: number, v: Viewport): { x: number; y: number } {
  return { x: Math.round((-v.x + 40) / v.zoom) + (count % 3) * 280, y: Math.round((-v.y + 40) / v.zoom) + (Math.floor(count / 3) % 3) * 190 };
}

/**
 * The canvas paints first; the soundness check and the figures follow a moment later. After an
 * edit the check runs at once (a few milliseconds at 1 000 steps) in a deferred render, so the
 * edit itself is drawn first and input is never held up; the figures wait until edits settle.
 */
function useSoundness(doc: ProcedureDocument) {
  const [checked, setChecked] = useState(false);
  useEffect(() => { const t = setTimeout(() => setChecked(true), 60); return () => clearTimeout(t); }, []);
  const latest = useDeferredValue(doc);
  const settled = useDebounced(doc, 250);
  const report = useMemo(() => (checked ? lintProcedure(latest) : UNCHECKED), [checked, latest]);
  const figures = useMemo(() => { if (!checked) return null; try { return pathFigures(settled); } catch { return null; } }, [checked, settled]);
  return { checked, report, figures };
}

interface EditingOptions {
  editable: boolean;
  dispatch: Dispatch<HistoryAction>;
  selected: string[];
  setSelected: Dispatch<SetStateAction<string[]>>;
  setTab: Dispatch<SetStateAction<Tab>>;
  fitView: FitView;
}

/** Edits go into the history; steps an edit renames or adds stay selected, on the canvas too. */
function useEditing({ editable, dispatch, selected, setSelected, setTab, fitView }: EditingOptions) {
  const [selectRequest, setSelectRequest] = useState({ ids: [] as string[], seq: 0 });
  const select = useCallback((ids: string[]) => { setSelected(ids); setSelectRequest((r) => ({ ids, seq: r.seq + 1 })); }, [setSelected]);
  const onEdit = useCallback((e: Edit) => {
    if (!editable) return;
    dispatch({ type: 'edit', edit: e });
    if (e.type === 'update-step' && e.step.id !== e.id) select(selected.map((x) => (x === e.id ? e.step.id : x)));
    if (e.type === 'add-steps') select(e.steps.map((s) => s.id));
  }, [dispatch, editable, select, selected]);
  const onSelect = useCallback((ids: string[]) => {
    // React Flow reports the selection again after every node update; only a real change counts
    setSelected((prev) => (prev.length === ids.length && prev.every((id, i) => id === ids[i]) ? prev : ids));
    if (ids.length === 1) setTab((t) => (t === 'review' ? t : 'step'));
  }, [setSelected, setTab]);
  // Brings canvas nodes into view; `pick` also selects them (a removed step can only be shown).
  const show = useCallback((nodeIds: string[]) => {
    if (nodeIds.length > 0) void fitView({ nodes: nodeIds.map((id) => ({ id })), duration: 300, maxZoom: 1.2, padding: 0.4 });
  }, [fitView]);
  const pick = useCallback((ids: string[]) => { select(ids); show(ids); }, [select, show]);
  return { selectRequest, onEdit, onSelect, pick, show };
}

interface CommandOptions {
  doc: ProcedureDocument;
  editable: boolean;
  selected: string[];
  dispatch: Dispatch<HistoryAction>;
  onEdit: (e: Edit) => void;
  setPreview: Dispatch<SetStateAction<boolean>>;
  flow: Pick<ReactFlowInstance, 'fitView' | 'getViewport'>;
}

/** What the tool buttons and the shortcuts do; the shortcuts that edit only work where editing is allowed. */
function useCommands({ doc, editable, selected, dispatch, onEdit, setPreview, flow }: CommandOptions) {
  const [arranging, setArranging] = useState(false);
  const commands = {
    undo: () => dispatch({ type: 'undo' }),
    redo: () => dispatch({ type: 'redo' }),
    arrange: () => {
      setArranging(true);
      void autoLayout(doc)
        .then((moves) => { onEdit({ type: 'move-steps', moves }); setTimeout(() => void flow.fitView({ duration: 200, maxZoom: 1 }), 50); })
        .finally(() => setTimeout(() => setArranging(false), 300));
    },
    fit: () => void flow.fitView({ duration: 300, maxZoom: 1 }),
    togglePreview: () => setPreview((p) => !p),
    addAtCentre: (kind: StepKind) => onEdit({ type: 'add-steps', steps: [stepFor(doc, kind, placeInView(doc.steps.length, flow.getViewport()))] }),
  };
  useEditorKeys({
    undo: () => editable && commands.undo(),
    redo: () => editable && commands.redo(),
    layout: () => editable && commands.arrange(),
    fit: commands.fit,
    preview: commands.togglePreview,
    copy: () => (selected.length > 0 ? copySteps(doc, new Set(selected)) : null),
    paste: (text) => { const steps = pasteSteps(doc, text); if (steps) onEdit({ type: 'add-steps', steps }); },
  });
  return { arranging, ...commands };
}

/** The editor: palette, canvas and the side panel, over one history of edits. */
export function Workspace({ ids, version, base, roles, hasOpenDraft, versions, onReload }: Props) {
  const editable = version.status === 'draft' && may(roles, 'procedure.author');
  const [history, dispatch] = useReducer(historyReducer, version.document, initialHistory);
  const doc = history.present;
  const [selected, setSelected] = useState<string[]>([]);
  const [tab, setTab] = useState<Tab>(version.status === 'in_review' ? 'review' : 'check');
  const [preview, setPreview] = useState(false);
  const [walk, setWalk] = useState<Walk>({ path: [], current: null });
  const saving = useDraftSaving(ids, doc, version, editable);
  const flow = useReactFlow();
  const { checked, report, figures } = useSoundness(doc);
  const diff = useMemo(() => (base ? diffDocuments(base.document, doc) : null), [base, doc]);
  const showChanges = tab === 'review' || version.status === 'in_review';
  const marks = useMemo(() => flowMarks(report, showChanges ? diff : null, preview ? walk : null, base?.document ?? null), [report, diff, showChanges, preview, walk, base]);
  const { selectRequest, onEdit, onSelect, pick, show } = useEditing({ editable, dispatch, selected, setSelected, setTab, fitView: flow.fitView });
  const onPath = useCallback((path: string[], current: string | null) => setWalk({ path, current }), []);
  const commands = useCommands({ doc, editable, selected, dispatch, onEdit, setPreview, flow });
  return (
    <div className="flex h-[calc(100dvh-7.5rem)] min-h-[560px] flex-col gap-2">
      <WorkspaceHeader title={doc.meta.title} ids={ids} version={version} versions={versions} roles={roles} hasOpenDraft={hasOpenDraft}
        saving={saving} editable={editable} checked={checked} report={report} onReload={onReload} />
      <EditorTools status={version.status} author={may(roles, 'procedure.author')} editable={editable} history={history} preview={preview} dirty={saving.dirty} onSave={saving.save} commands={commands} />
      <SaveProblems state={saving.state} doc={doc} onReload={onReload} />
      <div className="flex min-h-0 flex-1 gap-2">
        {editable && <aside className="w-44 shrink-0 overflow-y-auto"><Palette disabled={!editable} onAdd={commands.addAtCentre} /></aside>}
        <div className="min-w-0 flex-1 overflow-hidden rounded-[var(--radius-card)] border border-line bg-panel" aria-busy={commands.arranging} data-testid="canvas-frame">
          <Canvas doc={doc} marks={marks} selectRequest={selectRequest} readOnly={!editable} onEdit={onEdit} onSelect={onSelect} />
        </div>
        <SidePanel ids={ids} doc={doc} diff={diff} baseNumber={base?.number ?? null} report={report} figures={figures} checked={checked}
          selected={selected} tab={tab} onTab={setTab} readOnly={!editable} canComment={may(roles, 'procedure.draft')}
          preview={preview} onEdit={onEdit} onPick={pick} onShow={show} onPath={onPath} onClosePreview={() => setPreview(false)} />
      </div>
    </div>
  );
}

interface HeaderProps extends Omit<Props, 'base'> {
  title: string;
  saving: ReturnType<typeof useDraftSaving>;
  editable: boolean;
  checked: boolean;
  report: LintReport;
}

function WorkspaceHeader({ ids, version, roles, hasOpenDraft, versions, onReload, title, saving, editable, checked, report }: HeaderProps) {
  return (
    <header className="flex flex-wrap items-center gap-2">
      <h1 className="mr-2 text-2xl">{title}</h1>
      <StatusBadge status={version.status} />
      {version.number !== null && <span className="font-semibold">v{version.number}</span>}
      <VersionPicker procedureId={ids.procedureId} current={version.id} versions={versions} />
      <SaveStatus state={saving.state} editable={editable} />
      {checked ? <Counts errors={report.errorCount} warnings={report.warningCount} /> : <span className="text-sm text-ink-soft">Checking…</span>}
      <div className="ml-auto">
        <VersionActions ids={ids} version={version} roles={roles} hasOpenDraft={hasOpenDraft} errors={report.errorCount} beforeMove={saving.save} onChanged={onReload} />
      </div>
    </header>
  );
}

interface ToolsProps {
  status: VersionDetail['status'];
  author: boolean;
  editable: boolean;
  history: History;
  preview: boolean;
  dirty: boolean;
  onSave: () => Promise<void>;
  commands: Commands;
}

const EDITING_HINT = 'Shift-drag to select several · Ctrl+C / Ctrl+V copies steps · Delete removes · L arranges · F fits · P previews';

/** Why this version can't be edited here, and the way on. */
function readOnlyHint(status: VersionDetail['status'], author: boolean): string {
  if (status === 'in_review') return author ? 'In review: read only. Take it back to edit, or wait for the lead.' : 'Read only: only authors edit drafts.';
  if (status === 'draft') return 'Read only: only authors edit drafts.';
  return 'A numbered version never changes; start a new draft from it to make changes.';
}

function EditorTools({ status, author, editable, history, preview, dirty, onSave, commands }: ToolsProps) {
  return (
    <div className="flex flex-wrap items-center gap-1" role="toolbar" aria-label="Editor tools">
      {editable && (
        <>
          <ToolButton label="Undo" shortcut="Ctrl+Z" disabled={history.past.length === 0} onClick={commands.undo}>↶ Undo</ToolButton>
          <ToolButton label="Redo" shortcut="Ctrl+Shift+Z" disabled={history.future.length === 0} onClick={commands.redo}>↷ Redo</ToolButton>
          <ToolButton label="Arrange automatically" shortcut="L" onClick={commands.arrange}>Arrange</ToolButton>
        </>
      )}
      <ToolButton label="Fit to view" shortcut="F" onClick={commands.fit}>Fit</ToolButton>
      <ToolButton label="Preview as a technician" shortcut="P" pressed={preview} onClick={commands.togglePreview}>Preview</ToolButton>
      {editable && <ToolButton label="Save now" disabled={!dirty} onClick={() => void onSave()}>Save</ToolButton>}
      <span className="ml-2 text-xs text-ink-soft">{editable ? EDITING_HINT : readOnlyHint(status, author)}</span>
    </div>
  );
}

function SaveProblems({ state, doc, onReload }: { state: SaveState; doc: ProcedureDocument; onReload: () => void }) {
  return (
    <>
      {state.kind === 'conflict' && <ConflictNotice state={state} doc={doc} onReload={onReload} />}
      {state.kind === 'invalid' && <Alert title="Not saved yet: fix these fields">{state.problems.map((p) => <p key={p}><code>{p}</code></p>)}</Alert>}
      {state.kind === 'failed' && <Alert title="Saving failed">{state.message}</Alert>}
    </>
  );
}
