import type { ProcedureDocument, Position } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';
import { stepBox } from '@shared/engine/geometry';

/**
 * Layered top-down layout by ELK. elkjs is large, so it is imported only when an author asks for a
 * layout. Returns new positions by step id.
 */
export async function autoLayout(doc: ProcedureDocument): Promise<{ id: string; position: Position }[]> {
  const { default: ELK } = await import('elkjs/lib/elk.bundled.js');
  const elk = new ELK();
  const ids = new Set(doc.steps.map((s) => s.id));
  const graph = {
    id: 'root',
    layoutOptions: {
      'elk.algorithm': 'layered',
      'elk.direction': 'DOWN',
      'elk.layered.spacing.nodeNodeBetweenLayers': '90',
      'elk.spacing.nodeNode': '60',
      'elk.spacing.componentComponent': '90',
      'elk.layered.nodePlacement.strategy': 'BRANDES_KOEPF',
    },
    children: doc.steps.map((s) => ({ id: s.id, ...stepBox(s) })),
    edges: doc.steps.flatMap((s) => branchesOf(s).filter((b) => ids.has(b.to)).map((b) => ({ id: `${b.from}:${b.handle}`, sources: [b.from], targets: [b.to] }))),
  };
  const out = await elk.layout(graph);
  return (out.children ?? []).map((c) => ({ id: c.id, position: { x: Math.round(c.x ?? 0), y: Math.round(c.y ?? 0) } }));
}
