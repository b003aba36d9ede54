#!/usr/bin/env bash
# npm run perf:phone: the built app against a throwaway PostgreSQL, walked in Debian's Chromium
# on a 360×780 touch viewport at CPU throttling 1× and 4× (never part of npm test).
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
ensure_chromium
export PG_ROOT=$PWD/.tmp/pg-perf-phone
DATABASE_URL=$(APP_DB=sparkwright_perf_phone bash scripts/pg.sh start --throwaway)
export DATABASE_URL NODE_ENV=test
trap 'bash scripts/pg.sh stop' EXIT
npx tsx scripts/migrate.ts
say "building the client (production)"
mkdir -p .tmp/build
NODE_ENV=production TMPDIR="$PWD/.tmp/build" npx vite build --logLevel warn ${PERF_PROFILE:+--minify false}
PERF_PORT=$(free_port 3950) npx tsx tests/perf/phone.bench.ts
