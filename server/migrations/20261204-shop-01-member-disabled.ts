import type { QueryInterface } from 'sequelize';

// A shop admin may disable a member: the membership and its roles stay (for the record, and to
// enable it again), but the person can no longer open the shop, and their sessions in it end.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('ALTER TABLE memberships ADD COLUMN IF NOT EXISTS disabled_at timestamptz');
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('ALTER TABLE memberships DROP COLUMN IF EXISTS disabled_at');
}
