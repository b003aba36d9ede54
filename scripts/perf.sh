#!/usr/bin/env bash
# npm run perf:*: a benchmark against a throwaway PostgreSQL on 127.0.0.1 (never part of npm test).
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
case " $* " in *' --cluster '*) ensure_haproxy ;; esac  # perf:steps -- --cluster
# browser benchmarks run the built client, as a shop would
if [ "${PERF_BUILD:-0}" = 1 ]; then
  ensure_chromium
  mkdir -p .tmp/build
  NODE_ENV=production TMPDIR="$PWD/.tmp/build" npx vite build --logLevel warn
fi
export PG_ROOT=$PWD/.tmp/pg-perf
DATABASE_URL=$(APP_DB=sparkwright_perf bash scripts/pg.sh start --throwaway)
export DATABASE_URL NODE_ENV=test
trap 'bash scripts/pg.sh stop' EXIT
npx tsx scripts/migrate.ts
npx tsx "$@"
