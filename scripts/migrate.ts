// Applies pending migrations to $DATABASE_URL (the test script and operators use it).
import { createSequelize, createMigrator } from '../server/db';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('Set DATABASE_URL to the database to migrate.');
  process.exit(2);
}
const sequelize = createSequelize(url);
const done = await createMigrator(sequelize).up();
console.error(`[migrate] ${done.length} migration(s) applied`);
await sequelize.close();
