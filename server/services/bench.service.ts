import { QueryTypes, type Sequelize } from 'sequelize';
import { upgradeProcedure } from '@shared/schema/upgrade';
import type { ProcedureDocument, Step } from '@shared/schema/procedure';
import type { BenchProcedure, BenchVersion } from '@shared/schema/bench';
import { joinLinked, MAX_LINK_DEPTH } from '@shared/engine/link-join';
import type { ShopContext } from '../auth/context';
import { AppError, notFound } from '../lib/errors';
import { recordedHandle } from '@shared/engine/kinds';

export interface PinnedVersion {
  id: string;
  shopId: string;
  procedureId: string;
  slug: string;
  title: string;
  number: number;
  /** The version's document, joined with every version its "Continue in" steps continue in. */
  document: ProcedureDocument;
  steps: ReadonlyMap<string, Step>;
  /** Every other version a walk of this one may run (linked, and what those link to). */
  linkedVersionIds: readonly string[];
}

// Published and retired versions never change, so a parsed document can be kept for the life of
// the process; this keeps the step endpoint from reading a large JSONB document per request.
const pinned = new Map<string, PinnedVersion>();
const MAX_PINNED = 200;

function remember(v: PinnedVersion): PinnedVersion {
  if (pinned.size >= MAX_PINNED) pinned.delete(pinned.keys().next().value!);
  pinned.set(v.id, v);
  return v;
}

/**
 * A published (or retired) version of this shop, parsed, joined with the versions its links
 * continue in (as fixed at publish), and indexed by step id.
 */
export async function loadPinnedVersion(sequelize: Sequelize, shopId: string, versionId: string, depth = 0): Promise<PinnedVersion> {
  const hit = pinned.get(versionId);
  if (hit && hit.shopId === shopId) return hit;
  const rows = await sequelize.query<{ id: string; shop_id: string; procedure_id: string; slug: string; title: string; number: number; document: unknown; links: Record<string, string> }>(
    `SELECT v.id, v.shop_id, v.procedure_id, p.slug, p.title, v.number, v.document, v.links
       FROM procedure_versions v JOIN procedures p ON p.id = v.procedure_id
      WHERE v.id = :versionId AND v.shop_id = :shopId AND v.status IN ('published', 'retired')`,
    { replacements: { versionId, shopId }, type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) throw notFound('That procedure version');
  const up = upgradeProcedure(row.document);
  if (!up.ok) throw new AppError(500, 'bad_document', `The procedure version cannot be read: ${up.message}`);
  const targets = new Map<string, PinnedVersion>();
  // The soundness check refuses link cycles at publish; the depth bound keeps a bad row from recursing.
  if (depth < MAX_LINK_DEPTH) {
    for (const [slug, id] of Object.entries(row.links ?? {})) targets.set(slug, await loadPinnedVersion(sequelize, shopId, id, depth + 1));
  }
  const joined = joinLinked(up.document, row.slug, (slug) => {
    const t = targets.get(slug);
    return t && { slug: t.slug, title: t.title, versionId: t.id, number: t.number, document: t.document };
  });
  const linkedVersionIds = [...new Set(joined.linked.flatMap((l) => [l.versionId, ...(targets.get(l.slug)?.linkedVersionIds ?? [])]))];
  return remember({
    id: row.id, shopId: row.shop_id, procedureId: row.procedure_id, slug: row.slug, title: row.title, number: row.number,
    document: joined.document, steps: new Map(joined.document.steps.map((s) => [s.id, s])), linkedVersionIds,
  });
}

/** The latest published version of each procedure, filtered by symptom and ignition system. */
export async function listPublished(sequelize: Sequelize, ctx: ShopContext, q: { symptom?: string | undefined; ignitionSystem?: string | undefined }): Promise<BenchProcedure[]> {
  const rows = await sequelize.query<{ procedure_id: string; slug: string; title: string; symptom: string; ignition_system: string; version_id: string; number: number; published_at: Date | null }>(
    `SELECT DISTINCT ON (p.id) p.id AS procedure_id, p.slug, p.title, p.symptom, p.ignition_system,
            v.id AS version_id, v.number, v.published_at
       FROM procedures p JOIN procedure_versions v ON v.procedure_id = p.id AND v.status = 'published'
      WHERE p.shop_id = :shopId AND p.archived_at IS NULL
        AND (:symptom = '' OR p.symptom ILIKE '%' || :symptom || '%' OR p.title ILIKE '%' || :symptom || '%')
        AND (:ignition = '' OR p.ignition_system = :ignition)
      ORDER BY p.id, v.number DESC`,
    { replacements: { shopId: ctx.shopId, symptom: q.symptom ?? '', ignition: q.ignitionSystem ?? '' }, type: QueryTypes.SELECT },
  );
  return rows
    .map((r) => ({
      procedureId: r.procedure_id, slug: r.slug, title: r.title, symptom: r.symptom, ignitionSystem: r.ignition_system,
      versionId: r.version_id, number: r.number, publishedAt: r.published_at ? new Date(r.published_at).toISOString() : null,
    }))
    .sort((a, b) => a.title.localeCompare(b.title));
}

/** The version a phone caches to walk offline: the latest published one for a slug, or a pinned id. */
export async function getVersionForBench(sequelize: Sequelize, ctx: ShopContext, ref: { slug?: string; versionId?: string }): Promise<BenchVersion> {
  let versionId = ref.versionId;
  if (!versionId) {
    const all = await listPublished(sequelize, ctx, {});
    versionId = all.find((p) => p.slug === ref.slug)?.versionId;
    if (!versionId) throw notFound('A published procedure with that name');
  }
  const v = await loadPinnedVersion(sequelize, ctx.shopId, versionId);
  const branchCounts = await branchCountsOf(sequelize, ctx.shopId, v.id);
  return { id: v.id, procedureId: v.procedureId, slug: v.slug, title: v.title, number: v.number, document: v.document, branchCounts };
}

/**
 * How often each branch of a version was taken in this shop's ended diagnoses (step id → handle →
 * count), so the phone's "to go" estimate follows the shop's history; empty without history.
 */
async function branchCountsOf(sequelize: Sequelize, shopId: string, versionId: string): Promise<Record<string, Record<string, number>>> {
  const rows = await sequelize.query<{ step_id: string; band_id: string | null; answer_id: string | null; n: string }>(
    `SELECT ds.step_id, ds.band_id, ds.answer_id, count(*) AS n
       FROM diagnosis_steps ds JOIN diagnoses d ON d.id = ds.diagnosis_id AND d.shop_id = ds.shop_id
      WHERE d.shop_id = :shopId AND d.procedure_version_id = :versionId AND d.status IN ('finished', 'handed_off')
        AND NOT ds.superseded AND ds.kind IN ('reading', 'observation', 'formula')
      GROUP BY 1, 2, 3`,
    { replacements: { shopId, versionId }, type: QueryTypes.SELECT },
  );
  const counts: Record<string, Record<string, number>> = {};
  for (const r of rows) (counts[r.step_id] ??= {})[recordedHandle(r.band_id, r.answer_id)] = Number(r.n);
  return counts;
}
