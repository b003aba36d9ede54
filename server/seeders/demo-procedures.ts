import type { Transaction } from 'sequelize';
import { DEMO_PROCEDURES } from '../../content';
import { lintProcedure } from '@shared/engine';
import type { ProcedureDocument } from '@shared/schema';
import { Procedure, ProcedureVersion } from '../models';
import { linkCatalogue, resolvedLinks } from '../services/procedure-links';

/**
 * Publishes each demo procedure of content/ as version 1 when the shop does not have it yet.
 * Re-runnable: an existing procedure (whatever its versions now) is left alone.
 */
export async function seedDemoProcedures(shopId: string, transaction: Transaction, authorId: string | null = null): Promise<void> {
  const created: ProcedureVersion[] = [];
  for (const demo of DEMO_PROCEDURES) {
    const existing = await Procedure.findOne({ where: { shopId, slug: demo.slug }, transaction });
    if (existing) continue;
    const report = lintProcedure(demo.document);
    if (!report.ok) throw new Error(`demo procedure ${demo.slug} does not pass the soundness check`);
    const procedure = await Procedure.create({
      shopId, slug: demo.slug, title: demo.document.meta.title, symptom: demo.document.meta.symptom,
      ignitionSystem: demo.document.meta.ignitionSystem, archivedAt: null, createdBy: authorId,
    }, { transaction });
    created.push(await ProcedureVersion.create({
      shopId, procedureId: procedure.id, number: 1, status: 'published',
      document: demo.document as unknown as Record<string, unknown>, lintReport: [...report.findings],
      basedOnId: null, createdBy: authorId, updatedBy: authorId, publishedBy: authorId, publishedAt: new Date(), retiredAt: null,
    }, { transaction }));
  }
  // Links are fixed once every demo procedure is published, as a lead's publish fixes them.
  const { published } = await linkCatalogue(shopId, '', { forPublish: true, transaction });
  for (const v of created) {
    const links = resolvedLinks(v.document as unknown as ProcedureDocument, published);
    if (Object.keys(links).length > 0) await v.update({ links }, { transaction });
  }
}
