#!/usr/bin/env bash
# npm run verify:fuzz: the authorization matrix and the API fuzz test at 2 000 runs per route
# (npm test runs 200), against a throwaway PostgreSQL; prints the figures README.md quotes.
# FUZZ_RUNS=N to choose another count. Takes about 20 minutes on 2 cores.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
export PG_ROOT=$PWD/.tmp/pg-verify
DATABASE_URL=$(APP_DB=sparkwright_verify bash scripts/pg.sh start --throwaway)
export DATABASE_URL NODE_ENV=test
trap 'bash scripts/pg.sh stop' EXIT
npx tsx scripts/migrate.ts
export FUZZ_RUNS=${FUZZ_RUNS:-2000} PROOF_FIGURES=$PWD/.tmp/proof/verify-figures.json
rm -f "$PROOF_FIGURES"
status=0
npx vitest run --project api tests/server/authz-matrix.test.ts tests/server/api-fuzz.test.ts || status=1
node -e '
const f = JSON.parse(require("fs").readFileSync(process.env.PROOF_FIGURES, "utf8"));
const m = f.matrix ?? {}, z = f.fuzz ?? {};
console.log(`authorization matrix: ${m.cells} cells checked (${m.routes} routes × ${m.callers} callers, ${m.foreignCells} at a foreign shop id), ${m.wrong} wrong`);
console.log(`fuzz: ${z.runsPerRoute} runs per route × ${z.routes} routes = ${z.runs} requests; 5xx: ${z.serverErrors}; leaks: ${z.leaks}; half-stored: ${z.halfStored}`);
' || status=1
exit $status
