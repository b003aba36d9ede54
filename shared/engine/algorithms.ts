import type { ProcedureGraph } from './graph';

/**
 * Graph algorithms over a compiled procedure. All iterative with explicit stacks so that a
 * 20 000-step procedure cannot overflow the call stack; all linear or near-linear.
 */

/** Steps reachable from `from` following branches forward (or backward with `reverse`). */
export function reach(g: ProcedureGraph, from: readonly number[], reverse = false): Uint8Array {
  const seen = new Uint8Array(g.size);
  const [starts, list] = reverse ? [g.inStart, g.sources] : [g.outStart, g.targets];
  const stack: number[] = [];
  for (const s of from) {
    if (s >= 0 && !seen[s]) {
      seen[s] = 1;
      stack.push(s);
    }
  }
  while (stack.length) {
    const v = stack.pop()!;
    for (let e = starts[v]!; e < starts[v + 1]!; e++) {
      const w = list[e]!;
      if (!seen[w]) {
        seen[w] = 1;
        stack.push(w);
      }
    }
  }
  return seen;
}

/** Steps from which some ending can be reached. */
export function canReachEnding(g: ProcedureGraph): Uint8Array {
  const ends: number[] = [];
  for (let v = 0; v < g.size; v++) if (g.ending[v]) ends.push(v);
  return reach(g, ends, true);
}

export interface Components {
  /** Component of each step; components are numbered in reverse topological order (sinks first). */
  readonly comp: Int32Array;
  readonly count: number;
  readonly sizes: Int32Array;
  /** 1 when the component is a loop: more than one step, or a step that branches to itself. */
  readonly cyclic: Uint8Array;
}

/** 1 for each component that is a loop: more than one step, or a step that branches to itself. */
function loopComponents(g: ProcedureGraph, comp: Int32Array, sizes: readonly number[]): Uint8Array {
  const cyclic = new Uint8Array(sizes.length);
  for (let v = 0; v < g.size; v++) {
    if (sizes[comp[v]!]! > 1) cyclic[comp[v]!] = 1;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) if (g.targets[e] === v) cyclic[comp[v]!] = 1;
  }
  return cyclic;
}

/** Tarjan's strongly connected components, iterative (Tarjan 1972; explicit call stack). */
export function stronglyConnected(g: ProcedureGraph): Components {
  // One piece on purpose: the indices, low-links and both stacks change together; split up, the textbook shape is lost.
  const n = g.size;
  const indexOf = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const comp = new Int32Array(n).fill(-1);
  const onStack = new Uint8Array(n);
  const edgePos = new Int32Array(n);
  const sccStack: number[] = [];
  const call: number[] = [];
  let counter = 0;
  let count = 0;
  const sizes: number[] = [];
  for (let root = 0; root < n; root++) {
    if (indexOf[root] !== -1) continue;
    call.push(root);
    indexOf[root] = low[root] = counter++;
    edgePos[root] = g.outStart[root]!;
    sccStack.push(root);
    onStack[root] = 1;
    while (call.length) {
      const v = call[call.length - 1]!;
      if (edgePos[v]! < g.outStart[v + 1]!) {
        const w = g.targets[edgePos[v]!++]!;
        if (indexOf[w] === -1) {
          indexOf[w] = low[w] = counter++;
          edgePos[w] = g.outStart[w]!;
          sccStack.push(w);
          onStack[w] = 1;
          call.push(w);
        } else if (onStack[w] && indexOf[w]! < low[v]!) low[v] = indexOf[w]!;
        continue;
      }
      call.pop();
      const parent = call[call.length - 1];
      if (parent !== undefined && low[v]! < low[parent]!) low[parent] = low[v]!;
      if (low[v] !== indexOf[v]) continue;
      let size = 0;
      let w: number;
      do {
        w = sccStack.pop()!;
        onStack[w] = 0;
        comp[w] = count;
        size++;
      } while (w !== v);
      sizes.push(size);
      count++;
    }
  }
  return { comp, count, sizes: Int32Array.from(sizes), cyclic: loopComponents(g, comp, sizes) };
}

/** Depth-first order from the start: reverse postorder (a topological order once back edges are dropped). */
export interface DepthFirst {
  /** Reachable steps in reverse postorder. */
  readonly order: Int32Array;
  /** Position of each step in `order`, −1 when unreachable. */
  readonly rank: Int32Array;
}

