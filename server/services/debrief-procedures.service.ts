import type { ShopContext } from '../auth/context';
import { demand } from '../auth/policy';
import { joinedDocument, parseDocument, type Sql } from './debrief-scope';
import type { DebriefProcedure } from '@shared/stats/debrief-answers';

export type { DebriefProcedure } from '@shared/stats/debrief-answers';

/** Procedures of the shop that have a numbered version, with diagnosis counts per version. */
export async function debriefProcedures(sql: Sql, ctx: ShopContext): Promise<DebriefProcedure[]> {
  demand(ctx, 'analytics.read');
  const rows = await sql(`SELECT p.id AS procedure_id, p.slug, p.title, v.id, v.number, v.status, v.published_at, v.document, v.links,
      (SELECT count(*) FROM diagnoses d WHERE d.shop_id = $1 AND d.procedure_version_id = v.id) AS diagnoses
    FROM procedures p JOIN procedure_versions v ON v.procedure_id = p.id AND v.status IN ('published', 'retired')
    WHERE p.shop_id = $1 AND p.archived_at IS NULL ORDER BY p.title, v.number DESC`, [ctx.shopId]);
  const out = new Map<string, DebriefProcedure>();
  for (const r of rows) {
    const id = String(r.procedure_id);
    let p = out.get(id);
    if (!p) {
      // The graph Debrief draws: the newest version, joined with what its links continue in.
      const linked = Object.keys((r.links ?? {}) as object).length > 0;
      const document = linked ? await joinedDocument(sql, ctx.shopId, String(r.id)) : parseDocument(r.document);
      p = { id, slug: String(r.slug), title: String(r.title), diagnoses: 0, versions: [], document };
      out.set(id, p);
    }
    p.diagnoses += Number(r.diagnoses);
    p.versions.push({ id: String(r.id), number: Number(r.number), status: String(r.status),
      publishedAt: r.published_at ? new Date(r.published_at as string).toISOString() : null, diagnoses: Number(r.diagnoses) });
  }
  return [...out.values()];
}

/** Technicians of the shop, for the table's technician filter. */
export async function debriefTechnicians(sql: Sql, ctx: ShopContext): Promise<{ id: string; name: string }[]> {
  demand(ctx, 'analytics.read');
  const rows = await sql(`SELECT u.id, u.name FROM memberships m JOIN users u ON u.id = m.user_id
    WHERE m.shop_id = $1 AND 'technician' = ANY(m.roles) ORDER BY u.name`, [ctx.shopId]);
  return rows.map((r) => ({ id: String(r.id), name: String(r.name) }));
}
