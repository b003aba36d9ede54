import { useCallback, useEffect, useMemo, useRef, useState, type Dispatch, type DragEvent, type SetStateAction } from 'react';
import {
  ReactFlow, Background, Controls, MiniMap, applyNodeChanges, useReactFlow,
  type Connection, type EdgeChange, type NodeChange, type OnSelectionChangeParams, type ReactFlowProps,
} from '@xyflow/react';
import '@xyflow/react/dist/style.css';
import type { ProcedureDocument, StepKind } from '@shared/schema';
import type { Edit } from '../../lib/edits';
import { keepUnchanged, openingView, toFlow, type BranchEdge, type FlowMarks, type StepNode } from '../../lib/flow';
import { stepFor } from '../../lib/new-step';
import { nodeTypes } from './step-node';
import { KIND_TONE } from './step-glyphs';

export const PALETTE_MIME = 'application/x-sparkwright-kind';

interface Props {
  doc: ProcedureDocument;
  marks: FlowMarks;
  /** Steps to select from outside the canvas (a soundness finding, a review item); `seq` makes a repeat count. */
  selectRequest: { ids: string[]; seq: number };
  readOnly: boolean;
  onEdit: (edit: Edit) => void;
  onSelect: (ids: string[]) => void;
}

// Fixed for every canvas; kept out of the render so React Flow sees the same objects each time.
const CANVAS_OPTIONS: Partial<ReactFlowProps<StepNode>> = {
  edgesReconnectable: false,
  multiSelectionKeyCode: ['Shift', 'Meta', 'Control'],
  selectionKeyCode: 'Shift',
  fitView: true,
  minZoom: 0.1,
  maxZoom: 2,
  proOptions: { hideAttribution: true },
  defaultEdgeOptions: { type: 'smoothstep' },
  // steps off screen are neither rendered nor measured: toFlow gives each its size and handles
  onlyRenderVisibleElements: true,
};

const minimapColour = (n: StepNode) => KIND_TONE[n.data.step.kind].stroke;

/**
 * Selection and measurements belong to React Flow: a document change keeps them, and a step
 * being dragged keeps its position until the drop, so the two never fight over a node.
 */
function keepCanvasState(prev: StepNode[], next: StepNode[]): StepNode[] {
  const before = new Map(prev.map((n) => [n.id, n]));
  return next.map((n) => {
    const p = before.get(n.id);
    if (!p) return n;
    // the same step drawn the same: React Flow's own object, so the node is not drawn again
    if (p.data === n.data && (p.position === n.position || p.dragging)) return p;
    // a measured node keeps the handle places React Flow read from the page, not the estimated ones
    const { handles: _estimated, ...rest } = n;
    return { ...(p.measured ? rest : n), selected: p.selected ?? false, ...(p.measured ? { measured: p.measured } : {}), ...(p.dragging ? { position: p.position, dragging: true } : {}) };
  });
}

/** toFlow, with the objects of what did not change kept from the last call. */
function useFlow(doc: ProcedureDocument, marks: FlowMarks) {
  const last = useRef<ReturnType<typeof toFlow> | null>(null);
  return useMemo(() => (last.current = keepUnchanged(last.current, toFlow(doc, marks))), [doc, marks]);
}

// React Flow needs to move nodes while they are dragged; the document changes on drop.
function useCanvasNodes(flowNodes: StepNode[], selectRequest: Props['selectRequest']) {
  const [nodes, setNodes] = useState<StepNode[]>(flowNodes);
  useEffect(() => setNodes((prev) => keepCanvasState(prev, flowNodes)), [flowNodes]);
  useEffect(() => {
    if (selectRequest.seq === 0) return;
    const wanted = new Set(selectRequest.ids);
    setNodes((prev) => prev.map((n) => (n.selected === wanted.has(n.id) ? n : { ...n, selected: wanted.has(n.id) })));
  }, [selectRequest]);
  return [nodes, setNodes] as const;
}

/** The changes React Flow reports, as document edits. */
function useEditHandlers(edges: BranchEdge[], setNodes: Dispatch<SetStateAction<StepNode[]>>, onEdit: (edit: Edit) => void) {
  const onNodesChange = useCallback((changes: NodeChange<StepNode>[]) => {
    setNodes((ns) => applyNodeChanges(changes, ns));
    const removed = changes.flatMap((c) => (c.type === 'remove' ? [c.id] : []));
    if (removed.length > 0) onEdit({ type: 'remove-steps', ids: removed });
  }, [onEdit, setNodes]);

  const onEdgesChange = useCallback((changes: EdgeChange[]) => {
    for (const c of changes) {
      if (c.type !== 'remove') continue;
      const edge = edges.find((e) => e.id === c.id);
      if (edge?.sourceHandle) onEdit({ type: 'disconnect', from: edge.source, handle: edge.sourceHandle });
    }
  }, [edges, onEdit]);

  const onConnect = useCallback((c: Connection) => {
    if (c.sourceHandle) onEdit({ type: 'connect', from: c.source, handle: c.sourceHandle, to: c.target });
  }, [onEdit]);

  // the document learns where steps went when a drag ends (all dragged steps, for a multi-select)
  const onNodeDragStop = useCallback((_e: unknown, _n: StepNode, dragged: StepNode[]) => {
    onEdit({ type: 'move-steps', moves: dragged.map((n) => ({ id: n.id, position: { x: Math.round(n.position.x), y: Math.round(n.position.y) } })) });
  }, [onEdit]);

  return { onNodesChange, onEdgesChange, onConnect, onNodeDragStop };
}

/** React Flow bound to the document: every change the canvas reports becomes one Edit. */
export function Canvas({ doc, marks, selectRequest, readOnly, onEdit, onSelect }: Props) {
  const flow = useFlow(doc, marks);
  const [opening] = useState(() => openingView(doc)); // the first document only: edits never move the view
  const [nodes, setNodes] = useCanvasNodes(flow.nodes, selectRequest);
  const { screenToFlowPosition } = useReactFlow();
  const edits = useEditHandlers(flow.edges, setNodes, onEdit);

  const onSelectionChange = useCallback(({ nodes: sel }: OnSelectionChangeParams) => onSelect(sel.map((n) => n.id)), [onSelect]);

  const onDrop = useCallback((e: DragEvent) => {
    const kind = e.dataTransfer.getData(PALETTE_MIME) as StepKind;
    if (!kind || readOnly) return;
    e.preventDefault();
    const at = screenToFlowPosition({ x: e.clientX, y: e.clientY });
    onEdit({ type: 'add-steps', steps: [stepFor(doc, kind, { x: Math.round(at.x - 120), y: Math.round(at.y - 40) })] });
  }, [doc, onEdit, readOnly, screenToFlowPosition]);

  return (
    <div className="h-full w-full" onDragOver={(e) => { if (!readOnly) { e.preventDefault(); e.dataTransfer.dropEffect = 'copy'; } }} onDrop={onDrop} data-testid="canvas">
      <ReactFlow<StepNode>
        {...CANVAS_OPTIONS}
        {...edits}
        nodes={nodes}
        edges={flow.edges}
        nodeTypes={nodeTypes}
        onSelectionChange={onSelectionChange}
        nodesDraggable={!readOnly}
        nodesConnectable={!readOnly}
        deleteKeyCode={readOnly ? null : ['Delete', 'Backspace']}
        fitViewOptions={opening}
      >
        <Background gap={24} color="var(--color-line)" />
        <MiniMap pannable zoomable ariaLabel="Overview of the procedure" nodeColor={minimapColour} />
        <Controls showInteractive={false} />
      </ReactFlow>
    </div>
  );
}
