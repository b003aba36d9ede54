import { ConnectionError, QueryTypes, type Sequelize } from 'sequelize';
import { READ_TAG } from '../lib/read-replica';
import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { AppError, notFound } from '../lib/errors';
import { upgradeProcedure, type ProcedureDocument } from '@shared/schema';
import { joinLinked, MAX_LINK_DEPTH, type LinkedVersion } from '@shared/engine/link-join';
import type { AnalyticsQuery } from '@shared/stats/debrief-schema';
import { demand } from '../auth/policy';


export type Sql = (sql: string, bind: unknown[]) => Promise<Record<string, unknown>[]>;

export function sqlOf(deps: Pick<AppDeps, 'sequelize'>): Sql {
  return (sql, bind) => deps.sequelize.query<Record<string, unknown>>(sql, { bind, type: QueryTypes.SELECT });
}

const taggedSql = (db: Sequelize): Sql => (sql, bind) =>
  db.query<Record<string, unknown>>(READ_TAG + sql, { bind, type: QueryTypes.SELECT });

/** A lost connection, a server shutting down (57…) or unreachable (08…): the replica is unwell. */
function replicaUnwell(err: unknown): boolean {
  const code = (err as { original?: { code?: unknown } }).original?.code;
  return err instanceof ConnectionError || (typeof code === 'string' && (code.startsWith('57') || code.startsWith('08')));
}

/**
 * Reads for Debrief's analytics and long lists: the replica when it is in use and this browser
 * wrote nothing in the last few seconds, else the primary. A read the replica fails (it went
 * down, or cancelled the query for a conflict with recovery) is run again on the primary.
 */
export function readSqlOf(deps: Pick<AppDeps, 'sequelize' | 'reads'>, cookies: string | undefined): Sql {
  const primary = taggedSql(deps.sequelize);
  const reads = deps.reads;
  if (!reads?.usable(cookies)) return primary;
  const replica = taggedSql(reads.sequelize);
  return async (sql, bind) => {
    try {
      return await replica(sql, bind);
    } catch (err) {
      if (replicaUnwell(err)) reads.failed(err);
      return primary(sql, bind);
    }
  };
}

export function parseDocument(raw: unknown): ProcedureDocument {
  const up = upgradeProcedure(raw);
  if (!up.ok) throw new AppError(500, 'stored_document_invalid', 'A procedure version is stored in a shape the app cannot read. Tell the engineers.');
  return up.document;
}

/**
 * A version's document joined with the versions its "Continue in" steps continue in, as the Bench
 * walks it, so that Debrief names and draws the steps a diagnosis took in the other procedure.
 */
export async function joinedDocument(sql: Sql, shopId: string, versionId: string, depth = 0): Promise<ProcedureDocument> {
  const [row] = await sql(`SELECT v.document, v.links, p.slug FROM procedure_versions v JOIN procedures p ON p.id = v.procedure_id
    WHERE v.id = $1 AND v.shop_id = $2`, [versionId, shopId]);
  if (!row) throw notFound('That version');
  const doc = parseDocument(row.document);
  const links = (row.links ?? {}) as Record<string, string>;
  if (depth >= MAX_LINK_DEPTH || Object.keys(links).length === 0) return doc;
  const targets = new Map<string, LinkedVersion>();
  for (const [slug, id] of Object.entries(links)) {
    const document = await joinedDocument(sql, shopId, id, depth + 1);
    targets.set(slug, { slug, title: document.meta.title, versionId: id, number: 0, document });
  }
  return joinLinked(doc, String(row.slug), (slug) => targets.get(slug)).document;
}

/** Whole days: `from` at 00:00 UTC, `to` inclusive up to the next midnight. */
export function dayBounds(q: { from?: string | undefined; to?: string | undefined }): [string, string] {
  const to = q.to ? new Date(Date.parse(`${q.to}T00:00:00Z`) + 86_400_000).toISOString() : 'infinity';
  return [q.from ? `${q.from}T00:00:00Z` : '-infinity', to];
}

export async function comebackDays(sql: Sql, shopId: string): Promise<number> {
  const [row] = await sql(`SELECT settings->>'comebackDays' AS days FROM shops WHERE id = $1`, [shopId]);
  const n = Number(row?.days);
  return Number.isInteger(n) && n > 0 ? n : 30;
}

export interface Scope {
  shopId: string;
  procedureId: string;
  title: string;
  versionIds: string[];
  /** The document the screens draw: the chosen version, or the latest published one. */
  versionId: string;
  doc: ProcedureDocument;
  from: string;
  to: string;
}

/** The procedure (and version) of the caller's shop that analytics run over; foreign ids are 404. */
export async function analyticsScope(sql: Sql, ctx: ShopContext, q: AnalyticsQuery): Promise<Scope> {
  demand(ctx, 'analytics.read');
  const rows = await sql(
    `SELECT p.title, v.id, v.number, v.document, v.links FROM procedures p
     JOIN procedure_versions v ON v.procedure_id = p.id AND v.status IN ('published', 'retired')
     WHERE p.id = $1 AND p.shop_id = $2 ORDER BY v.number DESC`,
    [q.procedureId, ctx.shopId],
  );
  if (!rows.length) throw notFound('That procedure (with a published version)');
  const chosen = q.versionId ? rows.find((r) => r.id === q.versionId) : rows[0];
  if (!chosen) throw notFound('That version');
  const [from, to] = dayBounds(q);
  return {
    shopId: ctx.shopId, procedureId: q.procedureId, title: String(chosen.title),
    versionIds: q.versionId ? [q.versionId] : rows.map((r) => String(r.id)),
    versionId: String(chosen.id), from, to,
    // Only a version with links costs the extra reads of the versions it continues in.
    doc: Object.keys((chosen.links ?? {}) as object).length ? await joinedDocument(sql, ctx.shopId, String(chosen.id)) : parseDocument(chosen.document),
  };
}

/** The scoped diagnoses as a CTE; binds $1 shop, $2 versions, $3 from, $4 to. */
export const SCOPED = `d AS (
  SELECT id, status, ending_step_id, started_at, ended_at, technician_id, vehicle_id FROM diagnoses
  WHERE shop_id = $1 AND procedure_version_id = ANY($2::uuid[]) AND started_at >= $3::timestamptz AND started_at < $4::timestamptz)`;

/** The same scope on step rows, through the columns the debrief-02 migration copies onto them. */
export const STEP_SCOPE = `ds.shop_id = $1 AND ds.dx_version_id = ANY($2::uuid[])
  AND ds.dx_started_at >= $3::timestamptz AND ds.dx_started_at < $4::timestamptz`;

export const scopeBinds = (s: Scope): unknown[] => [s.shopId, s.versionIds, s.from, s.to];

export const num = (v: unknown): number => Number(v ?? 0);
export const numOrNull = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));