export function depthFirst(g: ProcedureGraph, start: number): DepthFirst {
  const n = g.size;
  const state = new Uint8Array(n); // 0 new, 1 open, 2 done
  const edgePos = new Int32Array(n);
  const post: number[] = [];
  if (start >= 0) {
    const stack = [start];
    state[start] = 1;
    edgePos[start] = g.outStart[start]!;
    while (stack.length) {
      const v = stack[stack.length - 1]!;
      if (edgePos[v]! < g.outStart[v + 1]!) {
        const w = g.targets[edgePos[v]!++]!;
        if (state[w] === 0) {
          state[w] = 1;
          edgePos[w] = g.outStart[w]!;
          stack.push(w);
        }
        continue;
      }
      state[v] = 2;
      post.push(v);
      stack.pop();
    }
  }
  const order = Int32Array.from(post.reverse());
  const rank = new Int32Array(n).fill(-1);
  order.forEach((v, i) => (rank[v] = i));
  return { order, rank };
}

/** True when the edge v→w goes back in depth-first order (it closes a loop). */
export function isBackEdge(dfs: DepthFirst, v: number, w: number): boolean {
  return dfs.rank[w]! <= dfs.rank[v]!;
}

export interface Dominators {
  /** Immediate dominator of each reachable step (the start is its own); −1 when unreachable. */
  readonly idom: Int32Array;
  /** `dominates(a, b)`: every path from the start to b passes through a. */
  dominates(a: number, b: number): boolean;
}

/**
 * Dominators by the iterative data-flow algorithm of Cooper, Harvey & Kennedy ("A Simple, Fast
 * Dominance Algorithm", 2001). "X is measured on every path that reaches F" is exactly
 * "X dominates F", so this is the definite-measurement analysis: it meets at joins by
 * intersection and iterates around loops to a fixed point.
 */
export function dominators(g: ProcedureGraph, dfs: DepthFirst): Dominators {
  const { order, rank } = dfs;
  const idom = new Int32Array(g.size).fill(-1);
  if (order.length === 0) return { idom, dominates: () => false };
  const start = order[0]!;
  idom[start] = start;
  const intersect = (a: number, b: number): number => {
    while (a !== b) {
      while (rank[a]! > rank[b]!) a = idom[a]!;
      while (rank[b]! > rank[a]!) b = idom[b]!;
    }
    return a;
  };
  for (let changed = true; changed; ) {
    changed = false;
    for (let i = 1; i < order.length; i++) {
      const b = order[i]!;
      let next = -1;
      for (let e = g.inStart[b]!; e < g.inStart[b + 1]!; e++) {
        const p = g.sources[e]!;
        if (idom[p] === -1) continue;
        next = next === -1 ? p : intersect(p, next);
      }
      if (next !== idom[b]) {
        idom[b] = next;
        changed = true;
      }
    }
  }
  return { idom, dominates: treeQuery(idom, order) };
}

/** Pre/post numbers on the dominator tree turn "a dominates b" into two comparisons. */
function treeQuery(idom: Int32Array, order: Int32Array): (a: number, b: number) => boolean {
  const n = idom.length;
  const childStart = new Int32Array(n + 1);
  const root = order[0]!;
  for (const v of order) if (v !== root) childStart[idom[v]! + 1]!++;
  for (let v = 0; v < n; v++) childStart[v + 1]! += childStart[v]!;
  const fill = childStart.slice(0, n);
  const children = new Int32Array(Math.max(0, order.length - 1));
  for (const v of order) if (v !== root) children[fill[idom[v]!]!++] = v;
  const pre = new Int32Array(n).fill(-1);
  const post = new Int32Array(n).fill(-1);
  const pos = childStart.slice(0, n);
  const stack = [root];
  let clock = 0;
  pre[root] = clock++;
  while (stack.length) {
    const v = stack[stack.length - 1]!;
    if (pos[v]! < childStart[v + 1]!) {
      const c = children[pos[v]!++]!;
      pre[c] = clock++;
      stack.push(c);
    } else {
      post[v] = clock++;
      stack.pop();
    }
  }
  return (a, b) => pre[a]! >= 0 && pre[b]! >= 0 && pre[a]! <= pre[b]! && post[b]! <= post[a]!;
}
