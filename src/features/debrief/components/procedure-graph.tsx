import { useMemo, useRef } from 'react';
import { ReactFlow, Background, Controls, Handle, Position, type Edge, type Node, type NodeProps } from '@xyflow/react';
import '@xyflow/react/dist/style.css';
import type { ProcedureDocument } from '@shared/schema';
import { STEP_TRAITS } from '@shared/engine/kinds';
import { cx } from '../../../components/ui/cx';
import { positions, type GraphEdge, type GraphNodeData } from '../lib/graph';
import { heatRamp, palette } from '../lib/palette';

// Read-only procedure graph for Debrief (lazy-loaded with React Flow). Heat and path use our
// signal colour in five steps; endings keep the ISO 5807 terminal shape (rounded).

const FILL = ['bg-panel', 'bg-signal-soft', 'bg-signal/30', 'bg-signal/55', 'bg-signal/80'];

function StepNode({ data }: NodeProps<Node<GraphNodeData>>) {
  const ending = STEP_TRAITS[data.kind].arrival.on === 'end';
  return (
    <div className={cx('w-52 border-2 px-3 py-2 text-ink shadow-sm', ending ? 'rounded-2xl' : 'rounded-md', FILL[data.level],
      data.level >= 4 ? 'border-ink' : 'border-line', data.marked && 'ring-4 ring-edge')}>
      <Handle type="target" position={Position.Top} className="!bg-ink-soft" />
      <p className="text-xs font-bold uppercase tracking-wide text-ink-soft">{STEP_TRAITS[data.kind].label}</p>
      <p className="font-semibold leading-tight">{data.title}</p>
      {data.caption && <p className="mt-1 text-xs text-ink">{data.caption}</p>}
      <Handle type="source" position={Position.Bottom} className="!bg-ink-soft" />
    </div>
  );
}

const nodeTypes = { step: StepNode };

export default function ProcedureGraph({ doc, graph, label, onSelect, focus }: {
  doc: ProcedureDocument;
  graph: { nodes: { id: string; data: GraphNodeData }[]; edges: GraphEdge[] };
  label: string;
  onSelect?: (stepId: string) => void;
  /** Steps to fit in view at first (the path of a diagnosis); without it the view fits the width, from the top. */
  focus?: string[];
}) {
  const pos = useMemo(() => positions(doc), [doc]);
  const box = useRef<HTMLDivElement>(null);
  // A tall procedure fitted whole becomes unreadable; fit its width instead and start at the top.
  const topView = useMemo(() => {
    const xs = [...pos.values()].map((p) => p.x);
    const minX = Math.min(...xs);
    const minY = Math.min(...[...pos.values()].map((p) => p.y));
    const width = Math.max(...xs) - minX + 240;
    return { minX, minY, width };
  }, [pos]);
  const nodes: Node<GraphNodeData>[] = graph.nodes.map((n) => ({ ...n, type: 'step', position: pos.get(n.id) ?? { x: 0, y: 0 }, draggable: false, connectable: false }));
  const p = palette();
  const ramp = heatRamp(p);
  const edges: Edge[] = graph.edges.map((e) => ({
    id: e.id, source: e.source, target: e.target, label: e.label || undefined,
    style: { stroke: ramp[e.level], strokeWidth: 1.5 + e.level * 1.2 },
    labelStyle: { fontSize: 12, fill: p.ink }, labelBgStyle: { fill: p.paper },
  }));
  return (
    <div ref={box} className="h-[46rem] rounded-[var(--radius-card)] border border-line bg-paper" role="figure" aria-label={label}>
      <ReactFlow nodes={nodes} edges={edges} nodeTypes={nodeTypes} minZoom={0.2}
        fitView={Boolean(focus?.length)} fitViewOptions={{ padding: 0.08, nodes: (focus ?? []).map((id) => ({ id })), maxZoom: 1 }}
        onInit={focus?.length ? undefined : (rf) => {
          const w = box.current?.clientWidth ?? 1000;
          const zoom = Math.min(1, (w - 32) / topView.width);
          void rf.setViewport({ x: (w - topView.width * zoom) / 2 - (topView.minX - 10) * zoom, y: 16 - topView.minY * zoom, zoom });
        }} nodesDraggable={false} nodesConnectable={false}
        elementsSelectable={Boolean(onSelect)} onNodeClick={onSelect ? (_e, n) => onSelect(n.id) : undefined}>
        <Background gap={24} color={p.line} />
        <Controls showInteractive={false} />
      </ReactFlow>
    </div>
  );
}
