import type { QueryInterface } from 'sequelize';

// Failed sign-ins and reset requests counted in PostgreSQL, shared by every app server; the
// columns are the ones rate-limiter-flexible's PostgreSQL store reads and writes.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE IF NOT EXISTS rate_limits (
      key varchar(255) PRIMARY KEY,
      points integer NOT NULL DEFAULT 0,
      expire bigint
    );
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE IF EXISTS rate_limits');
}
