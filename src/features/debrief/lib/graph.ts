import type { ProcedureDocument, Step } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';
import type { BranchFigure, StepFigure } from '@shared/stats/debrief-schema';

export interface GraphNodeData extends Record<string, unknown> {
  title: string;
  kind: Step['kind'];
  /** 0..4: how strongly the step is drawn (heat or path). */
  level: number;
  caption: string;
  marked: boolean;
}

export interface GraphEdge { id: string; source: string; target: string; label: string; level: number }

const ROW = 150;
const COLUMN = 260;

/** Positions as the author placed them; a document without positions gets rows by first reach. */
export function positions(doc: ProcedureDocument): Map<string, { x: number; y: number }> {
  const placed = doc.steps.some((s) => s.position.x !== 0 || s.position.y !== 0);
  if (placed) return new Map(doc.steps.map((s) => [s.id, s.position]));
  const byId = new Map(doc.steps.map((s) => [s.id, s]));
  const depth = new Map<string, number>([[doc.start, 0]]);
  const queue = [doc.start];
  while (queue.length) {
    const id = queue.shift()!;
    for (const b of branchesOf(byId.get(id)!)) {
      if (!depth.has(b.to) && byId.has(b.to)) { depth.set(b.to, depth.get(id)! + 1); queue.push(b.to); }
    }
  }
  const rows = new Map<number, string[]>();
  for (const s of doc.steps) { const d = depth.get(s.id) ?? rows.size; rows.set(d, [...(rows.get(d) ?? []), s.id]); }
  const out = new Map<string, { x: number; y: number }>();
  for (const [d, ids] of rows) ids.forEach((id, i) => out.set(id, { x: (i - (ids.length - 1) / 2) * COLUMN, y: d * ROW }));
  return out;
}

const level = (share: number) => (share <= 0 ? 0 : share < 0.1 ? 1 : share < 0.3 ? 2 : share < 0.6 ? 3 : 4);

/** Nodes and edges with a heat level per step (share of diagnoses that reached it) and per branch. */
export function heatGraph(doc: ProcedureDocument, steps: StepFigure[], branches: BranchFigure[], total: number) {
  const fig = new Map(steps.map((s) => [s.stepId, s]));
  const nodes = doc.steps.map((s) => {
    const f = fig.get(s.id);
    const ended = f ? f.finished + f.handedOff + f.abandoned : 0;
    const data: GraphNodeData = {
      title: s.title, kind: s.kind, level: level(total ? (f?.reached ?? 0) / total : 0), marked: false,
      caption: f ? `reached ${f.reached} · ended ${ended}${f.abandoned ? ` (${f.abandoned} abandoned)` : ''}` : 'not reached',
    };
    return { id: s.id, data };
  });
  const share = new Map(branches.map((b) => [`${b.from}|${b.handle}`, b.share]));
  const edges: GraphEdge[] = doc.steps.flatMap((s) => branchesOf(s).map((b) => {
    const sh = share.get(`${s.id}|${b.handle}`) ?? 0;
    return { id: `${s.id}|${b.handle}`, source: s.id, target: b.to, label: `${b.label} · ${Math.round(sh * 100)} %`, level: level(sh) };
  }));
  return { nodes, edges };
}

/** Nodes and edges with the path of one diagnosis marked. */
export function pathGraph(doc: ProcedureDocument, path: string[], selected?: string | null) {
  const on = new Set(path);
  const taken = new Set(path.slice(1).map((to, i) => `${path[i]}>${to}`));
  const nodes = doc.steps.map((s) => ({
    id: s.id,
    data: { title: s.title, kind: s.kind, level: on.has(s.id) ? 4 : 0, caption: on.has(s.id) ? `step ${path.indexOf(s.id) + 1}` : '', marked: s.id === selected } satisfies GraphNodeData,
  }));
  const edges: GraphEdge[] = doc.steps.flatMap((s) => branchesOf(s).map((b) => ({
    id: `${s.id}|${b.handle}`, source: s.id, target: b.to, label: taken.has(`${s.id}>${b.to}`) ? b.label : '', level: taken.has(`${s.id}>${b.to}`) ? 4 : 0,
  })));
  return { nodes, edges };
}
