import type { Edge, FitViewOptions, Node } from '@xyflow/react';
import { branchesOf, type ProcedureDocument, type Step } from '@shared/schema';
import { setBranch } from './edits';

export type ChangeMark = 'added' | 'changed' | 'removed' | null;

/** Everything a step node draws; plain data only (no callbacks), so it can be copied and compared. */
export interface StepNodeData extends Record<string, unknown> {
  step: Step;
  isStart: boolean;
  issue: 'error' | 'warning' | null;
  onPath: boolean;
  current: boolean;
  change: ChangeMark;
  /** Handles the node shows, in the author's order: `band:<id>`, `answer:<id>`, `next`, `borderline`. */
  handles: { id: string; label: string; open: boolean }[];
}
export type StepNode = Node<StepNodeData, 'step'>;
export type BranchEdge = Edge<{ kind: string }>;

export interface FlowMarks {
  issues?: ReadonlyMap<string, 'error' | 'warning'>;
  path?: ReadonlySet<string>;
  current?: string | null;
  changes?: ReadonlyMap<string, ChangeMark>;
  /** Steps of the base version this document no longer has: drawn faded where they stood. */
  removed?: readonly Step[];
  selected?: ReadonlySet<string>;
}

/** Node ids of removed steps; they never collide with a step's id, which the document keeps unique. */
export const REMOVED_PREFIX = 'removed:';

/** A removed step for a reviewer to see where it stood: behind the others, and nothing to do with it. */
function removedNode(step: Step): StepNode {
  return {
    id: `${REMOVED_PREFIX}${step.id}`, type: 'step', position: step.position, zIndex: -1,
    selectable: false, draggable: false, deletable: false, connectable: false, focusable: false,
    data: { step, isStart: false, issue: null, onPath: false, current: false, change: 'removed', handles: [] },
  };
}

/** The handles a step offers, open ones (not yet connected) included. */
function handlesOf(step: Step, ids: ReadonlySet<string>): StepNodeData['handles'] {
  const connected = new Map(branchesOf(step).map((b) => [b.handle, b.to]));
  const open = (h: string) => !ids.has(connected.get(h) ?? '');
  switch (step.kind) {
    case 'reading': {
      const out = step.bands.map((b) => ({ id: `band:${b.id}`, label: b.label, open: open(`band:${b.id}`) }));
      if (step.borderline.action === 'branch') out.push({ id: 'borderline', label: step.borderline.label, open: open('borderline') });
      return out;
    }
    case 'formula': {
      const out = step.bands.map((b) => ({ id: `band:${b.id}`, label: b.label, open: open(`band:${b.id}`) }));
      return out.length > 0 ? out : [{ id: 'next', label: 'Next', open: open('next') }];
    }
    case 'observation':
      return step.answers.map((a) => ({ id: `answer:${a.id}`, label: a.label, open: open(`answer:${a.id}`) }));
    case 'task':
      return [{ id: 'next', label: step.confirmLabel, open: open('next') }];
    default:
      return [];
  }
}

/**
 * The document as React Flow nodes and edges. Pure: same document and marks, equal output.
 * Branches to steps that do not exist are left out (the soundness panel names them).
 */
export function toFlow(doc: ProcedureDocument, marks: FlowMarks = {}): { nodes: StepNode[]; edges: BranchEdge[] } {
  const ids = new Set(doc.steps.map((s) => s.id));
  const nodes: StepNode[] = [];
  const edges: BranchEdge[] = [];
  for (const step of doc.steps) {
    nodes.push({
      id: step.id,
      type: 'step',
      position: step.position,
      selected: marks.selected?.has(step.id) ?? false,
      data: {
        step, isStart: step.id === doc.start, issue: marks.issues?.get(step.id) ?? null,
        onPath: marks.path?.has(step.id) ?? false, current: marks.current === step.id,
        change: marks.changes?.get(step.id) ?? null, handles: handlesOf(step, ids),
      },
    });
    for (const b of branchesOf(step)) {
      if (!ids.has(b.to)) continue;
      const onPath = (marks.path?.has(b.from) && marks.path.has(b.to)) ?? false;
      edges.push({
        id: `${b.from}:${b.handle}`, source: b.from, sourceHandle: b.handle, target: b.to, targetHandle: 'in',
        label: b.label, data: { kind: b.kind }, animated: onPath,
        ...(onPath ? { style: { stroke: 'var(--color-go)', strokeWidth: 3 } } : {}),
      });
    }
  }
  for (const step of marks.removed ?? []) nodes.push(removedNode(step));
  return { nodes, edges };
}

/**
 * Back from React Flow: node positions and the edges decide the branches; everything else comes
 * from the steps carried in node data. A handle with no edge is left unconnected.
 */
export function fromFlow(base: ProcedureDocument, nodes: readonly StepNode[], edges: readonly BranchEdge[]): ProcedureDocument {
  const bySource = new Map<string, BranchEdge[]>();
  for (const e of edges) bySource.set(e.source, [...(bySource.get(e.source) ?? []), e]);
  const steps = nodes.map((n) => {
    let step: Step = { ...n.data.step, position: { x: n.position.x, y: n.position.y } };
    const out = bySource.get(n.id) ?? [];
    for (const h of n.data.handles) {
      const e = out.find((x) => x.sourceHandle === h.id);
      step = setBranch(step, h.id, e?.target);
    }
    return step;
  });
  return { ...base, steps };
}

/**
 * Where the canvas opens: the start step and what lies just below it, at a zoom that keeps step
 * titles readable (a whole long procedure fitted at once is too small to read). Fit shows it all.
 */
export function openingView(doc: ProcedureDocument): FitViewOptions {
  const start = doc.steps.find((s) => s.id === doc.start) ?? doc.steps[0];
  if (!start) return { maxZoom: 1 };
  const near = doc.steps.filter((s) => s.position.y >= start.position.y - 40 && s.position.y <= start.position.y + 760);
  return { maxZoom: 1, minZoom: 0.6, padding: 0.1, nodes: near.map((s) => ({ id: s.id })) };
}
