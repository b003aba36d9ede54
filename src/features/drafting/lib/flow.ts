import type { Edge, FitViewOptions, Node, NodeHandle, Position } from '@xyflow/react';
import type { ProcedureDocument, Step } from '@shared/schema';
import { branchesOf, outletsOf } from '@shared/engine/kinds';
import { handleOffset, stepBox } from '@shared/engine/geometry';
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

// Handle sizes as the step node draws them (step-node.tsx: h-3 target, h-3.5 sources). The sides
// are React Flow's Position values, written out so that this module needs no React Flow at run time.
const TARGET_HANDLE = 12;
const SOURCE_HANDLE = 14;

/**
 * Where the step node's handles sit, from the shared geometry. With these and the box size React
 * Flow can place edges and tell what is in view before it has measured a node, so a step that
 * is off screen is not rendered just to be measured (onlyRenderVisibleElements).
 */
function staticHandles(step: Step, handleIds: readonly string[]): { width: number; height: number; handles: NodeHandle[] } {
  const { width, height } = stepBox(step);
  const handles: NodeHandle[] = handleIds.map((id, i) => ({
    id, type: 'source', position: 'bottom' as Position, width: SOURCE_HANDLE, height: SOURCE_HANDLE,
    x: width / 2 + handleOffset(i, handleIds.length) - SOURCE_HANDLE / 2, y: height - SOURCE_HANDLE / 2,
  }));
  handles.push({ id: 'in', type: 'target', position: 'top' as Position, width: TARGET_HANDLE, height: TARGET_HANDLE, x: width / 2 - TARGET_HANDLE / 2, y: -TARGET_HANDLE / 2 });
  return { width, height, handles };
}

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
  return outletsOf(step).map((o) => ({ id: o.handle, label: o.label, open: !ids.has(o.to ?? '') }));
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
    const handles = handlesOf(step, ids);
    const box = staticHandles(step, handles.map((h) => h.id));
    nodes.push({
      id: step.id,
      type: 'step',
      position: step.position,
      selected: marks.selected?.has(step.id) ?? false,
      // an estimate until React Flow measures the node in the page; without it a node never
      // rendered (off screen) would count as not initialised and fitView would wait for ever
      measured: { width: box.width, height: box.height },
      handles: box.handles,
      data: {
        step, isStart: step.id === doc.start, issue: marks.issues?.get(step.id) ?? null,
        onPath: marks.path?.has(step.id) ?? false, current: marks.current === step.id,
        change: marks.changes?.get(step.id) ?? null, handles,
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

function sameData(a: StepNodeData, b: StepNodeData): boolean {
  return a.step === b.step && a.isStart === b.isStart && a.issue === b.issue && a.onPath === b.onPath && a.current === b.current && a.change === b.change
    && a.handles.length === b.handles.length && a.handles.every((h, i) => h.id === b.handles[i]!.id && h.label === b.handles[i]!.label && h.open === b.handles[i]!.open);
}

const edgeKey = (e: BranchEdge) => `${e.source}|${e.sourceHandle}|${e.target}|${String(e.label)}|${e.data?.kind}|${e.animated ? 1 : 0}`;

/**
 * `next` with every node and edge that draws the same as in `prev` replaced by the object from
 * `prev`. React Flow re-renders a node or an edge when its object changes, so after an edit only
 * the steps the edit touched are drawn again, not all thousand.
 */
export function keepUnchanged(prev: { nodes: readonly StepNode[]; edges: readonly BranchEdge[] } | null, next: { nodes: StepNode[]; edges: BranchEdge[] }): { nodes: StepNode[]; edges: BranchEdge[] } {
  if (!prev) return next;
  const nodesBefore = new Map(prev.nodes.map((n) => [n.id, n]));
  const edgesBefore = new Map(prev.edges.map((e) => [e.id, e]));
  const nodes = next.nodes.map((n) => {
    const p = nodesBefore.get(n.id);
    return p && p.position === n.position && p.selected === n.selected && p.zIndex === n.zIndex && sameData(p.data, n.data) ? p : n;
  });
  const edges = next.edges.map((e) => {
    const p = edgesBefore.get(e.id);
    return p && edgeKey(p) === edgeKey(e) ? p : e;
  });
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
