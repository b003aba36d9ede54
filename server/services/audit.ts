import type { Transaction } from 'sequelize';
import { AuditLog } from '../models';

/** Appends to the audit log; callers pass their transaction so the entry lands with the change. */
export async function audit(
  entry: { shopId: string | null; userId: string | null; action: string; entity: string; entityId?: string | null; detail?: Record<string, unknown> },
  transaction?: Transaction,
): Promise<void> {
  await AuditLog.create({ ...entry, entityId: entry.entityId ?? null, detail: entry.detail ?? {} }, { transaction });
}
