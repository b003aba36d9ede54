// npm run verify:outage — PostgreSQL stopped for 10 s under steady reads and step writes (four
// technicians reading, four stepping, one phone with the real outbox), then started again.
// Prints the figures and exits non-zero when a claim does not hold.
import { brokenClaims, describeFigures, runOutage } from './outage-run';

const seconds = Number(process.env.OUTAGE_SECONDS ?? 10);
const figures = await runOutage({
  name: 'verify-outage', outageMs: seconds * 1000, readers: 4, writers: 4, warmMs: 3000, afterMs: 6000,
  say: (line) => console.log(`[outage] ${line}`),
});
console.log(describeFigures(figures));
const broken = brokenClaims(figures);
for (const b of broken) console.log(`NOT HELD: ${b}`);
console.log(broken.length ? `${broken.length} claim(s) did not hold` : 'every claim held');
process.exit(broken.length ? 1 : 0);
