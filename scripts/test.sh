#!/usr/bin/env bash
# npm test: a throwaway PostgreSQL, then type check, lint, unit, API and end-to-end suites.
# Ends with one line "N passed, N failed" over all suites; exits non-zero on any failure.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules || exit 1
ensure_chromium || exit 1
mkdir -p .tmp/reports .tmp/build
rm -f .tmp/reports/*.json
export PG_ROOT=$PWD/.tmp/pg-test
bash scripts/pg.sh reset
API_DB=$(APP_DB=sparkwright_api bash scripts/pg.sh start --throwaway) || exit 1
E2E_DB=$(APP_DB=sparkwright_e2e bash scripts/pg.sh start --throwaway) || exit 1
PROD_DB=$(APP_DB=sparkwright_prod bash scripts/pg.sh start --throwaway) || exit 1
trap 'bash scripts/pg.sh stop' EXIT
export NODE_ENV=test
status=0
step() { say "$1"; shift; "$@" || status=1; }

step "type check" npm run --silent typecheck
step "lint" npx eslint . --max-warnings=0
DATABASE_URL=$API_DB npx tsx scripts/migrate.ts || status=1
step "unit and API tests" env DATABASE_URL="$API_DB" npx vitest run --reporter=default --reporter=json --outputFile=.tmp/reports/vitest.json
step "client build" env NODE_ENV=production TMPDIR="$PWD/.tmp/build" npx vite build --logLevel warn
step "bundle budgets and the production start" env REPORT=.tmp/reports/budgets.json PROD_DATABASE_URL="$PROD_DB" npx vitest run --config vitest.build.config.ts --reporter=default --reporter=json --outputFile=.tmp/reports/budgets.json
export E2E_DATABASE_URL=$E2E_DB E2E_PORT=$(free_port 3900)
step "end-to-end tests" env PLAYWRIGHT_JSON_OUTPUT_NAME=.tmp/reports/e2e.json npx playwright test --reporter=list,json
ensure_haproxy || exit 1
step "cluster (short)" npx vitest run --config vitest.cluster.config.ts --reporter=default --reporter=json --outputFile=.tmp/reports/cluster.json
node scripts/summarize.mjs .tmp/reports || status=1
exit $status
