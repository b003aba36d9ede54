#!/usr/bin/env bash
# Runs a command with DATABASE_URL pointing at the persistent local database that npm start uses.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
ensure_node_modules
export PG_ROOT=${PG_ROOT:-$PWD/.data/pg}
was_up=0; [ -f "$PG_ROOT/data/postmaster.pid" ] && was_up=1
DATABASE_URL=$(bash scripts/pg.sh start)
export DATABASE_URL
[ $was_up = 1 ] || trap 'bash scripts/pg.sh stop' EXIT
npx tsx scripts/migrate.ts
npx "$@"
