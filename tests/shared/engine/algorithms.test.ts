import { describe, expect, it } from 'vitest';
import { Graph, alg } from '@dagrejs/graphlib';
import { buildGraph, canReachEnding, depthFirst, dominators, reach, stronglyConnected, type ProcedureGraph } from '@shared/engine';
import { randomGraph } from '../generate';

// @dagrejs/graphlib serves as the oracle only (in tests), per REFERENCES.md.
function toGraphlib(g: ProcedureGraph, without?: number): Graph {
  const G = new Graph({ directed: true, multigraph: false });
  g.steps.forEach((_, v) => v !== without && G.setNode(String(v)));
  for (let v = 0; v < g.size; v++) {
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      if (v !== without && w !== without) G.setEdge(String(v), String(w));
    }
  }
  return G;
}

const cases = Array.from({ length: 60 }, (_, i) => ({ seed: i + 1, n: 5 + (i % 40), edges: Math.floor((5 + (i % 40)) * (1 + (i % 3) * 0.6)) }));

describe('graph algorithms agree with @dagrejs/graphlib on random graphs', () => {
  it.each(cases)('reachability from the start matches graphlib preorder (seed $seed, $n steps)', ({ seed, n, edges }) => {
    const g = buildGraph(randomGraph(n, edges, seed));
    const mine = reach(g, [g.start]);
    const theirs = new Set(alg.preorder(toGraphlib(g), ['0']));
    for (let v = 0; v < g.size; v++) expect(mine[v] === 1).toBe(theirs.has(String(v)));
  });

  it.each(cases)('strongly connected components match graphlib tarjan (seed $seed)', ({ seed, n, edges }) => {
    const g = buildGraph(randomGraph(n, edges, seed));
    const { comp } = stronglyConnected(g);
    const theirs = alg.tarjan(toGraphlib(g));
    for (const component of theirs) {
      const ids = new Set(component.map((v) => comp[Number(v)]));
      expect(ids.size).toBe(1);
    }
    expect(new Set(comp).size).toBe(theirs.length);
  });

  it.each(cases.slice(0, 20))('components come in reverse topological order (seed $seed)', ({ seed, n, edges }) => {
    const g = buildGraph(randomGraph(n, edges, seed));
    const { comp } = stronglyConnected(g);
    for (let v = 0; v < g.size; v++) {
      for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) expect(comp[g.targets[e]!]!).toBeLessThanOrEqual(comp[v]!);
    }
  });

  it.each(cases.slice(0, 30))('"can reach an ending" matches graphlib Dijkstra distances (seed $seed)', ({ seed, n, edges }) => {
    const g = buildGraph(randomGraph(n, edges, seed));
    const mine = canReachEnding(g);
    const G = toGraphlib(g);
    for (let v = 0; v < g.size; v++) {
      const d = alg.dijkstra(G, String(v));
      const theirs = g.steps.some((_, w) => g.ending[w] === 1 && Number.isFinite(d[String(w)]?.distance ?? Infinity));
      expect(mine[v] === 1).toBe(theirs);
    }
  });

  it.each(cases.slice(0, 30))('dominators match removal: a dominates b iff b is unreachable without a (seed $seed)', ({ seed, n, edges }) => {
    const g = buildGraph(randomGraph(n, edges, seed));
    const dfs = depthFirst(g, g.start);
    const dom = dominators(g, dfs);
    const reachable = new Set(alg.preorder(toGraphlib(g), ['0']));
    for (let a = 1; a < g.size; a++) {
      if (!reachable.has(String(a))) continue;
      const without = new Set(alg.preorder(toGraphlib(g, a), ['0']));
      for (let b = 0; b < g.size; b++) {
        if (!reachable.has(String(b)) || b === a) continue;
        expect(dom.dominates(a, b)).toBe(!without.has(String(b)));
      }
    }
  });
});

describe('iterative algorithms on a very long chain', () => {
  it('handle 20 000 steps in a single line without overflowing the stack', () => {
    const steps = Array.from({ length: 20_000 }, (_, i) => i);
    const doc = randomGraph(1, 0, 1);
    const chain = {
      ...doc,
      start: 's0',
      steps: steps.map((i) => (i === steps.length - 1
        ? { ...doc.steps[0]!, id: `s${i}`, kind: 'finding' as const, cause: 'c', repair: 'r', parts: [] }
        : { id: `s${i}`, kind: 'task' as const, title: 'T', instructions: '', safety: [], hazards: [], position: { x: 0, y: 0 }, confirmLabel: 'Done', next: `s${i + 1}` })),
    };
    const g = buildGraph(chain as typeof doc);
    expect(stronglyConnected(g).count).toBe(20_000);
    const dfs = depthFirst(g, g.start);
    expect(dfs.order.length).toBe(20_000);
    expect(dominators(g, dfs).dominates(0, 19_999)).toBe(true);
  });
});
