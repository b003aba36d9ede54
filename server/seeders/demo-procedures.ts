import type { Transaction } from 'sequelize';

/** Publishes the demo procedures of content/ as version 1 when the shop has none yet. */
export async function seedDemoProcedures(_shopId: string, _transaction: Transaction): Promise<void> {
  // filled in once content/ exports the demo procedures
}
