// npm run seed:history -- --diagnoses N [--shop larkspur-lane] [--seed 1] [--days 365]
// Adds N invented diagnoses to the shop's history (demo data; never run it against a real shop).
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../db';
import { seedHistory } from './history';

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 && process.argv[i + 1] !== undefined ? process.argv[i + 1]! : fallback;
}

const url = process.env.DATABASE_URL;
const diagnoses = Number(arg('diagnoses', '1000'));
if (!url) {
  console.error('Set DATABASE_URL (npm run seed:history sets it for the local database).');
  process.exit(2);
}
if (!Number.isInteger(diagnoses) || diagnoses < 1 || diagnoses > 2_000_000) {
  console.error('--diagnoses takes a whole number from 1 to 2 000 000, e.g. --diagnoses 100000');
  process.exit(2);
}
const sequelize = createSequelize(url);
try {
  const slug = arg('shop', 'larkspur-lane');
  const [shop] = await sequelize.query<{ id: string }>('SELECT id FROM shops WHERE slug = $1', { bind: [slug], type: QueryTypes.SELECT });
  if (!shop) {
    console.error(`No shop "${slug}": start the app once (npm start) so the demo shop and its procedures exist.`);
    process.exitCode = 1;
  } else {
    const t0 = Date.now();
    const r = await seedHistory({ sequelize }, shop.id, { diagnoses, seed: Number(arg('seed', '1')), days: Number(arg('days', '365')), log: console.error });
    console.error(`[history] ${r.diagnoses} diagnoses, ${r.steps} steps, ${r.vehicles} vehicles, ${r.technicians} technicians in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  }
} catch (err) {
  console.error(`[history] failed: ${(err as Error).message}`);
  process.exitCode = 1;
} finally {
  await sequelize.close();
}
