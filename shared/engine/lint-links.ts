import type { LinkStep, ProcedureDocument } from '../schema/procedure';
import { finding, named, type LintFinding } from './lint-types';

/** A procedure of the shop as the soundness check sees a link to it. */
export interface LinkTarget {
  readonly title: string;
  /** `in-review`: not published yet, but in review beside the procedure being checked. */
  readonly state: 'published' | 'in-review' | 'unpublished';
  /** The version a link would continue in (newest published, else the one in review). */
  readonly document?: ProcedureDocument;
}

/** The shop's procedures by slug, and the slug of the one being checked (to find link cycles). */
export interface LinkCatalogue {
  readonly self: string;
  readonly procedures: ReadonlyMap<string, LinkTarget>;
}

const linksOf = (doc: ProcedureDocument | undefined): LinkStep[] => (doc?.steps ?? []).filter((s): s is LinkStep => s.kind === 'link');

/** The chain of slugs from `from` back to `self` through link steps, or null when there is none. */
function cycleFrom(catalogue: LinkCatalogue, from: string): string[] | null {
  const seen = new Set<string>();
  const stack: { slug: string; chain: string[] }[] = [{ slug: from, chain: [from] }];
  while (stack.length) {
    const { slug, chain } = stack.pop()!;
    if (slug === catalogue.self) return chain;
    if (seen.has(slug)) continue;
    seen.add(slug);
    for (const l of linksOf(catalogue.procedures.get(slug)?.document)) stack.push({ slug: l.procedure, chain: [...chain, l.procedure] });
  }
  return null;
}

function lintLink(step: LinkStep, catalogue: LinkCatalogue): LintFinding[] {
  const target = catalogue.procedures.get(step.procedure);
  if (!target) {
    return [finding('link-target-missing', 'error', [step.id], `${named(step)} continues in "${step.procedure}", which is not a procedure of this shop; choose one from the list.`)];
  }
  const out: LintFinding[] = [];
  const chain = step.procedure === catalogue.self ? [catalogue.self] : cycleFrom(catalogue, step.procedure);
  if (chain) {
    const names = [catalogue.self, ...chain].map((slug) => catalogue.procedures.get(slug)?.title ?? slug).join(' → ');
    out.push(finding('link-cycle', 'error', [step.id], `${named(step)} starts a loop of procedures (${names}); a diagnosis could go round it for ever. End one of them with a Finding or Hand-off instead of continuing.`));
  }
  if (target.state === 'unpublished') {
    out.push(finding('link-target-unpublished', 'error', [step.id], `${named(step)} continues in "${target.title}", which has no published version; publish it first (or send both for review together).`));
  } else if (step.entry !== undefined && !target.document?.steps.some((s) => s.id === step.entry)) {
    out.push(finding('link-entry-missing', 'error', [step.id], `${named(step)} begins "${target.title}" at step "${step.entry}", which that procedure does not have; pick one of its steps or leave it empty for its start.`));
  }
  return out;
}

/** Links checked against the shop's procedures: the target exists, is published, has the entry step, and no loop. */
export function lintLinks(doc: ProcedureDocument, catalogue: LinkCatalogue): LintFinding[] {
  return linksOf(doc).flatMap((step) => lintLink(step, catalogue));
}
