import type { QueryInterface } from 'sequelize';

// The shop's locale for dates and numbers (a BCP 47 tag such as "de-DE", checked by the server
// with Intl.getCanonicalLocales). NULL means each device follows its own browser's locale.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('ALTER TABLE shops ADD COLUMN IF NOT EXISTS locale text');
  await qi.sequelize.query(`ALTER TABLE shops ADD CONSTRAINT shops_locale_length CHECK (locale IS NULL OR length(locale) BETWEEN 2 AND 64)`);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('ALTER TABLE shops DROP COLUMN IF EXISTS locale');
}
