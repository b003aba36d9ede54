import type { LinkStep, ProcedureDocument, Step, StepId } from '../schema/procedure';
import { outletsOf, setBranch } from './kinds';

/** A procedure version a link continues in, as pinned for the walk. */
export interface LinkedVersion {
  readonly slug: string;
  readonly title: string;
  readonly versionId: string;
  readonly number: number;
  readonly document: ProcedureDocument;
}

/** How deep links may nest in one walk; the soundness check refuses link cycles long before. */
export const MAX_LINK_DEPTH = 4;

// Step ids named in a formula (outside its quoted unit literals) get the prefix of their copy.
function prefixExpression(expression: string, prefix: string, ids: ReadonlySet<string>): string {
  return expression.split(/("[^"]*")/).map((part) => (part.startsWith('"')
    ? part
    : part.replace(/[A-Za-z_][A-Za-z0-9_]*/g, (w) => (ids.has(w) ? prefix + w : w)))).join('');
}

function prefixed(step: Step, prefix: string, ids: ReadonlySet<string>): Step {
  if (prefix === '') return step;
  let out: Step = { ...step, id: prefix + step.id };
  for (const o of outletsOf(step)) if (o.to !== undefined) out = setBranch(out, o.handle, prefix + o.to);
  if (out.kind === 'formula') out = { ...out, expression: prefixExpression(out.expression, prefix, ids) };
  if (out.kind === 'reading' && out.winding) out = { ...out, winding: { ...out.winding, temperatureStep: prefix + out.winding.temperatureStep } };
  return out;
}

interface Joiner {
  readonly resolve: (slug: string) => LinkedVersion | undefined;
  readonly steps: Step[];
  readonly used: LinkedVersion[];
  copies: number;
}

interface Back { readonly to: StepId; readonly slug: string; readonly title: string }

function inline(j: Joiner, doc: ProcedureDocument, prefix: string, back: Back | null, depth: number, slug: string): void {
  const title = doc.meta.title;
  const ids = new Set(doc.steps.map((s) => s.id));
  for (const step of doc.steps) {
    if (step.kind === 'finding' && step.returns && back !== null) {
      // A returning Finding in a procedure asked to come back: it passes back to the caller's step.
      const { cause: _c, repair: _r, parts: _p, returns: _t, ...common } = step;
      j.steps.push({ ...common, id: prefix + step.id, kind: 'link', procedure: back.slug, next: back.to, procedureTitle: back.title });
      continue;
    }
    if (step.kind === 'link') {
      j.steps.push(joinLink(j, step, { prefix, ids, depth, slug, title }));
      continue;
    }
    j.steps.push(prefixed(step, prefix, ids));
  }
}

function joinLink(j: Joiner, step: LinkStep, at: { prefix: string; ids: ReadonlySet<string>; depth: number; slug: string; title: string }): Step {
  const { prefix, ids, depth } = at;
  const own = prefixed(step, prefix, ids) as LinkStep;
  const target = depth < MAX_LINK_DEPTH ? j.resolve(step.procedure) : undefined;
  if (!target) return own; // the walk stops here with a message; the soundness check names it first
  if (!j.used.some((u) => u.versionId === target.versionId)) j.used.push(target);
  const copy = `k${++j.copies}_`;
  const entry = step.entry ?? target.document.start;
  inline(j, target.document, copy, own.back === undefined ? null : { to: own.back, slug: at.slug, title: at.title }, depth + 1, target.slug);
  const { back: _drop, ...rest } = own;
  return { ...rest, next: copy + entry, procedureTitle: target.title };
}

/**
 * One document for a walk that crosses procedures: every "Continue in" step is joined with a copy
 * of the procedure version it names (its steps' ids prefixed `k<n>_`), passing on to its entry
 * step; in that copy, a Finding marked `returns` passes back to the link's `back` step. The
 * walker, the phone and the server then walk one graph. `linked` lists the versions joined in.
 * Example: `joinLinked(noSpark, 'no-spark', resolve).document.steps` holds No spark's steps, then `k1_plugGap`...
 */
export function joinLinked(doc: ProcedureDocument, slug: string, resolve: (slug: string) => LinkedVersion | undefined): { document: ProcedureDocument; linked: LinkedVersion[] } {
  if (!doc.steps.some((s) => s.kind === 'link')) return { document: doc, linked: [] };
  const j: Joiner = { resolve, steps: [], used: [], copies: 0 };
  inline(j, doc, '', null, 0, slug);
  return { document: { ...doc, steps: j.steps }, linked: j.used };
}
