import { describe, expect, it } from 'vitest';
import { buildGraph, depthFirst, isBackEdge, lintProcedure, pathFigures } from '@shared/engine';
import { procedureDocumentSchema, type Step } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';
import { stepBox } from '@shared/engine/geometry';
import { DEMO_PROCEDURES } from '../../content';

const text = (d: (typeof DEMO_PROCEDURES)[number]['document']) => JSON.stringify(d.steps).toLowerCase();

describe('demo procedures in content/', () => {
  it('are the three demo procedures with stable slugs', () => {
    expect(DEMO_PROCEDURES.map((p) => p.slug)).toEqual(['no-spark', 'weak-spark', 'will-not-stop']);
  });

  it.each(DEMO_PROCEDURES)('$slug validates against the schema, has 15–40 steps and passes the soundness check with no errors', ({ document }) => {
    expect(procedureDocumentSchema.parse(JSON.parse(JSON.stringify(document)))).toEqual(document);
    expect(document.steps.length).toBeGreaterThanOrEqual(15);
    expect(document.steps.length).toBeLessThanOrEqual(40);
    const report = lintProcedure(document);
    expect(report.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it.each(DEMO_PROCEDURES)('$slug has finite path figures from its start', ({ document }) => {
    const f = pathFigures(document);
    expect(f.expected).not.toBeNull();
    expect(f.shortest!.steps).toBeLessThanOrEqual(f.longest!.steps);
  });

  it.each(DEMO_PROCEDURES)('$slug is laid out top-down: distinct positions, every forward branch goes down', ({ document }) => {
    const g = buildGraph(document);
    const dfs = depthFirst(g, g.start);
    const seen = new Set(document.steps.map((s) => `${s.position.x},${s.position.y}`));
    expect(seen.size).toBe(document.steps.length);
    for (let v = 0; v < g.size; v++) {
      for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
        const w = g.targets[e]!;
        if (!isBackEdge(dfs, v, w)) expect(g.steps[w]!.position.y).toBeGreaterThan(g.steps[v]!.position.y);
      }
    }
  });

  it.each(DEMO_PROCEDURES)('$slug says its limits are illustrative and the service data comes first', ({ document }) => {
    expect(document.meta.limitsNote).toMatch(/illustrative/i);
    expect(document.meta.limitsNote).toMatch(/service data/);
    expect(document.meta.appliesTo).toMatch(/Larkspur Lane Powersports/);
  });

  it('together they cover every part of a magneto-fed CDI system', () => {
    const all = DEMO_PROCEDURES.map((p) => text(p.document)).join(' ');
    for (const part of ['kill switch', 'key switch', 'chafed to chassis', 'spark plug', 'plug cap', 'ground', 'connector', 'coil primary',
      'secondary', 'exciter winding resistance', 'exciter cranking peak', 'pulser winding resistance', 'pulser cranking peak', 'pulser air gap',
      'flywheel key', 'substitute the cdi', 'clamp diode', 'no diode']) {
      expect(all, part).toContain(part);
    }
  });

  it('carry the usual safety notes: a few hundred volts, tens of kilovolts, fuel vapour, moving parts, IEC 61010 meters', () => {
    const all = DEMO_PROCEDURES.map((p) => text(p.document)).join(' ');
    for (const note of ['few hundred volts', 'tens of kilovolts', 'fuel vapour', 'flywheel and drive parts', 'iec 61010', 'never connect a meter to the ht lead']) {
      expect(all).toContain(note);
    }
  });

  it('substitute the CDI unit last: after it only a question and the endings remain', () => {
    for (const { document } of DEMO_PROCEDURES) {
      const swap = document.steps.find((s) => s.id === 'cdiSubstitute');
      if (!swap || swap.kind !== 'task') continue;
      const after = document.steps.find((s) => s.id === swap.next)!;
      expect(after.kind).toBe('observation');
      if (after.kind !== 'observation') continue;
      for (const a of after.answers) expect(['finding', 'handoff']).toContain(document.steps.find((s) => s.id === a.next)!.kind);
    }
  });

  it('use Formulas for the temperature-corrected winding and the stored energy ½CV²', () => {
    const expressions = DEMO_PROCEDURES.flatMap((p) => p.document.steps.flatMap((s) => (s.kind === 'formula' ? [s.expression] : [])));
    expect(expressions.some((e) => e.startsWith('copper('))).toBe(true);
    expect(expressions.some((e) => e.includes('** 2'))).toBe(true);
  });
});

describe('the demo procedures open laid out', () => {
  const box = (s: Step) => {
    const { width, height } = stepBox(s);
    return { x0: s.position.x, x1: s.position.x + width, y0: s.position.y, y1: s.position.y + height + 30 }; // + handle labels
  };

  for (const { slug, document: doc } of DEMO_PROCEDURES) {
    it(`no two steps of "${slug}" overlap on the canvas`, () => {
      const boxes = doc.steps.map((s) => ({ id: s.id, ...box(s) }));
      const overlaps = boxes.flatMap((a, i) => boxes.slice(i + 1)
        .filter((b) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1).map((b) => `${a.id} × ${b.id}`));
      expect(overlaps).toEqual([]);
    });

    it(`in "${slug}", the steps right below a branching step are in the order of its handles`, () => {
      const byId = new Map(doc.steps.map((s) => [s.id, s]));
      const incoming = new Map<string, number>();
      for (const s of doc.steps) for (const b of branchesOf(s)) incoming.set(b.to, (incoming.get(b.to) ?? 0) + 1);
      for (const s of doc.steps) {
        // a step that two handles lead to (low and high both to one finding), or that other steps
        // lead to as well, sits between its pulls; the rest must not cross
        const once = branchesOf(s).filter((b) => incoming.get(b.to) === 1);
        const below = once.map((b) => byId.get(b.to)).filter((t): t is Step => !!t && t.position.y > s.position.y);
        const nextRow = below.filter((t) => t.position.y === Math.min(...below.map((u) => u.position.y)));
        const xs = [...new Set(nextRow)].map((t) => t.position.x);
        expect(xs, `${s.id} → ${nextRow.map((t) => t.id).join(', ')}`).toEqual([...xs].sort((a, b) => a - b));
      }
    });
  }
});
