import { QueryTypes, type Transaction } from 'sequelize';
import type { LinkCatalogue, LinkTarget } from '@shared/engine/lint';
import { upgradeProcedure, type ProcedureDocument } from '@shared/schema';
import { Procedure } from '../models';

interface CatalogueRow { slug: string; title: string; published_id: string | null; published_doc: unknown; review_doc: unknown }

/**
 * The shop's procedures as "Continue in" steps see them: by slug, with the newest published
 * version (and its id, which a publish fixes in the version's `links`). `forPublish`: a target only
 * in review counts as unpublished, since the link must name a numbered version.
 */
export async function linkCatalogue(shopId: string, self: string, opts: { forPublish: boolean; transaction?: Transaction }): Promise<{ catalogue: LinkCatalogue; published: ReadonlyMap<string, string> }> {
  const rows = await Procedure.sequelize!.query<CatalogueRow>(`
    SELECT p.slug, p.title, pub.id AS published_id, pub.document AS published_doc, rev.document AS review_doc
      FROM procedures p
      LEFT JOIN LATERAL (SELECT id, document FROM procedure_versions WHERE procedure_id = p.id AND status = 'published' ORDER BY number DESC LIMIT 1) pub ON true
      LEFT JOIN LATERAL (SELECT document FROM procedure_versions WHERE procedure_id = p.id AND status = 'in_review' LIMIT 1) rev ON true
     WHERE p.shop_id = :shopId AND p.archived_at IS NULL`,
  { replacements: { shopId }, type: QueryTypes.SELECT, ...(opts.transaction ? { transaction: opts.transaction } : {}) });
  const procedures = new Map<string, LinkTarget>();
  const published = new Map<string, string>();
  for (const r of rows) {
    const raw = r.published_doc ?? (opts.forPublish ? null : r.review_doc);
    const up = raw ? upgradeProcedure(raw) : null;
    const document: ProcedureDocument | undefined = up?.ok ? up.document : undefined;
    const state = r.published_id ? 'published' : !opts.forPublish && r.review_doc ? 'in-review' : 'unpublished';
    procedures.set(r.slug, { title: r.title, state, ...(document ? { document } : {}) });
    if (r.published_id) published.set(r.slug, r.published_id);
  }
  return { catalogue: { self, procedures }, published };
}

/** Which version each link of `doc` continues in: slug → the newest published version's id. */
export function resolvedLinks(doc: ProcedureDocument, published: ReadonlyMap<string, string>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const s of doc.steps) {
    if (s.kind !== 'link') continue;
    const id = published.get(s.procedure);
    if (id) out[s.procedure] = id;
  }
  return out;
}
